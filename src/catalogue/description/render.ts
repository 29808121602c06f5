/**
 * Renders the untrusted Markdown of a model description to safe HTML, within
 * limits. `strobe check` runs it to report a bad description as a located
 * error; the site runs the same function to publish it, so what passes the
 * check is what the page shows.
 *
 * Pipeline: Markdown → mdast (remark, with remark-gfm for tables and
 * remark-math for $…$ and $$…$$)
 * → hast (remark-rehype; raw HTML in the source is dropped, never passed through)
 * → sanitised with rehype-sanitize (GitHub-style allow list, plus the two math
 * classes) → math typeset by KaTeX on the server (rehype-katex-raw.ts) → tables
 * wrapped so they scroll on a phone (rehype-wrap-tables.ts) → HTML.
 * Sanitising happens before KaTeX, so only KaTeX's own output is trusted.
 *
 * Why limits: the parser and KaTeX are fast on ordinary text but not on
 * everything a file can hold. Measured on a 2-core machine (remark 15,
 * KaTeX 0.16): 20,000 characters of nested "> - " took 24 s to parse and
 * 49 s to render; 10,000 "*_" pairs 12 s; 2,000 lines "> - > x" 5 s and
 * 1,000 setext headings 2.4 s (both grow faster than the line count); one
 * 480-character macro expanded 170 times 8 s and 0.9 MB of HTML; 5,000 inline
 * formulas 1.9 MB of HTML. The costs grow with the nesting depth, the number
 * of lines, of emphasis and bracket delimiters, the number and size of
 * formulas and the expansion of macros, so each is bounded, and nesting, lines
 * and delimiters are counted on the source before the parser sees it. Within
 * DESCRIPTION_LIMITS the slowest input we know of (500 lines of "> - > - x",
 * six levels each) renders in about 2 s.
 */
import { remark } from 'remark';
import remarkGfm from 'remark-gfm';
import remarkMath from 'remark-math';
import remarkRehype from 'remark-rehype';
import rehypeSanitize, { defaultSchema, type Options as SanitizeSchema } from 'rehype-sanitize';
import rehypeStringify from 'rehype-stringify';
import { escapeHtml } from './escape-html.ts';
import { rehypeKatexRaw } from './rehype-katex-raw.ts';
import { rehypeWrapTables } from './rehype-wrap-tables.ts';

export { escapeHtml };

export interface MarkdownLimits {
  /** Characters of Markdown source. */
  maxCharacters: number;
  /** Lines of Markdown source (block structure is what the parser's cost grows with). */
  maxLines: number;
  /** Nested block quotes and lists. */
  maxDepth: number;
  /** Formulas ($…$, $$…$$ blocks and ```math blocks). */
  maxFormulas: number;
  /** Characters of TeX in one formula. */
  maxFormulaCharacters: number;
  /** Nested braces in one formula. */
  maxBraceDepth: number;
  /** Emphasis, code and link delimiters (* _ ` [ ]) in the source. */
  maxDelimiters: number;
  /** Bytes of HTML produced. */
  maxRenderedBytes: number;
  /** KaTeX macro expansions per formula (built-in macros such as \dots expand too). */
  maxExpand: number;
}

/** Limits for model descriptions. */
export const DESCRIPTION_LIMITS: MarkdownLimits = {
  maxCharacters: 10_000,
  maxLines: 500,
  maxDepth: 6,
  maxFormulas: 200,
  maxFormulaCharacters: 1_000,
  maxBraceDepth: 32,
  maxDelimiters: 2_000,
  maxRenderedBytes: 200_000,
  maxExpand: 500,
};

/** Limits for the project's own documents (conventions, model format): trusted, but still bounded. */
export const DOCUMENT_LIMITS: MarkdownLimits = {
  ...DESCRIPTION_LIMITS,
  maxCharacters: 100_000,
  maxLines: 5_000,
  maxFormulas: 2_000,
  maxDelimiters: 20_000,
  maxRenderedBytes: 2_000_000,
};

export interface MarkdownProblem {
  message: string;
  hint?: string;
  /** Character offset in the Markdown source where the problem is, when there is one place. */
  offset?: number;
}

export type RenderResult = { ok: true; html: string } | { ok: false; problem: MarkdownProblem };

