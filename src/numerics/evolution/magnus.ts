/**
 * Fourth-order commutator-free Magnus integrator (CF4 with two exponentials):
 * Blanes & Moan, J. Comput. Appl. Math. 142, 313 (2002) / Alvermann & Fehske,
 * J. Comput. Phys. 230, 5930 (2011). Over one slice [t, t+h], with Gauss–Legendre
 * nodes t₁,₂ = t + (1/2 ∓ √3/6) h and H_k = H(t_k),
 *     U(t+h, t) ≈ exp(−ih(α₁H₁ + α₂H₂)) · exp(−ih(α₂H₁ + α₁H₂)),
 *     α₁ = (3 − 2√3)/12,  α₂ = (3 + 2√3)/12.
 * Each factor is the exponential of a Hermitian matrix, so the result is unitary to
 * rounding whatever the step; the local error is O(h⁵), the global error O(h⁴).
 */
import type { ComplexMatrix } from '../linalg/complex-matrix.ts';
import { identity, multiply, zeros } from '../linalg/complex-matrix.ts';
import { exp2x2, expMinusIHt } from '../linalg/exponential.ts';

const SQRT3 = Math.sqrt(3);
export const CF4_NODES: readonly [number, number] = [0.5 - SQRT3 / 6, 0.5 + SQRT3 / 6];
export const CF4_WEIGHTS: readonly [number, number] = [(3 - 2 * SQRT3) / 12, (3 + 2 * SQRT3) / 12];

/** Writes H(t) into `out` (n×n) and returns it. */
export type HamiltonianSampler = (t: number, out: ComplexMatrix) => ComplexMatrix;

/**
 * Writes H at quadrature node `node` into `out`: node 2k is t₀ + (k + c₁)h and
 * node 2k + 1 is t₀ + (k + c₂)h (see cf4NodeTimes).
 */
export type NodeSampler = (node: number, out: ComplexMatrix) => ComplexMatrix;

/** The 2·slices quadrature node times of CF4 on [t0, t1]. */
export function cf4NodeTimes(t0: number, t1: number, slices: number): Float64Array {
  const h = (t1 - t0) / slices;
  const times = new Float64Array(2 * slices);
  for (let k = 0; k < slices; k++) {
    times[2 * k] = t0 + (k + CF4_NODES[0]) * h;
    times[2 * k + 1] = t0 + (k + CF4_NODES[1]) * h;
  }
  return times;
}

/** U(t1, t0) with `slices` equal CF4 steps; `size` is the matrix size. */
export function magnusCF4(hamiltonian: HamiltonianSampler, size: number, t0: number, t1: number, slices: number): ComplexMatrix {
  checkSlices(slices);
  const times = cf4NodeTimes(t0, t1, slices);
  return magnusCF4AtNodes((node, out) => hamiltonian(times[node], out), size, t0, t1, slices);
}

function checkSlices(slices: number): void {
  if (!(Number.isInteger(slices) && slices >= 1)) throw new RangeError(`magnusCF4: slice count must be a positive integer, got ${slices}`);
}

/** As magnusCF4, with H supplied per quadrature node (lets callers precompute node tables). */
export function magnusCF4AtNodes(hamiltonian: NodeSampler, size: number, t0: number, t1: number, slices: number): ComplexMatrix {
  checkSlices(slices);
  if (size === 2) return magnusCF4TwoLevel(hamiltonian, t0, t1, slices);
  const h = (t1 - t0) / slices;
  const [a1, a2] = CF4_WEIGHTS;
  const h1 = zeros(size, size), h2 = zeros(size, size), g = zeros(size, size);
  const sparse = new SparseGenerator(size);
  const work = [zeros(size, size), zeros(size, size), zeros(size, size)];
  let u = identity(size);
  const step = () => {
    // Sparse generators (ribbons, open chains: a few nonzeros per row) are applied
    // to U by their Taylor series, dense ones by the spectral exponential.
    if (sparse.load(g)) sparse.applyExponential(h, u, work);
    else u = multiply(expMinusIHt(g, h), u);
  };
  for (let k = 0; k < slices; k++) {
    hamiltonian(2 * k, h1);
    hamiltonian(2 * k + 1, h2);
    for (let p = 0; p < g.re.length; p++) {
      g.re[p] = a2 * h1.re[p] + a1 * h2.re[p];
      g.im[p] = a2 * h1.im[p] + a1 * h2.im[p];
    }
    step();
    for (let p = 0; p < g.re.length; p++) {
      g.re[p] = a1 * h1.re[p] + a2 * h2.re[p];
      g.im[p] = a1 * h1.im[p] + a2 * h2.im[p];
    }
    step();
  }
  return u;
}

