/**
 * The project's documents (docs/conventions.md, docs/model-format.md) as
 * pages, through the same pipeline as model descriptions (GFM tables, TeX
 * math, sanitised, KaTeX on the server), with three additions for prose
 * written in Unicode notation:
 *
 *  - underscores never make emphasis (docs write ∂_tV, H(s)_{ba}; emphasis is
 *    written with *), so an emphasis opened by "_" is turned back into text;
 *  - X_{ab}, X_a, X^{…}, X^d in plain text become sub- and superscripts;
 *  - links between documents, to schemas and to model files point at the
 *    site's own pages; headings get ids for anchors.
 */
import { remark } from 'remark';
import remarkGfm from 'remark-gfm';
import remarkMath from 'remark-math';
import remarkRehype from 'remark-rehype';
import rehypeSanitize from 'rehype-sanitize';
import rehypeStringify from 'rehype-stringify';
import type { Element, ElementContent, Root as HastRoot } from 'hast';
import { DOCUMENT_LIMITS, katexOptions, sanitizeSchema } from './markdown.ts';
import { rehypeWrapTables } from '../catalogue/description/rehype-wrap-tables.ts';
import { rehypeKatexRaw } from '../catalogue/description/rehype-katex-raw.ts';

interface MdNode {
  type: string;
  value?: string;
  children?: MdNode[];
  position?: { start: { offset?: number }; end: { offset?: number } };
  data?: { hName?: string };
}

/** Emphasis and strong nodes written with "_" become their text again, underscores included. */
function undoUnderscoreEmphasis(node: MdNode, source: string): void {
  if (!node.children) return;
  const out: MdNode[] = [];
  for (const child of node.children) {
    undoUnderscoreEmphasis(child, source);
    const start = child.position?.start.offset;
    if ((child.type === 'emphasis' || child.type === 'strong') && start !== undefined && source[start] === '_') {
      const mark = child.type === 'strong' ? '__' : '_';
      out.push({ type: 'text', value: mark }, ...(child.children ?? []), { type: 'text', value: mark });
    } else out.push(child);
  }
  // Merge neighbouring text nodes so that notation split by the parser is whole again.
  node.children = out.reduce<MdNode[]>((acc, n) => {
    const last = acc[acc.length - 1];
    if (n.type === 'text' && last?.type === 'text') last.value = (last.value ?? '') + (n.value ?? '');
    else acc.push(n.type === 'text' ? { type: 'text', value: n.value } : n);
    return acc;
  }, []);
}

/** Length of a script run after "_" or "^": a lower-case run (letters, digits, primes), an upper-case run, or one symbol. */
function runLength(text: string, at: number): number {
  const chars = [...text.slice(at)];
  if (chars.length === 0) return 0;
  const first = chars[0];
  if (/[<>]/.test(first)) return first.length;
  const lower = /[\p{Ll}\p{N}′]/u, upper = /\p{Lu}/u;
  const same = lower.test(first) ? lower : upper.test(first) ? upper : null;
  if (!same) return 0;
  let length = 0;
  for (const c of chars) {
    if (!same.test(c)) break;
    length += c.length;
  }
  return length;
}

/** Splits text into text, sub and sup nodes for the notation above (braces may nest one level of notation). */
export function scriptNodes(text: string): MdNode[] {
  const out: MdNode[] = [];
  let plain = '';
  let i = 0;
  const flush = () => {
    if (plain) out.push({ type: 'text', value: plain });
    plain = '';
  };
  while (i < text.length) {
    const c = text[i];
    const prev = i > 0 ? text[i - 1] : ' ';
    if ((c === '_' || c === '^') && !/\s/.test(prev)) {
      let content: string | null = null;
      let next = i + 1;
      if (text[next] === '{') {
        const close = text.indexOf('}', next);
        if (close > next) (content = text.slice(next + 1, close)), (next = close + 1);
      } else if (c === '^' && /[−-]/.test(text[next] ?? '') && /\d/.test(text[next + 1] ?? '')) {
        const m = /^[−-]\d+/.exec(text.slice(next))!;
        (content = m[0]), (next += m[0].length);
      } else {
        const length = runLength(text, next);
        if (length > 0) (content = text.slice(next, next + length)), (next += length);
      }
      if (content !== null) {
        flush();
        out.push({ type: c === '_' ? 'subscript' : 'superscript', data: { hName: c === '_' ? 'sub' : 'sup' }, children: scriptNodes(content) });
        i = next;
        continue;
      }
    }
    plain += c;
    i++;
  }
  flush();
  return out;
}

