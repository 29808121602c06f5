/**
 * Renders the untrusted Markdown of a model description to safe HTML.
 *
 * Pipeline: Markdown → mdast (remark, with remark-gfm for tables and
 * remark-math for $…$ and $$…$$)
 * → hast (remark-rehype, raw HTML in the source is dropped, never passed through)
 * → sanitised with rehype-sanitize (GitHub-style allow list, plus the two math
 * classes) → math typeset by KaTeX on the server (rehype-katex-raw.ts) → HTML.
 * Sanitising happens before KaTeX, so only KaTeX's own output is trusted.
 */
import { remark } from 'remark';
import remarkGfm from 'remark-gfm';
import remarkMath from 'remark-math';
import remarkRehype from 'remark-rehype';
import rehypeSanitize, { defaultSchema, type Options as SanitizeSchema } from 'rehype-sanitize';
import rehypeStringify from 'rehype-stringify';
import { escapeHtml } from './render/escape.ts';
import { rehypeWrapTables } from './rehype-wrap-tables.ts';
import { rehypeKatexRaw } from './rehype-katex-raw.ts';

export const sanitizeSchema: SanitizeSchema = {
  ...defaultSchema,
  attributes: {
    ...defaultSchema.attributes,
    code: [['className', /^language-./, 'math-inline', 'math-display']],
  },
};

/** KaTeX for untrusted text: no trusted commands, bounded macro expansion and sizes, errors shown inline. */
export const KATEX_MARKDOWN_OPTIONS = { strict: 'ignore' as const, trust: false, maxExpand: 1000, maxSize: 20, throwOnError: false };

const processor = remark()
  .use(remarkGfm)
  .use(remarkMath)
  .use(remarkRehype)
  .use(rehypeSanitize, sanitizeSchema)
  .use(rehypeKatexRaw, KATEX_MARKDOWN_OPTIONS)
  .use(rehypeWrapTables)
  .use(rehypeStringify, { allowDangerousHtml: true });

/** Markdown (untrusted) → sanitised HTML with server-rendered math. Never throws for bad input. */
export function renderMarkdown(markdown: string): string {
  try {
    return String(processor.processSync(markdown));
  } catch (error) {
    const message = error instanceof Error ? error.message : String(error);
    return `<p class="render-error">This description could not be rendered: ${escapeHtml(message)}</p>`;
  }
}

export { escapeHtml };
