/**
 * Chern number of a group of Floquet bands by the lattice field strength of
 * Fukui, Hatsugai and Suzuki, J. Phys. Soc. Jpn. 74, 1674 (2005).
 *
 * On an n × n grid of reduced momenta the link variables are
 *     U_μ(k) = det Ψ(k)† Ψ(k + ê_μ) / |det …|,
 * Ψ(k) the N × m matrix whose columns are the group's eigenvectors at k. The
 * determinant makes U_μ independent of the basis chosen inside the group, so
 * degenerate or touching branches inside the group are handled. The plaquette
 * flux F(k) = arg[U₁(k) U₂(k+ê₁) U₁(k+ê₂)* U₂(k)*] is taken in (−π, π], and
 *     C = (1/2π) Σ_k F(k).
 * Each link phase enters two plaquettes with opposite signs, so the sum is an
 * integer up to rounding on every grid; it equals the continuum Chern number
 *     C = (1/2πi) ∫ d²s Tr P [∂₁P, ∂₂P]
 * once every plaquette flux is well below π in modulus. We therefore double the
 * grid until the integer is the same on two successive grids and the largest
 * |F| is below a threshold (default π/3), and report grid, history and flux.
 *
 * The periodic (cell) gauge of drive.ts makes U(s + e_i, T) = U(s, T), so the
 * links that wrap around the torus use the same eigenvectors: no extra phase.
 *
 * Orientation: the lattice sum is taken in reduced momenta (s₁, s₂) and then
 * multiplied by sign det(a₁, a₂), so C is the Cartesian (physical) Chern number
 * and a left-handed choice of lattice vectors gives the same C.
 */
import type { ComplexMatrix } from '../linalg/complex-matrix.ts';
import type { RefinementStep } from '../certificates.ts';
import type { ChernEstimate } from '../portrait.ts';
import { integerEstimate } from '../certificates.ts';
import { LuDecomposition } from '../linalg/lu.ts';
import type { FloquetSampler } from '../quasienergy-bands.ts';
import { groupColumns } from './gaps.ts';
import { formatNumber } from '../number-format.ts';

export type { ChernEstimate };

/** FHS is exact when every |F| < π; we ask for a margin. */
export const DEFAULT_FLUX_THRESHOLD = Math.PI / 3;
/** Overlap determinants smaller than this mean the grid cannot follow the band group. */
export const MINIMAL_LINK_MODULUS = 1e-8;

export interface ChernOptions {
  /** First grid, n × n (default 8). */
  initialGrid?: number;
  /** Largest grid tried (default 128). */
  maxGrid?: number;
  /** Largest accepted plaquette flux |F| (default π/3). */
  fluxThreshold?: number;
  /** Accepted distance of the lattice sum from an integer (default 1e-6). */
  tolerance?: number;
}


/** sign det(a₁, a₂) over the first two Cartesian components: +1 for a right-handed basis. */
export function latticeOrientation(drive: { latticeVectors: number[][] }): 1 | -1 {
  const [a1, a2] = drive.latticeVectors;
  const det = (a1?.[0] ?? 0) * (a2?.[1] ?? 0) - (a1?.[1] ?? 0) * (a2?.[0] ?? 0);
  if (!(Math.abs(det) > 0)) {
    throw new RangeError(`latticeOrientation: lattice vectors (${a1?.join(', ')}) and (${a2?.join(', ')}) are parallel or not finite`);
  }
  return det > 0 ? 1 : -1;
}

/** Columns `cols` of `v` as an N × m matrix. */
export function selectColumns(v: ComplexMatrix, cols: number[]): ComplexMatrix {
  const n = v.rows, m = cols.length;
  const out = { rows: n, cols: m, re: new Float64Array(n * m), im: new Float64Array(n * m) };
  for (let r = 0; r < n; r++) {
    for (let c = 0; c < m; c++) {
      out.re[r * m + c] = v.re[r * v.cols + cols[c]];
      out.im[r * m + c] = v.im[r * v.cols + cols[c]];
    }
  }
  return out;
}

