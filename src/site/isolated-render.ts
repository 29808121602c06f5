/**
 * Renders one component on its own (Astro's container API) and reports a
 * failure instead of throwing it, so that a page whose data a component cannot
 * present gets an error page while the rest of the site still builds. The
 * container is made once per build.
 */
import { experimental_AstroContainer as AstroContainer } from 'astro/container';

type Component = Parameters<AstroContainer['renderToString']>[0];

let container: Promise<AstroContainer> | undefined;

export async function renderIsolated(component: Component, props: Record<string, unknown>): Promise<{ html: string } | { problem: string }> {
  try {
    container ??= AstroContainer.create();
    return { html: await (await container).renderToString(component, { props }) };
  } catch (error) {
    return { problem: error instanceof Error ? `${error.name}: ${error.message}` : String(error) };
  }
}