/** Sizes below this always take the spectral exponential. */
const SPARSE_MIN_SIZE = 8;
/** Largest fraction of nonzero entries for the sparse route. */
const SPARSE_MAX_FILL = 0.25;
/** Stop the Taylor series once the bound on the remainder is below this (relative). */
const TAYLOR_REMAINDER = 1e-17;

/**
 * U ← exp(−iGτ)U for a Hermitian G with few nonzeros per row, by the Taylor
 * series Σ_k (−iτG)^k U / k! (common practice for short steps; cf. Moler &
 * Van Loan, SIAM Rev. 45, 3 (2003), method 1). Each term costs nnz(G)·n instead
 * of the n³ of a dense product. The step is split into s equal parts with
 * θ = τ‖G‖_∞/s ≤ 1 (‖G‖_∞, the largest absolute row sum, bounds ‖G‖₂), and the
 * series is cut at the first m with θ^{m+1}/(m+1)! · e^θ ≤ 1e-17, a bound on the
 * remainder relative to ‖U‖₂ = 1: the result is unitary to rounding, as the
 * spectral route is.
 */
class SparseGenerator {
  private readonly n: number;
  private readonly start: Int32Array;
  private readonly col: Int32Array;
  private readonly re: Float64Array;
  private readonly im: Float64Array;
  private norm = 0;

  constructor(n: number) {
    this.n = n;
    this.start = new Int32Array(n + 1);
    this.col = new Int32Array(n * n);
    this.re = new Float64Array(n * n);
    this.im = new Float64Array(n * n);
  }

  /** Reads the nonzeros of g; false when g is too small or too dense for the sparse route. */
  load(g: ComplexMatrix): boolean {
    const n = this.n;
    if (n < SPARSE_MIN_SIZE) return false;
    let count = 0, norm = 0;
    const limit = SPARSE_MAX_FILL * n * n;
    for (let r = 0; r < n; r++) {
      this.start[r] = count;
      let row = 0;
      for (let c = 0; c < n; c++) {
        const x = g.re[r * n + c], y = g.im[r * n + c];
        if (x === 0 && y === 0) continue;
        if (count >= limit) return false;
        this.col[count] = c;
        this.re[count] = x;
        this.im[count] = y;
        count++;
        row += Math.sqrt(x * x + y * y);
      }
      norm = Math.max(norm, row);
    }
    this.start[n] = count;
    this.norm = norm;
    return true;
  }

  /** u ← exp(−iGτ)u in place; work holds three n×n scratch matrices. */
  applyExponential(tau: number, u: ComplexMatrix, work: ComplexMatrix[]): void {
    const theta = Math.abs(tau) * this.norm;
    const parts = Math.max(1, Math.ceil(theta));
    const th = theta / parts;
    let terms = 0;
    for (let bound = Math.exp(th), k = 1; ; k++) {
      bound *= th / k;
      terms = k;
      if (bound <= TAYLOR_REMAINDER || th === 0) break;
    }
    for (let p = 0; p < parts; p++) this.applySeries(tau / parts, terms, u, work);
  }