const SKIP = new Set(['inlineCode', 'code', 'inlineMath', 'math', 'html', 'link', 'linkReference', 'definition']);

function setScripts(node: MdNode): void {
  if (!node.children) return;
  node.children = node.children.flatMap((child) => {
    if (child.type === 'text' && child.value) return scriptNodes(child.value);
    if (!SKIP.has(child.type) || child.type === 'link') setScripts(child);
    return [child];
  });
}

function remarkUnicodeNotation() {
  return (tree: MdNode, file: { value: unknown }) => {
    undoUnderscoreEmphasis(tree, String(file.value));
    setScripts(tree);
  };
}

/** Where a link in a document points on the site (null: not a page of the site, keep the text only). */
export function siteLink(href: string, base: string): string | null {
  if (/^(https?:|mailto:|#)/.test(href)) return href;
  const [path, hash] = href.split('#');
  const anchor = hash ? `#${hash}` : '';
  const name = path.split('/').pop() ?? '';
  if (/^(conventions|model-format|worked-example|writing-drives|sharding|benchmarks)\.md$/.test(name)) return `${base}/docs/${name.replace(/\.md$/, '')}/${anchor}`;
  const schema = /(?:^|\/)schemas\/(.+\.json)$/.exec(path);
  if (schema) return `${base}/schemas/${schema[1]}`;
  const model = /(?:^|\/)models\/([a-z0-9-]+)\.json$/.exec(path);
  if (model) return `${base}/models/${model[1]}/`;
  return null;
}

function textOf(node: ElementContent): string {
  if (node.type === 'text') return node.value;
  if (node.type === 'element') return node.children.map(textOf).join('');
  return '';
}

function headingId(text: string): string {
  return text.toLowerCase().normalize('NFKD').replace(/[^\p{L}\p{N}]+/gu, '-').replace(/^-+|-+$/g, '') || 'section';
}

function rehypeSiteLinksAndIds(options: { base: string }) {
  return (tree: HastRoot) => {
    const used = new Set<string>();
    const visit = (children: ElementContent[]): ElementContent[] =>
      children.flatMap((child): ElementContent[] => {
        if (child.type !== 'element') return [child];
        child.children = visit(child.children);
        if (child.tagName === 'a' && typeof child.properties?.href === 'string') {
          const target = siteLink(child.properties.href, options.base);
          if (target === null) return child.children;
          child.properties.href = target;
        }
        if (/^h[2-4]$/.test(child.tagName)) {
          let id = headingId(textOf(child));
          for (let n = 2; used.has(id); n++) id = `${headingId(textOf(child))}-${n}`;
          used.add(id);
          (child as Element).properties = { ...child.properties, id };
        }
        return [child];
      });
    tree.children = visit(tree.children as ElementContent[]) as HastRoot['children'];
  };
}

/** A trusted project document (Markdown) → HTML for a page. Never throws. */
export function renderDocument(markdown: string, base = ''): string {
  const processor = remark()
    .use(remarkGfm)
    .use(remarkMath)
    .use(remarkUnicodeNotation)
    .use(remarkRehype)
    .use(rehypeSanitize, sanitizeSchema)
    .use(rehypeKatexRaw, katexOptions(DOCUMENT_LIMITS))
    .use(rehypeSiteLinksAndIds, { base })
    .use(rehypeWrapTables)
    .use(rehypeStringify, { allowDangerousHtml: true });
  try {
    return String(processor.processSync(markdown));
  } catch (error) {
    return `<p class="render-error">This document could not be rendered: ${String(error instanceof Error ? error.message : error).replace(/[<>&]/g, '')}</p>`;
  }
}

/** The headings of a rendered document (level 2), for its table of contents. */
export function documentOutline(html: string): { id: string; text: string }[] {
  return [...html.matchAll(/<h2 id="([^"]+)">(.*?)<\/h2>/g)].map((m) => ({ id: m[1], text: m[2].replace(/<[^>]+>/g, '') }));
}
