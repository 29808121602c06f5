/**
 * The time loop over which the gap winding number is integrated, as a sequence
 * of pieces with a constant generator each.
 *
 * - A constant segment is one piece: U ← exp(−iHτ)U.
 * - A kick exp(−iK) (zero duration) becomes a virtual piece of duration τ_K with
 *   constant generator K/τ_K: exp(−i(K/τ_K)τ_K) = exp(−iK). This reparametrises
 *   the loop U(k, ·) (it inserts a path that the instantaneous kick jumps over);
 *   V(k, ·) stays a closed loop from 1 to 1 with the same end point U(T), so its
 *   homotopy class and hence W are unchanged. τ_K only changes the length T′ of
 *   the loop parameter, and H_eff is taken with respect to T′ (see
 *   winding/integral.ts), which keeps V(T′) = 1.
 * - A time-dependent segment is split into the slices of the fourth-order
 *   commutator-free Magnus integrator used by the propagator (magnus.ts), each
 *   slice being two exponentials of Hermitian generators, i.e. two pieces of
 *   duration h/2 with generators 2(α₂H₁ + α₁H₂) and 2(α₁H₁ + α₂H₂). This loop
 *   is a piecewise-constant drive whose U(T) differs from the exact one by the
 *   propagator's tolerance; as long as that is far below the gap at the cut,
 *   the straight-line homotopy between the two drives keeps the gap open, so
 *   the two have the same W.
 */
import type { ComplexMatrix } from '../../linalg/complex-matrix.ts';
import { identity, multiply, zeros } from '../../linalg/complex-matrix.ts';
import { expMinusIHt } from '../../linalg/exponential.ts';
import { propagateTwo } from './two-band-kernel.ts';
import type { LatticeDrive } from '../../evolution/drive.ts';
import { segmentStartTimes } from '../../evolution/drive.ts';
import type { PreparedBloch } from '../../evolution/bloch.ts';
import { prepareBloch } from '../../evolution/bloch.ts';
import { CF4_NODES, CF4_WEIGHTS } from '../../evolution/magnus.ts';
import type { PropagatorOptions } from '../../evolution/propagator.ts';
import { magnusSlicePlan } from '../../evolution/propagator.ts';

export interface LoopPiece {
  /** Index of the drive segment the piece belongs to. */
  segment: number;
  kind: 'step' | 'kick' | 'slice';
  /** Duration in the loop parameter (physical time except for kicks). */
  duration: number;
  /** The piece's generator is Σ weight · H_segment(time). */
  samples: { time: number; weight: number }[];
}

export interface LoopPlan {
  pieces: LoopPiece[];
  /** Length T′ of the loop parameter: the period plus the virtual durations of kicks. */
  length: number;
}

/**
 * Pieces of the loop. `slices[i]` is the Magnus slice count of segment i (used
 * only for time-dependent segments; see magnusSliceCounts).
 */
export function planLoop(drive: LatticeDrive, bloch: PreparedBloch, slices: number[]): LoopPlan {
  const starts = segmentStartTimes(drive);
  const kickDuration = drive.period / drive.segments.length;
  const pieces: LoopPiece[] = [];
  let length = 0;
  drive.segments.forEach((seg, i) => {
    if (seg.duration === 0) {
      pieces.push({ segment: i, kind: 'kick', duration: kickDuration, samples: [{ time: starts[i], weight: 1 / kickDuration }] });
      length += kickDuration;
      return;
    }
    length += seg.duration;
    if (bloch.isConstant(i)) {
      pieces.push({ segment: i, kind: 'step', duration: seg.duration, samples: [{ time: starts[i], weight: 1 }] });
      return;
    }
    const m = Math.max(1, slices[i] ?? 1);
    const h = seg.duration / m;
    const [c1, c2] = CF4_NODES;
    const [a1, a2] = CF4_WEIGHTS;
    for (let k = 0; k < m; k++) {
      const t1 = starts[i] + (k + c1) * h, t2 = starts[i] + (k + c2) * h;
      // exp(−ih(α₂H₁ + α₁H₂)) acts first, then exp(−ih(α₁H₁ + α₂H₂)) (magnus.ts).
      pieces.push({ segment: i, kind: 'slice', duration: h / 2, samples: [{ time: t1, weight: 2 * a2 }, { time: t2, weight: 2 * a1 }] });
      pieces.push({ segment: i, kind: 'slice', duration: h / 2, samples: [{ time: t1, weight: 2 * a1 }, { time: t2, weight: 2 * a2 }] });
    }
  });
  return { pieces, length };
}

/**
 * Magnus slice counts per segment, settled once for the drive (propagator.ts,
 * magnusSlicePlan): at the momenta where ‖H‖ is largest and at the given ones
 * (1 for constant segments and kicks).
 */