  private applySeries(tau: number, terms: number, u: ComplexMatrix, work: ComplexMatrix[]): void {
    const n = this.n, nn = n * n;
    const [acc, a, b] = work;
    acc.re.set(u.re);
    acc.im.set(u.im);
    let term = u, next = a;
    for (let k = 1; k <= terms; k++) {
      // next = (−iτ/k) G · term
      const f = tau / k;
      const tr = term.re, ti = term.im, nr = next.re, ni = next.im, ar = acc.re, ai = acc.im;
      for (let r = 0; r < n; r++) {
        const row = r * n;
        const q0 = this.start[r], q1 = this.start[r + 1];
        if (q0 === q1) {
          for (let c = 0; c < n; c++) nr[row + c] = ni[row + c] = 0;
          continue;
        }
        // First nonzero writes the row, the others add to it.
        {
          const gr = this.re[q0], gi = this.im[q0], src = this.col[q0] * n;
          for (let c = 0; c < n; c++) {
            const xr = tr[src + c], xi = ti[src + c];
            nr[row + c] = gr * xr - gi * xi;
            ni[row + c] = gr * xi + gi * xr;
          }
        }
        for (let q = q0 + 1; q < q1; q++) {
          const gr = this.re[q], gi = this.im[q], src = this.col[q] * n;
          for (let c = 0; c < n; c++) {
            const xr = tr[src + c], xi = ti[src + c];
            nr[row + c] += gr * xr - gi * xi;
            ni[row + c] += gr * xi + gi * xr;
          }
        }
        // Multiply the row by −iτ/k ((x + iy)(−if) = fy − ifx) and add it to the sum.
        for (let c = 0; c < n; c++) {
          const x = nr[row + c], y = ni[row + c];
          nr[row + c] = f * y;
          ni[row + c] = -f * x;
          ar[row + c] += f * y;
          ai[row + c] -= f * x;
        }
      }
      term = next;
      next = next === a ? b : a;
    }
    u.re.set(acc.re);
    u.im.set(acc.im);
  }
}

/**
 * 2×2 path (two-band models on fine k grids): each factor is the closed-form
 * exponential of G = g₀ + g·σ (exp2x2) multiplied into U in place, with no
 * allocation per slice.
 */
function magnusCF4TwoLevel(hamiltonian: NodeSampler, t0: number, t1: number, slices: number): ComplexMatrix {
  const h = (t1 - t0) / slices;
  const [a1, a2] = CF4_WEIGHTS;
  const h1 = zeros(2, 2), h2 = zeros(2, 2), m = zeros(2, 2);
  const u = identity(2);
  const ur = u.re, ui = u.im, mr = m.re, mi = m.im;
  const apply = (wa: number, wb: number) => {
    // G = wa·H1 + wb·H2 = [[p, conj b], [b, q]]
    const p = wa * h1.re[0] + wb * h2.re[0], q = wa * h1.re[3] + wb * h2.re[3];
    const bRe = wa * 0.5 * (h1.re[2] + h1.re[1]) + wb * 0.5 * (h2.re[2] + h2.re[1]);
    const bIm = wa * 0.5 * (h1.im[2] - h1.im[1]) + wb * 0.5 * (h2.im[2] - h2.im[1]);
    exp2x2(p, q, bRe, bIm, h, m, 0, 1);
    for (let col = 0; col < 2; col++) {
      const xr = ur[col], xi = ui[col], yr = ur[2 + col], yi = ui[2 + col];
      ur[col] = mr[0] * xr - mi[0] * xi + mr[1] * yr - mi[1] * yi;
      ui[col] = mr[0] * xi + mi[0] * xr + mr[1] * yi + mi[1] * yr;
      ur[2 + col] = mr[2] * xr - mi[2] * xi + mr[3] * yr - mi[3] * yi;
      ui[2 + col] = mr[2] * xi + mi[2] * xr + mr[3] * yi + mi[3] * yr;
    }
  };
  for (let k = 0; k < slices; k++) {
    hamiltonian(2 * k, h1);
    hamiltonian(2 * k + 1, h2);
    apply(a2, a1);
    apply(a1, a2);
  }
  return u;
}
