/**
 * HTML escaping for element content and double- or single-quoted attributes.
 * No imports, so the browser script of the site can use it too.
 */
export function escapeHtml(text: string): string {
  return text.replaceAll('&', '&amp;').replaceAll('<', '&lt;').replaceAll('>', '&gt;').replaceAll('"', '&quot;').replaceAll("'", '&#39;');
}