export function magnusSliceCounts(drive: LatticeDrive, momenta: number[][], options?: PropagatorOptions): number[] {
  return magnusSlicePlan(drive, options, momenta).slices;
}

/** Writes the generator of `piece` at the momentum `bloch` was prepared for into `out`. */
export function pieceGenerator(bloch: PreparedBloch, piece: LoopPiece, out: ComplexMatrix, scratch: ComplexMatrix): ComplexMatrix {
  const nn = out.re.length;
  out.re.fill(0);
  out.im.fill(0);
  for (const { time, weight } of piece.samples) {
    bloch.segmentAt(piece.segment, time, scratch);
    for (let q = 0; q < nn; q++) {
      out.re[q] += weight * scratch.re[q];
      out.im[q] += weight * scratch.im[q];
    }
  }
  return out;
}

/**
 * A piece's generator as a trigonometric polynomial in the reduced momenta,
 * G(s) = Σ_n C_n e^{−2πi s·n}: in the cell gauge of drive.ts every term
 * contributes e^{−2πi s·n} times a momentum-independent factor (modulation and
 * Peierls phase included), so the offsets n are those of the terms and their
 * conjugates. With |n_i| ≤ M_i, sampling G on the (2M₁+1) × (2M₂+1) grid and
 * inverting the discrete Fourier transform recovers every C_n exactly (the
 * aliases m ≡ n mod 2M+1 with |m| ≤ M coincide with n). Evaluating the
 * series is much cheaper than rebuilding the Bloch matrix term by term.
 */
export interface GeneratorSeries {
  /** Matrix size N. */
  size: number;
  /** Offsets with a nonzero coefficient. */
  n1: Int32Array;
  n2: Int32Array;
  /** Coefficients C_n, N² entries each, packed in the order of the offsets. */
  re: Float64Array;
  im: Float64Array;
}

export function generatorSeries(drive: LatticeDrive, plan: LoopPlan): GeneratorSeries[] {
  if (drive.dimension !== 2) throw new RangeError(`generatorSeries: needs a two-dimensional lattice, got dimension ${drive.dimension}`);
  const n = drive.states.length, nn = n * n;
  let m1 = 0, m2 = 0;
  for (const seg of drive.segments) {
    for (const term of seg.terms) {
      m1 = Math.max(m1, Math.abs(term.offset[0] ?? 0));
      m2 = Math.max(m2, Math.abs(term.offset[1] ?? 0));
    }
  }
  const p1 = 2 * m1 + 1, p2 = 2 * m2 + 1;
  const samples: ComplexMatrix[][] = plan.pieces.map(() => []);
  const gen = zeros(n, n), scratch = zeros(n, n);
  for (let j1 = 0; j1 < p1; j1++) {
    for (let j2 = 0; j2 < p2; j2++) {
      const bloch = prepareBloch(drive, [j1 / p1, j2 / p2]);
      plan.pieces.forEach((piece, p) => {
        pieceGenerator(bloch, piece, gen, scratch);
        samples[p].push({ rows: n, cols: n, re: gen.re.slice(), im: gen.im.slice() });
      });
    }
  }
  return samples.map((list) => {
    const offsets1: number[] = [], offsets2: number[] = [], re: number[] = [], im: number[] = [];
    let scale = 0;
    for (const g of list) for (let e = 0; e < nn; e++) scale = Math.max(scale, Math.hypot(g.re[e], g.im[e]));
    for (let a = -m1; a <= m1; a++) {
      for (let b = -m2; b <= m2; b++) {
        const cr = new Float64Array(nn), ci = new Float64Array(nn);
        list.forEach((g, idx) => {
          const j1 = Math.floor(idx / p2), j2 = idx % p2;
          const arg = 2 * Math.PI * ((j1 * a) / p1 + (j2 * b) / p2);
          const c = Math.cos(arg), s = Math.sin(arg);
          for (let e = 0; e < nn; e++) {
            cr[e] += g.re[e] * c - g.im[e] * s;
            ci[e] += g.re[e] * s + g.im[e] * c;
          }
        });
        let size = 0;
        for (let e = 0; e < nn; e++) {
          cr[e] /= p1 * p2;
          ci[e] /= p1 * p2;
          size = Math.max(size, Math.hypot(cr[e], ci[e]));
        }
        // Coefficients at rounding level are aliases of nothing: drop them.
        if (size <= 1e-14 * Math.max(scale, 1e-300)) continue;
        offsets1.push(a);
        offsets2.push(b);
        re.push(...cr);
        im.push(...ci);
      }
    }
    return { size: n, n1: Int32Array.from(offsets1), n2: Int32Array.from(offsets2), re: Float64Array.from(re), im: Float64Array.from(im) };
  });
}