/** det(A† B) into out[0] (re), out[1] (im); one and two columns without allocation. */
function overlapDeterminantInto(a: ComplexMatrix, b: ComplexMatrix, out: Float64Array): void {
  const n = a.rows, m = a.cols;
  const ar = a.re, ai = a.im, br = b.re, bi = b.im;
  if (m === 1) {
    let re = 0, im = 0;
    for (let r = 0; r < n; r++) {
      const xr = ar[r], xi = -ai[r], yr = br[r], yi = bi[r];
      re += xr * yr - xi * yi;
      im += xr * yi + xi * yr;
    }
    out[0] = re;
    out[1] = im;
    return;
  }
  if (m === 2) {
    // O = A†B entry by entry, then det O = O₀₀O₁₁ − O₀₁O₁₀.
    let o00r = 0, o00i = 0, o01r = 0, o01i = 0, o10r = 0, o10i = 0, o11r = 0, o11i = 0;
    for (let r = 0; r < n; r++) {
      const p = 2 * r;
      const x0r = ar[p], x0i = -ai[p], x1r = ar[p + 1], x1i = -ai[p + 1];
      const y0r = br[p], y0i = bi[p], y1r = br[p + 1], y1i = bi[p + 1];
      o00r += x0r * y0r - x0i * y0i; o00i += x0r * y0i + x0i * y0r;
      o01r += x0r * y1r - x0i * y1i; o01i += x0r * y1i + x0i * y1r;
      o10r += x1r * y0r - x1i * y0i; o10i += x1r * y0i + x1i * y0r;
      o11r += x1r * y1r - x1i * y1i; o11i += x1r * y1i + x1i * y1r;
    }
    out[0] = o00r * o11r - o00i * o11i - (o01r * o10r - o01i * o10i);
    out[1] = o00r * o11i + o00i * o11r - (o01r * o10i + o01i * o10r);
    return;
  }
  const o = { rows: m, cols: m, re: new Float64Array(m * m), im: new Float64Array(m * m) };
  for (let i = 0; i < m; i++) {
    for (let j = 0; j < m; j++) {
      let re = 0, im = 0;
      for (let r = 0; r < n; r++) {
        const xr = ar[r * m + i], xi = -ai[r * m + i];
        const yr = br[r * m + j], yi = bi[r * m + j];
        re += xr * yr - xi * yi;
        im += xr * yi + xi * yr;
      }
      o.re[i * m + j] = re;
      o.im[i * m + j] = im;
    }
  }
  const det = new LuDecomposition(o).determinant;
  out[0] = det.re;
  out[1] = det.im;
}

function wrapAngle(x: number): number {
  let y = x - 2 * Math.PI * Math.floor((x + Math.PI) / (2 * Math.PI));
  if (y <= -Math.PI) y += 2 * Math.PI;
  return y;
}

export interface FieldStrength {
  /** (1/2π) Σ F. */
  raw: number;
  maxFlux: number;
  minimalLinkModulus: number;
}

/**
 * FHS lattice sum on an n1 × n2 grid; `frames[i1 * n2 + i2]` is Ψ at s = (i1/n1, i2/n2).
 */
export function fhsFieldStrength(frames: ComplexMatrix[], n1: number, n2: number): FieldStrength {
  const theta1 = new Float64Array(n1 * n2);
  const theta2 = new Float64Array(n1 * n2);
  const link = new Float64Array(2);
  let minimalLinkModulus = Infinity;
  for (let i1 = 0; i1 < n1; i1++) {
    const row = i1 * n2, nextRow = ((i1 + 1) % n1) * n2;
    for (let i2 = 0; i2 < n2; i2++) {
      const here = frames[row + i2];
      overlapDeterminantInto(here, frames[nextRow + i2], link);
      const r1 = link[0], m1 = link[1];
      overlapDeterminantInto(here, frames[row + ((i2 + 1) % n2)], link);
      const r2 = link[0], m2 = link[1];
      theta1[row + i2] = Math.atan2(m1, r1);
      theta2[row + i2] = Math.atan2(m2, r2);
      minimalLinkModulus = Math.min(minimalLinkModulus, Math.hypot(r1, m1), Math.hypot(r2, m2));
    }
  }
  let sum = 0, maxFlux = 0;
  for (let i1 = 0; i1 < n1; i1++) {
    const row = i1 * n2, nextRow = ((i1 + 1) % n1) * n2;
    for (let i2 = 0; i2 < n2; i2++) {
      const next2 = (i2 + 1) % n2;
      const f = wrapAngle(theta1[row + i2] + theta2[nextRow + i2] - theta1[row + next2] - theta2[row + i2]);
      sum += f;
      maxFlux = Math.max(maxFlux, Math.abs(f));
    }
  }
  return { raw: sum / (2 * Math.PI), maxFlux, minimalLinkModulus };
}

