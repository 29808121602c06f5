/**
 * HTML escaping and the small text formats shared by pages and the browser
 * script (it imports only the import-free escaper, so it runs in both).
 */

import { escapeHtml } from '../../catalogue/description/escape-html.ts';

export { escapeHtml };

/**
 * Escapes a symbol written with "_" before its subscript and sets the
 * subscript: "W_π" → W<sub>π</sub>, "ν_0 = 1" → ν<sub>0</sub> = 1. A subscript
 * runs to the next space or punctuation; "_{…}" groups longer ones.
 */
export function symbolHtml(text: string): string {
  return escapeHtml(text).replace(/([\p{L}\p{N}′″)])_(?:\{([^}]*)\}|([\p{L}\p{N}π/−.]+?(?=[\s,;:)]|$)))/gu, (_, base: string, group?: string, run?: string) => `${base}<sub>${group ?? run}</sub>`);
}
