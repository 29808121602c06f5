/**
 * Markdown for pages: the renderer lives in the catalogue (description/render.ts)
 * so that `strobe check` refuses exactly what a page could not show; pages
 * import it from here.
 */
export { DESCRIPTION_LIMITS, DOCUMENT_LIMITS, escapeHtml, katexOptions, renderDescription, renderMarkdown, sanitizeSchema } from '../catalogue/description/render.ts';
