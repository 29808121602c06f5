/**
 * HTML escaping and the small text formats shared by pages and the browser
 * script (this module has no imports, so it runs in both).
 */

/** Escapes text for HTML element content and double- or single-quoted attributes. */
export function escapeHtml(text: string): string {
  return text.replaceAll('&', '&amp;').replaceAll('<', '&lt;').replaceAll('>', '&gt;').replaceAll('"', '&quot;').replaceAll("'", '&#39;');
}

/**
 * Escapes a symbol written with "_" before its subscript and sets the
 * subscript: "W_π" → W<sub>π</sub>, "ν_0 = 1" → ν<sub>0</sub> = 1. A subscript
 * runs to the next space or punctuation; "_{…}" groups longer ones.
 */
export function symbolHtml(text: string): string {
  return escapeHtml(text).replace(/([\p{L}\p{N}′″)])_(?:\{([^}]*)\}|([\p{L}\p{N}π/−.]+?(?=[\s,;:)]|$)))/gu, (_, base: string, group?: string, run?: string) => `${base}<sub>${group ?? run}</sub>`);
}
