/**
 * Connected components of an undirected graph on 0 … n−1 (union–find with path
 * halving). Used to split a Hamiltonian into independent blocks before
 * exponentiating it: a one-bond-direction step on a ribbon falls apart into 2×2
 * blocks.
 */
export class ComponentFinder {
  private readonly parent: Int32Array;

  constructor(readonly size: number) {
    this.parent = new Int32Array(size);
    for (let i = 0; i < size; i++) this.parent[i] = i;
  }

  private find(i: number): number {
    const parent = this.parent;
    while (parent[i] !== i) {
      parent[i] = parent[parent[i]];
      i = parent[i];
    }
    return i;
  }

  /** Joins the components of i and j. */
  join(i: number, j: number): void {
    const a = this.find(i), b = this.find(j);
    if (a !== b) this.parent[Math.max(a, b)] = Math.min(a, b);
  }

  /** The components, each sorted ascending, in order of their smallest member. */
  components(): number[][] {
    const groups = new Map<number, number[]>();
    for (let i = 0; i < this.size; i++) {
      const root = this.find(i);
      const group = groups.get(root);
      if (group) group.push(i);
      else groups.set(root, [i]);
    }
    return [...groups.values()];
  }
}