/**
 * Chern number of the branches lying between gap labels `lower` and `upper`
 * (counter-clockwise, units π/T; both null for the whole spectrum), refined
 * by grid doubling. `branches` is the expected number of branches in the group.
 */
export function chernNumber(
  sampler: FloquetSampler,
  lower: number | null,
  upper: number | null,
  branches: number,
  options: ChernOptions = {},
): ChernEstimate {
  if (sampler.drive.dimension !== 2) {
    throw new RangeError(`chernNumber: needs a drive with two periodic directions, got dimension ${sampler.drive.dimension}`);
  }
  const orientation = latticeOrientation(sampler.drive);
  const threshold = options.fluxThreshold ?? DEFAULT_FLUX_THRESHOLD;
  const tolerance = options.tolerance ?? 1e-6;
  const maxGrid = options.maxGrid ?? 128;
  let n = Math.max(2, options.initialGrid ?? 8);
  const history: RefinementStep[] = [];
  let previous: number | undefined;
  for (;;) {
    const frames: ComplexMatrix[] = [];
    let mismatch: number[] | undefined;
    for (let i1 = 0; i1 < n && mismatch === undefined; i1++) {
      for (let i2 = 0; i2 < n; i2++) {
        const s = [i1 / n, i2 / n];
        const sample = sampler.at(s);
        const cols = groupColumns(sample.quasienergies, lower, upper);
        if (cols.length !== branches) {
          mismatch = s;
          break;
        }
        frames.push(selectColumns(sample.vectors, cols));
      }
    }
    if (mismatch !== undefined) {
      const caveat =
        `on the ${n}×${n} grid the group has a different number of branches at s = (${mismatch.map((x) => x.toFixed(4)).join(', ')}) ` +
        `than expected (${branches}): a bounding gap closes between band-grid points`;
      const last = history.length > 0 ? history[history.length - 1].value : NaN;
      return { ...integerEstimate(last, tolerance, [n, n], history, false, caveat), maxPlaquetteFlux: NaN, fluxThreshold: threshold, minimalLinkModulus: NaN };
    }
    const field = fhsFieldStrength(frames, n, n);
    field.raw *= orientation;
    history.push({ grid: [n, n], value: field.raw });
    const stable = previous !== undefined && Math.round(previous) === Math.round(field.raw);
    const fluxOk = field.maxFlux < threshold && field.minimalLinkModulus > MINIMAL_LINK_MODULUS;
    const done = stable && fluxOk;
    if (done || 2 * n > maxGrid) {
      let caveat: string | undefined;
      if (!done) {
        // One grid only: the starting grid is already past the refinement limit, so nothing could change "between grids".
        const single = history.length === 1;
        const why: string[] = [];
        if (!stable) why.push(single ? `the starting grid is at or above the refinement limit ${maxGrid}×${maxGrid}, so there is no second grid to compare with` : 'the integer changed between the last two grids');
        if (field.maxFlux >= threshold) why.push(`the largest plaquette flux ${formatNumber(field.maxFlux)} is not below ${formatNumber(threshold)}`);
        if (field.minimalLinkModulus <= MINIMAL_LINK_MODULUS) why.push('an overlap determinant between neighbouring momenta vanishes');
        const nearlyClosed = field.maxFlux >= threshold || field.minimalLinkModulus <= MINIMAL_LINK_MODULUS || !single;
        caveat = `${single ? `computed on the single grid ${n}×${n}` : `not converged at the largest grid ${n}×${n}`}: ${why.join('; ')}${nearlyClosed ? ' (a gap may be nearly closed)' : ''}`;
      }
      return {
        ...integerEstimate(field.raw, tolerance, [n, n], history, stable && fluxOk, caveat),
        maxPlaquetteFlux: field.maxFlux,
        fluxThreshold: threshold,
        minimalLinkModulus: field.minimalLinkModulus,
      };
    }
    previous = field.raw;
    n *= 2;
  }
}
