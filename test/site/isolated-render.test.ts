// A model page is rendered on its own first (src/site/isolated-render.ts), so
// that a page whose record a component cannot present becomes an error page
// instead of stopping the whole build.
import { describe, expect, it } from 'vitest';
import { renderIsolated } from '../../src/site/isolated-render.ts';

// Loaded through Vite's Astro plugin; the type checker has no declarations for .astro files imported from .ts.
const { default: Throws } = await import('../fixtures/components/Throws.astro' as string);
const { default: Greets } = await import('../fixtures/components/Greets.astro' as string);

describe('renderIsolated', () => {
  it('returns the HTML of a component that renders', async () => {
    const result = await renderIsolated(Greets, { name: 'Lantern Lab' });
    // In development Astro marks elements with their source file; the content is what matters.
    expect('html' in result && result.html).toMatch(/^<p class="greeting"[^>]*>Hello, Lantern Lab<\/p>$/);
  });

  it('returns the problem of a component that throws, instead of throwing', async () => {
    const result = await renderIsolated(Throws, { value: {} });
    expect(result).toEqual({ problem: expect.stringMatching(/^TypeError: Cannot read properties of undefined/) });
  });
});