export const sanitizeSchema: SanitizeSchema = {
  ...defaultSchema,
  attributes: {
    ...defaultSchema.attributes,
    code: [['className', /^language-./, 'math-inline', 'math-display']],
  },
};

/**
 * KaTeX for untrusted text: trust off keeps \href, \url, \includegraphics and
 * \html… inert; maxSize bounds \rule and spaces (em); maxExpand bounds macros.
 */
export function katexOptions(limits: MarkdownLimits = DESCRIPTION_LIMITS) {
  return { strict: 'ignore' as const, trust: false, maxExpand: limits.maxExpand, maxSize: 20, throwOnError: false };
}

function processorFor(limits: MarkdownLimits) {
  return remark()
    .use(remarkGfm)
    .use(remarkMath)
    .use(remarkRehype)
    .use(rehypeSanitize, sanitizeSchema)
    .use(rehypeKatexRaw, katexOptions(limits))
    .use(rehypeWrapTables)
    // Raw nodes are only KaTeX's own output, inserted after sanitising.
    .use(rehypeStringify, { allowDangerousHtml: true });
}

const processors = new Map<MarkdownLimits, ReturnType<typeof processorFor>>();

/** Commands that define macros: with them a short formula can expand without bound. */
const MACRO_DEFINITION = /\\(def|gdef|edef|xdef|let|futurelet|global|newcommand|renewcommand|providecommand|DeclareRobustCommand|newenvironment|renewenvironment)(?![A-Za-z])/;

const plural = (n: number, word: string) => `${n} ${word}${n === 1 ? '' : 's'}`;

/**
 * Nesting a line opens, counted generously from its prefix: every ">", every
 * list marker, and one level per two columns of indentation (list items nest by
 * indentation). The parser's cost grows with nesting, so this runs before it.
 */
function prefixDepth(line: string): number {
  let depth = 0, spaces = 0;
  for (let i = 0; i < line.length; i++) {
    const c = line[i];
    if (c === '>') depth++;
    else if (c === ' ') spaces++;
    else if (c === '\t') spaces += 4;
    else if ((c === '-' || c === '+' || c === '*') && (line[i + 1] === ' ' || line[i + 1] === '\t')) depth++;
    else if (c >= '0' && c <= '9') {
      let j = i;
      while (j < line.length && line[j] >= '0' && line[j] <= '9' && j - i < 9) j++;
      if ((line[j] === '.' || line[j] === ')') && (line[j + 1] === ' ' || line[j + 1] === '\t' || j + 1 === line.length)) {
        depth++;
        i = j;
      } else break;
    } else break;
  }
  return depth + Math.floor(spaces / 2);
}

function checkSource(markdown: string, limits: MarkdownLimits): MarkdownProblem | undefined {
  if (markdown.length > limits.maxCharacters) {
    return { message: `is ${markdown.length} characters long; at most ${limits.maxCharacters} are allowed`, hint: 'keep the description to what a reader needs on the page; cite references for the rest' };
  }
  let delimiters = 0;
  for (let i = 0; i < markdown.length; i++) {
    const c = markdown.charCodeAt(i);
    // * _ ` [ ]
    if (c === 42 || c === 95 || c === 96 || c === 91 || c === 93) delimiters++;
  }
  if (delimiters > limits.maxDelimiters) {
    return { message: `has ${delimiters} emphasis, code and link delimiters (* _ \` [ ]); at most ${limits.maxDelimiters} are allowed`, hint: 'long runs of these characters are costly to parse; put literal text in a code block' };
  }
  const lines = markdown.split('\n');
  if (lines.length > limits.maxLines) {
    return { message: `has ${lines.length} lines; at most ${limits.maxLines} are allowed`, hint: 'join short lines into paragraphs; cite references for the rest' };
  }
  let offset = 0;
  for (const line of lines) {
    if (prefixDepth(line) > 2 * limits.maxDepth + 4) {
      return { message: `nests block quotes or lists too deeply (more than ${limits.maxDepth} levels)`, hint: `use at most ${limits.maxDepth} levels of quotes and lists`, offset };
    }
    offset += line.length + 1;
  }
  return undefined;
}

