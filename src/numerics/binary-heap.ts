/**
 * A binary heap (common practice; e.g. Cormen et al., Introduction to
 * Algorithms, ch. 6) of items ordered by a numeric key: `pop` returns the item
 * with the smallest key, or the largest when built with `largestFirst`.
 * Used by the branch-and-bound gap certificate and the adaptive quadrature.
 */
export class BinaryHeap<T> {
  private readonly items: T[] = [];
  private readonly before: (a: T, b: T) => boolean;

  constructor(key: (item: T) => number, largestFirst = false) {
    this.before = largestFirst ? (a, b) => key(a) > key(b) : (a, b) => key(a) < key(b);
  }

  get size(): number {
    return this.items.length;
  }

  peek(): T | undefined {
    return this.items[0];
  }

  /** Every item, in heap order (not sorted). */
  all(): readonly T[] {
    return this.items;
  }

  push(item: T): void {
    const a = this.items;
    a.push(item);
    let i = a.length - 1;
    while (i > 0) {
      const parent = (i - 1) >> 1;
      if (!this.before(a[i], a[parent])) break;
      [a[parent], a[i]] = [a[i], a[parent]];
      i = parent;
    }
  }

  pop(): T | undefined {
    const a = this.items;
    if (a.length === 0) return undefined;
    const top = a[0];
    const last = a.pop()!;
    if (a.length > 0) {
      a[0] = last;
      let i = 0;
      for (;;) {
        const l = 2 * i + 1, r = l + 1;
        let m = i;
        if (l < a.length && this.before(a[l], a[m])) m = l;
        if (r < a.length && this.before(a[r], a[m])) m = r;
        if (m === i) break;
        [a[m], a[i]] = [a[i], a[m]];
        i = m;
      }
    }
    return top;
  }
}
