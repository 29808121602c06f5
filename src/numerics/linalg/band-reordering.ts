/**
 * A reordering of the states that narrows the band of a band matrix: the
 * reverse Cuthill–McKee ordering of its nonzero pattern (Cuthill & McKee,
 * Proc. 24th ACM National Conference (1969); reversed as in George & Liu,
 * Computer Solution of Large Sparse Positive Definite Systems (1981), §4.3).
 *
 * Why: the cost of a banded LU grows like n b² and of a band-preserving
 * reduction like n² b. The cell-by-cell numbering of a ribbon is banded, but
 * not always optimally: in the three-step honeycomb ribbon the bond A_j–B_{j+1}
 * of one step and A_j–B_j of the others give bandwidth 3 in the order
 * (A_j, B_j), 2 in the order (B_j, A_j, B_{j+1}, …) that follows the bonds.
 * Permuting is a unitary similarity P A Pᵀ: eigenvalues are unchanged and the
 * eigenvectors of A are Pᵀ times those of the permuted matrix.
 */
import { BandedMatrix } from './banded-matrix.ts';

/** The RCM order (order[k] = old index of new state k) when it narrows the band; null otherwise. */
export function narrowingOrder(a: BandedMatrix): Int32Array | null {
  const { n, b } = a;
  if (n < 3 || b < 2) return null;
  const neighbours: number[][] = Array.from({ length: n }, () => []);
  for (let i = 0; i < n; i++) {
    for (let j = Math.max(0, i - b); j <= Math.min(n - 1, i + b); j++) {
      if (j === i) continue;
      const p = a.index(i, j), q = a.index(j, i);
      if (a.re[p] !== 0 || a.im[p] !== 0 || a.re[q] !== 0 || a.im[q] !== 0) neighbours[i].push(j);
    }
  }
  const degree = neighbours.map((x) => x.length);
  for (const list of neighbours) list.sort((x, y) => degree[x] - degree[y] || x - y);
  const order: number[] = [];
  const seen = new Uint8Array(n);
  for (;;) {
    // Start each component from an unseen state of smallest degree (a peripheral one, in practice an end of the ribbon).
    let startAt = -1;
    for (let i = 0; i < n; i++) if (!seen[i] && (startAt < 0 || degree[i] < degree[startAt])) startAt = i;
    if (startAt < 0) break;
    seen[startAt] = 1;
    const queue = [startAt];
    for (let head = 0; head < queue.length; head++) {
      const i = queue[head];
      order.push(i);
      for (const j of neighbours[i]) if (!seen[j]) { seen[j] = 1; queue.push(j); }
    }
  }
  order.reverse();
  const position = new Int32Array(n);
  order.forEach((old, k) => (position[old] = k));
  let width = 0;
  for (let i = 0; i < n; i++) for (const j of neighbours[i]) width = Math.max(width, Math.abs(position[i] - position[j]));
  return width < a.effectiveBandwidth() ? Int32Array.from(order) : null;
}

/** P A Pᵀ in band storage: entry (k, l) of the result is A[order[k]][order[l]]. */
export function permuteBanded(a: BandedMatrix, order: Int32Array): BandedMatrix {
  const n = a.n;
  const position = new Int32Array(n);
  order.forEach((old, k) => (position[old] = k));
  let width = 0;
  for (let i = 0; i < n; i++) {
    for (let j = Math.max(0, i - a.b); j <= Math.min(n - 1, i + a.b); j++) {
      const p = a.index(i, j);
      if (a.re[p] !== 0 || a.im[p] !== 0) width = Math.max(width, Math.abs(position[i] - position[j]));
    }
  }
  const out = new BandedMatrix(n, width);
  for (let i = 0; i < n; i++) {
    for (let j = Math.max(0, i - a.b); j <= Math.min(n - 1, i + a.b); j++) {
      const p = a.index(i, j);
      if (a.re[p] === 0 && a.im[p] === 0) continue;
      const q = out.index(position[i], position[j]);
      out.re[q] = a.re[p];
      out.im[q] = a.im[p];
    }
  }
  return out;
}
