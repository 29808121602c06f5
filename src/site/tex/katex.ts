/**
 * TeX typeset on the server with KaTeX, with the same safety settings as the
 * descriptions: no trusted commands (\href, \includegraphics, \htmlData… are
 * refused), a bound on macro expansion and on sizes, errors shown as text
 * instead of thrown. Used for formulas the site builds itself (Hamiltonians,
 * symmetry operators).
 */
import katex from 'katex';

const KATEX_OPTIONS = {
  trust: false,
  strict: 'ignore' as const,
  throwOnError: false,
  maxExpand: 1000,
  maxSize: 20,
  output: 'htmlAndMathml' as const,
};

export function texToHtml(tex: string, displayMode = false): string {
  return katex.renderToString(tex, { ...KATEX_OPTIONS, displayMode });
}