interface MdNode {
  type: string;
  value?: string;
  lang?: string | null;
  children?: MdNode[];
  position?: { start: { offset?: number } };
}

function braceDepth(tex: string): number {
  let depth = 0, deepest = 0;
  for (let i = 0; i < tex.length; i++) {
    const c = tex[i];
    if (c === '\\') i++;
    else if (c === '{') deepest = Math.max(deepest, ++depth);
    else if (c === '}') depth = Math.max(0, depth - 1);
  }
  return deepest;
}

function checkTree(tree: MdNode, limits: MarkdownLimits): MarkdownProblem | undefined {
  let formulas = 0;
  let problem: MarkdownProblem | undefined;
  const visit = (node: MdNode, depth: number): void => {
    if (problem) return;
    const at = node.position?.start.offset;
    const located = (p: MarkdownProblem): MarkdownProblem => (at === undefined ? p : { ...p, offset: at });
    const nested = node.type === 'blockquote' || node.type === 'list' ? depth + 1 : depth;
    if (nested > limits.maxDepth) {
      problem = located({ message: `nests block quotes or lists ${nested} levels deep; at most ${limits.maxDepth} are allowed`, hint: 'flatten the structure' });
      return;
    }
    const isFormula = node.type === 'inlineMath' || node.type === 'math' || (node.type === 'code' && node.lang === 'math');
    if (isFormula) {
      formulas++;
      const tex = node.value ?? '';
      if (formulas > limits.maxFormulas) {
        problem = located({ message: `has more than ${plural(limits.maxFormulas, 'formula')}`, hint: 'keep the key formulas on the page and cite references for derivations' });
      } else if (tex.length > limits.maxFormulaCharacters) {
        problem = located({ message: `has a formula of ${tex.length} characters; at most ${limits.maxFormulaCharacters} are allowed in one formula`, hint: 'split it into several formulas' });
      } else if (MACRO_DEFINITION.test(tex)) {
        const name = MACRO_DEFINITION.exec(tex)![1];
        problem = located({ message: `defines a macro (\\${name}) in a formula; definitions are not allowed in descriptions`, hint: 'write the formula out in full: a definition can expand without bound' });
      } else if (braceDepth(tex) > limits.maxBraceDepth) {
        problem = located({ message: `has a formula with braces nested more than ${limits.maxBraceDepth} levels deep`, hint: 'simplify the formula' });
      }
      return;
    }
    for (const child of node.children ?? []) visit(child, nested);
  };
  visit(tree, 0);
  return problem;
}

/** Markdown (untrusted) → sanitised HTML with server-rendered math, or the first limit it breaks. Never throws. */
export function renderDescription(markdown: string, limits: MarkdownLimits = DESCRIPTION_LIMITS): RenderResult {
  try {
    const early = checkSource(markdown, limits);
    if (early) return { ok: false, problem: early };
    let processor = processors.get(limits);
    if (!processor) processors.set(limits, (processor = processorFor(limits)));
    const tree = processor.parse(markdown);
    const structural = checkTree(tree as MdNode, limits);
    if (structural) return { ok: false, problem: structural };
    const html = String(processor.stringify(processor.runSync(tree)));
    const bytes = Buffer.byteLength(html, 'utf8');
    if (bytes > limits.maxRenderedBytes) {
      return { ok: false, problem: { message: `renders to ${Math.ceil(bytes / 1000)} kB of HTML; at most ${Math.floor(limits.maxRenderedBytes / 1000)} kB are allowed`, hint: 'shorten the description or use fewer and smaller formulas' } };
    }
    return { ok: true, html };
  } catch (error) {
    const message = error instanceof Error ? `${error.name}: ${error.message}` : String(error);
    return { ok: false, problem: { message: `could not be rendered (${message})` } };
  }
}

/** Markdown → HTML for a page: the rendering, or a visible note saying why there is none. Never throws. */
export function renderMarkdown(markdown: string, limits: MarkdownLimits = DESCRIPTION_LIMITS): string {
  const result = renderDescription(markdown, limits);
  if (result.ok) return result.html;
  const { message, hint } = result.problem;
  return `<p class="render-error">This text was not rendered: it ${escapeHtml(message)}${hint ? ` (${escapeHtml(hint)})` : ''}.</p>`;
}

