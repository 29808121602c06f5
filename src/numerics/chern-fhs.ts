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
import type { ComplexMatrix } from './linalg/complex-matrix.ts';
import type { RefinementStep } from './certificates.ts';
import type { ChernEstimate } from './portrait.ts';
import { integerEstimate } from './certificates.ts';
import { LuDecomposition } from './linalg/lu.ts';
import type { FloquetSampler } from './quasienergy-bands.ts';
import { groupColumns } from './gaps.ts';

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

/** det(A† B) for N × m frames A, B, as [re, im]. */
export function overlapDeterminant(a: ComplexMatrix, b: ComplexMatrix): [number, number] {
  const n = a.rows, m = a.cols;
  const o = { rows: m, cols: m, re: new Float64Array(m * m), im: new Float64Array(m * m) };
  for (let i = 0; i < m; i++) {
    for (let j = 0; j < m; j++) {
      let re = 0, im = 0;
      for (let r = 0; r < n; r++) {
        const ar = a.re[r * m + i], ai = -a.im[r * m + i];
        const br = b.re[r * m + j], bi = b.im[r * m + j];
        re += ar * br - ai * bi;
        im += ar * bi + ai * br;
      }
      o.re[i * m + j] = re;
      o.im[i * m + j] = im;
    }
  }
  if (m === 1) return [o.re[0], o.im[0]];
  const det = new LuDecomposition(o).determinant;
  return [det.re, det.im];
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
  const index = (i1: number, i2: number): number => (((i1 % n1) + n1) % n1) * n2 + (((i2 % n2) + n2) % n2);
  const theta1 = new Float64Array(n1 * n2);
  const theta2 = new Float64Array(n1 * n2);
  let minimalLinkModulus = Infinity;
  for (let i1 = 0; i1 < n1; i1++) {
    for (let i2 = 0; i2 < n2; i2++) {
      const here = frames[index(i1, i2)];
      const [r1, m1] = overlapDeterminant(here, frames[index(i1 + 1, i2)]);
      const [r2, m2] = overlapDeterminant(here, frames[index(i1, i2 + 1)]);
      theta1[index(i1, i2)] = Math.atan2(m1, r1);
      theta2[index(i1, i2)] = Math.atan2(m2, r2);
      minimalLinkModulus = Math.min(minimalLinkModulus, Math.hypot(r1, m1), Math.hypot(r2, m2));
    }
  }
  let sum = 0, maxFlux = 0;
  for (let i1 = 0; i1 < n1; i1++) {
    for (let i2 = 0; i2 < n2; i2++) {
      const f = wrapAngle(theta1[index(i1, i2)] + theta2[index(i1 + 1, i2)] - theta1[index(i1, i2 + 1)] - theta2[index(i1, i2)]);
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
        const why: string[] = [];
        if (!stable) why.push('the integer changed between the last two grids');
        if (field.maxFlux >= threshold) why.push(`the largest plaquette flux ${field.maxFlux.toFixed(3)} is not below ${threshold.toFixed(3)}`);
        if (field.minimalLinkModulus <= MINIMAL_LINK_MODULUS) why.push('an overlap determinant between neighbouring momenta vanishes');
        caveat = `not converged at the largest grid ${n}×${n}: ${why.join('; ')} (a gap may be nearly closed)`;
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
