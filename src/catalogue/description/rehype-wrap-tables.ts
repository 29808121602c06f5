/**
 * Wraps every table in <div class="table-scroll"> so that a wide table
 * scrolls inside its box instead of widening the page on a phone. Runs after
 * sanitising: it only adds an element of our own.
 */
import type { Element, Root, RootContent } from 'hast';

function wrap(children: RootContent[]): RootContent[] {
  return children.map((child) => {
    if (child.type !== 'element') return child;
    if (child.tagName === 'table') {
      const box: Element = { type: 'element', tagName: 'div', properties: { className: ['table-scroll'] }, children: [child] };
      return box;
    }
    child.children = wrap(child.children as RootContent[]) as Element['children'];
    return child;
  });
}

export function rehypeWrapTables() {
  return (tree: Root) => {
    tree.children = wrap(tree.children);
  };
}
