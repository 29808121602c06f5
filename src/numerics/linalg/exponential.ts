/**
 * exp(−iHt) for Hermitian H, unitary to rounding.
 *
 * Spectral route (common practice): exp(−iHt) = V e^{−iΛt} V† from the Hermitian
 * eigen-decomposition; with orthonormal V this is unitary to rounding for any t,
 * unlike Padé or Taylor approximants. Two fast paths:
 * - 1×1 and 2×2 blocks use the closed form for H = h₀ + h·σ:
 *   exp(−iHt) = e^{−ih₀t} [cos(|h|t) − i sin(|h|t) ĥ·σ];
 * - block-diagonal structure: the index set is split into connected components
 *   of the nonzero pattern of H and each block is exponentiated on its own (a
 *   one-bond-direction step on a ribbon is a set of independent 2×2 blocks).
 */
import type { ComplexMatrix } from './complex-matrix.ts';
import { zeros } from './complex-matrix.ts';
import { assertHermitian } from './checks.ts';
import { HermitianEigen } from './hermitian-eigen.ts';
import { ComponentFinder } from './connected-components.ts';

export function expMinusIHt(h: ComplexMatrix, t: number): ComplexMatrix {
  return prepareExponential(h)(t);
}

/**
 * Precomputes the block structure and spectral decompositions of H once and
 * returns t ↦ exp(−iHt): for propagating the same H to many times.
 */
export function prepareExponential(h: ComplexMatrix): (t: number) => ComplexMatrix {
  assertHermitian('expMinusIHt', h);
  const n = h.rows;
  if (n === 2) {
    const a = h.re[0], d = h.re[3], bRe = 0.5 * (h.re[2] + h.re[1]), bIm = 0.5 * (h.im[2] - h.im[1]);
    return (t) => {
      if (!Number.isFinite(t)) throw new RangeError(`expMinusIHt: time ${t} is not finite`);
      return exp2x2(a, d, bRe, bIm, t, zeros(2, 2), 0, 1);
    };
  }
  const blocks = connectedBlocks(h);
  const prepared = blocks.map((idx) => prepareBlock(h, idx));
  return (t: number) => {
    if (!Number.isFinite(t)) throw new RangeError(`expMinusIHt: time ${t} is not finite`);
    const out = zeros(n, n);
    for (const apply of prepared) apply(t, out);
    return out;
  };
}

/** Writes exp(−iHt) of the 2×2 Hermitian [[a, conj b], [b, d]] into rows/cols (i0, i1) of out. */
export function exp2x2(a: number, d: number, bRe: number, bIm: number, t: number, out: ComplexMatrix, i0: number, i1: number): ComplexMatrix {
  const n = out.cols;
  exp2x2Into(a, d, bRe, bIm, t, out.re, out.im, i0 * n + i0, i0 * n + i1, i1 * n + i0, i1 * n + i1);
  return out;
}

/**
 * The closed form of exp2x2, written at positions p00, p01, p10, p11 of (re, im):
 * any storage (dense or banded) that holds the four entries.
 */
export function exp2x2Into(a: number, d: number, bRe: number, bIm: number, t: number, re: Float64Array, im: Float64Array, p00: number, p01: number, p10: number, p11: number): void {
  const h0 = 0.5 * (a + d), hz = 0.5 * (a - d), hx = bRe, hy = bIm;
  // sqrt of the sum of squares (Math.hypot is several times slower; |h| of a physical Hamiltonian is far from overflow).
  const r = Math.sqrt(hx * hx + hy * hy + hz * hz);
  const phi = r * t;
  const c = Math.cos(phi);
  // s = sin(|h|t)/|h|, with the series near |h|t = 0.
  const s = Math.abs(phi) < 1e-4 ? t * (1 - (phi * phi) / 6) : Math.sin(phi) / r;
  const gr = Math.cos(h0 * t), gi = -Math.sin(h0 * t);
  // M = e^{−ih₀t} [[c − i s hz, −s hy − i s hx], [s hy − i s hx, c + i s hz]]
  const sx = s * hx, sy = s * hy, sz = s * hz;
  re[p00] = gr * c + gi * sz;
  im[p00] = gi * c - gr * sz;
  re[p01] = -gr * sy + gi * sx;
  im[p01] = -gi * sy - gr * sx;
  re[p10] = gr * sy + gi * sx;
  im[p10] = gi * sy - gr * sx;
  re[p11] = gr * c - gi * sz;
  im[p11] = gi * c + gr * sz;
}