/** Writes G(s) of a series into outRe/outIm at `offset` (N² entries). */
export function generatorAt(series: GeneratorSeries, s1: number, s2: number, outRe: Float64Array, outIm: Float64Array, offset: number): void {
  const nn = series.size * series.size;
  for (let e = 0; e < nn; e++) {
    outRe[offset + e] = 0;
    outIm[offset + e] = 0;
  }
  for (let q = 0; q < series.n1.length; q++) {
    const arg = -2 * Math.PI * (s1 * series.n1[q] + s2 * series.n2[q]);
    const c = Math.cos(arg), s = Math.sin(arg);
    const base = q * nn;
    for (let e = 0; e < nn; e++) {
      const xr = series.re[base + e], xi = series.im[base + e];
      outRe[offset + e] += xr * c - xi * s;
      outIm[offset + e] += xr * s + xi * c;
    }
  }
}

/**
 * Lipschitz bound of the loop's quasienergies in momentum (units π/T per unit
 * of reduced momentum), per direction: Σ_pieces τ_p Σ_n 2π|n_μ| ‖C_n‖_F / π, since
 * ‖∂_μG_p‖ ≤ Σ_n 2π|n_μ|‖C_n‖ and ‖∂_μU(T′)‖ ≤ Σ_p τ_p ‖∂_μG_p‖
 * (evolution/momentum-lipschitz.ts gives the argument for the drive itself; the
 * loop's Magnus pieces weight H differently, so the bound is taken from them).
 */
export function loopLipschitz(series: GeneratorSeries[], plan: LoopPlan): [number, number] {
  const bound: [number, number] = [0, 0];
  const nn = (series[0]?.size ?? 0) ** 2;
  plan.pieces.forEach((piece, p) => {
    const sr = series[p];
    for (let q = 0; q < sr.n1.length; q++) {
      let f = 0;
      for (let e = 0; e < nn; e++) f += sr.re[q * nn + e] ** 2 + sr.im[q * nn + e] ** 2;
      const norm = Math.sqrt(f);
      bound[0] += piece.duration * 2 * Math.abs(sr.n1[q]) * norm;
      bound[1] += piece.duration * 2 * Math.abs(sr.n2[q]) * norm;
    }
  });
  return bound;
}

/**
 * G(s) and its momentum derivatives ∂G/∂s₁, ∂G/∂s₂ from the series, exactly:
 * each coefficient carries e^{−2πi s·n}, whose derivative along s_μ is −2πi n_μ times it.
 */
export function generatorGradientAt(series: GeneratorSeries, s1: number, s2: number, g: ComplexMatrix, d1: ComplexMatrix, d2: ComplexMatrix): void {
  const nn = series.size * series.size;
  for (const m of [g, d1, d2]) {
    m.re.fill(0);
    m.im.fill(0);
  }
  for (let q = 0; q < series.n1.length; q++) {
    const n1 = series.n1[q], n2 = series.n2[q];
    const arg = -2 * Math.PI * (s1 * n1 + s2 * n2);
    const c = Math.cos(arg), s = Math.sin(arg);
    const base = q * nn;
    const f1 = -2 * Math.PI * n1, f2 = -2 * Math.PI * n2;
    for (let e = 0; e < nn; e++) {
      const xr = series.re[base + e], xi = series.im[base + e];
      const yr = xr * c - xi * s, yi = xr * s + xi * c;
      g.re[e] += yr;
      g.im[e] += yi;
      // ∂(y e^{iarg}) = −2πi n y: (re, im) → (−im, re) times 2π n with the sign of f.
      d1.re[e] -= f1 * yi;
      d1.im[e] += f1 * yr;
      d2.re[e] -= f2 * yi;
      d2.im[e] += f2 * yr;
    }
  }
}

/**
 * U(s, T) as the product of the pieces' exponentials, from the series: the same
 * operator the winding integral closes its loop on.
 */
export function loopFloquetOperator(series: GeneratorSeries[], plan: LoopPlan, s1: number, s2: number): ComplexMatrix {
  const n = series[0]?.size ?? 0;
  const nn = n * n;
  const genRe = new Float64Array(nn), genIm = new Float64Array(nn);
  let u = identity(n);
  if (n === 2) {
    const next = zeros(2, 2);
    plan.pieces.forEach((piece, p) => {
      generatorAt(series[p], s1, s2, genRe, genIm, 0);
      propagateTwo(genRe, genIm, 0, piece.duration, u.re, u.im, 0, next.re, next.im, 0);
      u.re.set(next.re);
      u.im.set(next.im);
    });
    return u;
  }
  const gen = zeros(n, n);
  plan.pieces.forEach((piece, p) => {
    generatorAt(series[p], s1, s2, gen.re, gen.im, 0);
    u = multiply(expMinusIHt(gen, piece.duration), u);
  });
  return u;
}
