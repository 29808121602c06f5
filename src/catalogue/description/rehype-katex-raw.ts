/**
 * Math typeset by KaTeX, inserted as KaTeX's own HTML string. Same detection as
 * rehype-katex (code elements with the math-inline / math-display classes that
 * remark-math produces, or a ```math block), but the result is kept as a raw
 * string instead of being parsed back into a tree: that re-parse cost four
 * fifths of the time of a description. Safe because it runs after sanitising
 * and the only raw HTML in the tree is KaTeX's (trust off, bounded expansion);
 * the stringifier must allow raw nodes.
 */
import katex from 'katex';
import type { Element, ElementContent, Root, RootContent } from 'hast';

interface Raw {
  type: 'raw';
  value: string;
}

function textOf(node: ElementContent | RootContent): string {
  if (node.type === 'text') return node.value;
  if (node.type === 'element') return node.children.map(textOf).join('');
  return '';
}

function classes(element: Element): string[] {
  const c = element.properties?.className;
  return Array.isArray(c) ? c.map(String) : [];
}

export function rehypeKatexRaw(options: katex.KatexOptions = {}) {
  const render = (tex: string, displayMode: boolean): Raw => ({ type: 'raw', value: katex.renderToString(tex, { ...options, displayMode, throwOnError: false }) });
  const visit = (children: (ElementContent | RootContent)[]): (ElementContent | RootContent | Raw)[] =>
    children.map((child) => {
      if (child.type !== 'element') return child;
      const own = classes(child);
      if (child.tagName === 'pre' && child.children.length === 1) {
        const code = child.children[0];
        if (code.type === 'element' && code.tagName === 'code' && classes(code).includes('language-math')) return render(textOf(code), true);
      }
      if (own.includes('math-display') || own.includes('math-inline') || own.includes('language-math')) return render(textOf(child), own.includes('math-display'));
      child.children = visit(child.children) as Element['children'];
      return child;
    });
  return (tree: Root) => {
    tree.children = visit(tree.children) as Root['children'];
  };
}
