// Union–find components (common practice): checked against components found by a
// breadth-first search written out in the test, on seeded random graphs.
import { describe, expect, it } from 'vitest';
import { ComponentFinder } from '../../../src/numerics/linalg/connected-components.ts';
import { seededRandom } from '../../support/random.ts';

function componentsBySearch(n: number, edges: [number, number][]): number[][] {
  const neighbours = Array.from({ length: n }, () => [] as number[]);
  for (const [a, b] of edges) {
    neighbours[a].push(b);
    neighbours[b].push(a);
  }
  const seen = new Array<boolean>(n).fill(false);
  const out: number[][] = [];
  for (let start = 0; start < n; start++) {
    if (seen[start]) continue;
    const component: number[] = [];
    const queue = [start];
    seen[start] = true;
    while (queue.length) {
      const v = queue.shift()!;
      component.push(v);
      for (const w of neighbours[v]) if (!seen[w]) { seen[w] = true; queue.push(w); }
    }
    out.push(component.sort((x, y) => x - y));
  }
  return out;
}

describe('ComponentFinder', () => {
  it('finds the components of a ribbon step: disjoint dimers and untouched sites', () => {
    const finder = new ComponentFinder(7);
    finder.join(0, 1);
    finder.join(3, 2);
    finder.join(5, 4);
    expect(finder.components()).toEqual([[0, 1], [2, 3], [4, 5], [6]]);
  });

  it('agrees with a breadth-first search on seeded random graphs', () => {
    const random = seededRandom(20261201);
    for (let trial = 0; trial < 20; trial++) {
      const n = 1 + Math.floor(random() * 40);
      const edges: [number, number][] = [];
      for (let e = 0; e < n; e++) edges.push([Math.floor(random() * n), Math.floor(random() * n)]);
      const finder = new ComponentFinder(n);
      for (const [a, b] of edges) finder.join(a, b);
      expect(finder.components()).toEqual(componentsBySearch(n, edges));
    }
  });

  it('handles the empty graph', () => {
    expect(new ComponentFinder(0).components()).toEqual([]);
  });
});