/** Connected components of the graph with an edge i–j wherever H_ij ≠ 0 or H_ji ≠ 0; each sorted ascending. */
export function connectedBlocks(h: ComplexMatrix): number[][] {
  const n = h.rows;
  const finder = new ComponentFinder(n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < i; j++) {
      const p = i * n + j, q = j * n + i;
      if (h.re[p] !== 0 || h.im[p] !== 0 || h.re[q] !== 0 || h.im[q] !== 0) finder.join(i, j);
    }
  }
  return finder.components();
}

type BlockApplier = (t: number, out: ComplexMatrix) => void;

/**
 * exp(−iHt) written into `out` (n×n, overwritten) for a Hermitian H whose
 * nonzero pattern lies inside the given blocks (a partition of 0 … n−1, each
 * sorted ascending), e.g. the bond graph of a drive step. No check of H: the
 * caller builds it Hermitian. Blocks of one and two states allocate nothing.
 */
export function expMinusIHtBlocks(h: ComplexMatrix, blocks: readonly (readonly number[])[], t: number, out: ComplexMatrix): ComplexMatrix {
  const n = h.rows;
  out.re.fill(0);
  out.im.fill(0);
  for (const idx of blocks) {
    if (idx.length === 1) {
      const p = idx[0] * n + idx[0];
      const e = h.re[p];
      out.re[p] = Math.cos(e * t);
      out.im[p] = -Math.sin(e * t);
    } else if (idx.length === 2) {
      const i = idx[0], j = idx[1];
      const bRe = 0.5 * (h.re[j * n + i] + h.re[i * n + j]);
      const bIm = 0.5 * (h.im[j * n + i] - h.im[i * n + j]);
      exp2x2(h.re[i * n + i], h.re[j * n + j], bRe, bIm, t, out, i, j);
    } else prepareBlock(h, idx as number[])(t, out);
  }
  return out;
}

function prepareBlock(h: ComplexMatrix, idx: number[]): BlockApplier {
  const n = h.rows;
  const m = idx.length;
  if (m === 1) {
    const e = h.re[idx[0] * n + idx[0]];
    const p = idx[0] * n + idx[0];
    return (t, out) => {
      out.re[p] = Math.cos(e * t);
      out.im[p] = -Math.sin(e * t);
    };
  }
  if (m === 2) {
    const [i, j] = idx;
    const a = h.re[i * n + i], d = h.re[j * n + j];
    const bRe = 0.5 * (h.re[j * n + i] + h.re[i * n + j]);
    const bIm = 0.5 * (h.im[j * n + i] - h.im[i * n + j]);
    return (t, out) => {
      exp2x2(a, d, bRe, bIm, t, out, i, j);
    };
  }
  const sub = zeros(m, m);
  for (let r = 0; r < m; r++) {
    for (let c = 0; c < m; c++) {
      sub.re[r * m + c] = h.re[idx[r] * n + idx[c]];
      sub.im[r * m + c] = h.im[idx[r] * n + idx[c]];
    }
  }
  const eig = new HermitianEigen(sub);
  const v = eig.vectors, lambda = eig.values;
  const wr = new Float64Array(m * m), wi = new Float64Array(m * m);
  return (t, out) => {
    // W = V e^{−iΛt}; out_block = W V†.
    for (let k = 0; k < m; k++) {
      const cr = Math.cos(lambda[k] * t), ci = -Math.sin(lambda[k] * t);
      for (let r = 0; r < m; r++) {
        const q = r * m + k;
        wr[q] = v.re[q] * cr - v.im[q] * ci;
        wi[q] = v.re[q] * ci + v.im[q] * cr;
      }
    }
    for (let r = 0; r < m; r++) {
      const orow = idx[r] * n;
      for (let c = 0; c < m; c++) {
        let sr = 0, si = 0;
        for (let k = 0; k < m; k++) {
          const xr = wr[r * m + k], xi = wi[r * m + k];
          const yr = v.re[c * m + k], yi = -v.im[c * m + k];
          sr += xr * yr - xi * yi;
          si += xr * yi + xi * yr;
        }
        out.re[orow + idx[c]] = sr;
        out.im[orow + idx[c]] = si;
      }
    }
  };
}
