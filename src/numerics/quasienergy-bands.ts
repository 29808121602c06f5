/**
 * Quasienergy bands: eigenphases of the Floquet operator U(s, T) on grids of
 * reduced momenta, as quasienergies in units of π/T.
 *
 * Conventions (docs/conventions.md): U(s, T) has eigenvalues e^{−iεT}, so an
 * eigenphase φ (eigenvalue e^{iφ}, φ ∈ (−π, π]) is the quasienergy ε = −φ/T,
 * i.e. ε = −φ/π in units of π/T. Quasienergies live on a circle of
 * circumference 2 (in these units), reported in the window (−1, 1]; 1 is the
 * quasienergy π/T. Ordering is always relative to a cut (a quasienergy inside
 * a gap): "above the cut" means the counter-clockwise distance from the cut.
 *
 * `FloquetSampler` caches one eigen-decomposition per momentum so that the band
 * grid, the gap refinement and every Chern-number grid share work (doubling a
 * grid j/n → 2j/2n reproduces the same floating-point momenta exactly).
 */
import type { ComplexMatrix } from './linalg/complex-matrix.ts';
import type { LatticeDrive } from './evolution/drive.ts';
import { UnitaryEigen } from './linalg/unitary-eigen.ts';
import type { Propagation, PropagatorOptions } from './evolution/propagator.ts';
import { prepareFloquet } from './evolution/propagator.ts';

/** The Floquet spectrum at one momentum. */
export interface FloquetSample {
  /** Reduced momentum s (length = drive dimension). */
  momentum: number[];
  /** Quasienergies in units of π/T, in (−1, 1], ascending. */
  quasienergies: Float64Array;
  /** Eigenvectors of U(s, T) as columns, in the order of `quasienergies`. */
  vectors: ComplexMatrix;
  /** ‖UV − VΛ‖_F of the eigen-decomposition. */
  eigenResidual: number;
  /** Accuracy of the time integration in units of π/T: the propagator's bound on eigenphase changes (radians) divided by π. */
  propagatorAccuracy: number;
}

/** Wraps a quasienergy (units π/T) into the reporting window (−1, 1]. */
export function wrapQuasienergy(x: number): number {
  let y = x - 2 * Math.floor((x + 1) / 2);
  if (y <= -1) y += 2;
  return y;
}

/** Counter-clockwise distance from `cut` up to `x` on the quasienergy circle, in [0, 2). */
export function aboveCut(x: number, cut: number): number {
  const d = x - cut;
  return d - 2 * Math.floor(d / 2);
}

/** Signed shortest difference x − y on the circle, in (−1, 1]. */
export function circularDifference(x: number, y: number): number {
  return wrapQuasienergy(x - y);
}

/** Quasienergies (units π/T, window (−1, 1], ascending) from eigenphases φ of U(T). */
export function quasienergiesFromEigenphases(phases: Float64Array): { values: Float64Array; order: number[] } {
  const n = phases.length;
  const raw = new Float64Array(n);
  for (let i = 0; i < n; i++) raw[i] = wrapQuasienergy(-phases[i] / Math.PI);
  const order = new Array<number>(n);
  for (let i = 0; i < n; i++) order[i] = i;
  if (n <= 16) {
    // Insertion sort: stable, like Array.prototype.sort, and allocation-free for the few bands of a bulk model.
    for (let i = 1; i < n; i++) {
      const k = order[i], x = raw[k];
      let j = i - 1;
      while (j >= 0 && raw[order[j]] > x) {
        order[j + 1] = order[j];
        j--;
      }
      order[j + 1] = k;
    }
  } else order.sort((a, b) => raw[a] - raw[b]);
  const values = new Float64Array(n);
  for (let i = 0; i < n; i++) values[i] = raw[order[i]];
  return { values, order };
}

/**
 * Quasienergies ascending with the eigenvector columns permuted to match.
 * `vectors` is consumed: its arrays are reordered in place (two bands: one
 * comparison and at most one column swap, the common case on a 2D grid).
 */
function orderByQuasienergy(phases: Float64Array, vectors: ComplexMatrix): { values: Float64Array; vectors: ComplexMatrix } {
  const n = phases.length;
  if (n === 2) {
    const a = wrapQuasienergy(-phases[0] / Math.PI), b = wrapQuasienergy(-phases[1] / Math.PI);
    if (a <= b) return { values: Float64Array.of(a, b), vectors };
    const re = vectors.re, im = vectors.im;
    let t = re[0]; re[0] = re[1]; re[1] = t;
    t = re[2]; re[2] = re[3]; re[3] = t;
    t = im[0]; im[0] = im[1]; im[1] = t;
    t = im[2]; im[2] = im[3]; im[3] = t;
    return { values: Float64Array.of(b, a), vectors };
  }
  const { values, order } = quasienergiesFromEigenphases(phases);
  const out = { rows: n, cols: n, re: new Float64Array(n * n), im: new Float64Array(n * n) };
  const er = vectors.re, ei = vectors.im;
  for (let r = 0; r < n; r++) {
    const row = r * n;
    for (let c = 0; c < n; c++) {
      out.re[row + c] = er[row + order[c]];
      out.im[row + c] = ei[row + order[c]];
    }
  }
  return { values, vectors: out };
}

export interface SamplerOptions {
  propagator?: PropagatorOptions;
  /** Keep at most this many decompositions in the cache (default 1 << 16). */
  cacheLimit?: number;
}

/** Cache keyed by the momentum components as numbers (nested maps, one level per direction; 0 and −0 coincide). */
type MomentumCache = Map<number, MomentumCache | FloquetSample>;

export class FloquetSampler {
  readonly drive: LatticeDrive;
  private readonly options: SamplerOptions;
  private cache: MomentumCache = new Map();
  private cached = 0;
  private propagate: ((s: ArrayLike<number>) => Propagation) | undefined;
  /** Number of Floquet operators computed (cache misses). */
  evaluations = 0;
  /** Largest propagator accuracy estimate seen (units π/T). */
  worstPropagatorAccuracy = 0;
  /** Largest eigen-decomposition residual seen. */
  worstEigenResidual = 0;

  constructor(drive: LatticeDrive, options: SamplerOptions = {}) {
    this.drive = drive;
    this.options = options;
  }

  at(momentum: number[]): FloquetSample {
    const hit = this.lookup(momentum);
    if (hit !== undefined) return hit;
    // Compiled on first use (the drive is fixed for the sampler's lifetime, as for its cache).
    this.propagate ??= prepareFloquet(this.drive, this.options.propagator);
    const { operator, accuracy } = this.propagate(momentum);
    const eigen = new UnitaryEigen(operator);
    const { values, vectors } = orderByQuasienergy(eigen.phases, eigen.vectors);
    const sample: FloquetSample = {
      momentum: momentum.slice(),
      quasienergies: values,
      vectors,
      eigenResidual: eigen.residual,
      propagatorAccuracy: accuracy / Math.PI,
    };
    this.evaluations++;
    this.worstPropagatorAccuracy = Math.max(this.worstPropagatorAccuracy, sample.propagatorAccuracy);
    this.worstEigenResidual = Math.max(this.worstEigenResidual, eigen.residual);
    if (this.cached >= (this.options.cacheLimit ?? 1 << 16)) {
      this.cache = new Map();
      this.cached = 0;
    }
    this.store(momentum, sample);
    return sample;
  }

  private lookup(momentum: number[]): FloquetSample | undefined {
    if (momentum.length === 0) return this.cache.get(0) as FloquetSample | undefined;
    let level: MomentumCache | FloquetSample | undefined = this.cache;
    for (let d = 0; d < momentum.length; d++) {
      if (!(level instanceof Map)) return undefined;
      level = level.get(momentum[d]);
    }
    return level instanceof Map ? undefined : level;
  }

  private store(momentum: number[], sample: FloquetSample): void {
    if (momentum.length === 0) {
      this.cache.set(0, sample);
      this.cached++;
      return;
    }
    let level = this.cache;
    for (let d = 0; d + 1 < momentum.length; d++) {
      let next = level.get(momentum[d]) as MomentumCache | undefined;
      if (next === undefined) level.set(momentum[d], (next = new Map()));
      level = next;
    }
    level.set(momentum[momentum.length - 1], sample);
    this.cached++;
  }
}

/** A regular grid of reduced momenta s_i = j_i / n_i, j_i = 0 … n_i − 1, with row-major indexing. */
export interface QuasienergyGrid {
  grid: number[];
  samples: FloquetSample[];
}

/** Momentum of flat grid index `index` (last direction fastest). */
export function gridMomentum(grid: number[], index: number): number[] {
  const s = new Array<number>(grid.length);
  let rest = index;
  for (let d = grid.length - 1; d >= 0; d--) {
    const j = rest % grid[d];
    rest = (rest - j) / grid[d];
    s[d] = j / grid[d];
  }
  return s;
}

/** Flat index of the neighbour of `index` one step (`step` = ±1) along direction `d`, periodically. */
export function gridNeighbour(grid: number[], index: number, d: number, step: 1 | -1 = 1): number {
  let stride = 1;
  for (let e = grid.length - 1; e > d; e--) stride *= grid[e];
  const j = Math.floor(index / stride) % grid[d];
  const target = (j + step + grid[d]) % grid[d];
  return index + (target - j) * stride;
}

export function gridSize(grid: number[]): number {
  return grid.reduce((a, b) => a * b, 1);
}

export function sampleQuasienergyGrid(sampler: FloquetSampler, grid: number[]): QuasienergyGrid {
  if (grid.length !== sampler.drive.dimension) {
    throw new RangeError(`sampleQuasienergyGrid: a ${grid.length}-direction grid for a drive of dimension ${sampler.drive.dimension}`);
  }
  for (const n of grid) {
    if (!Number.isInteger(n) || n < 1) throw new RangeError(`sampleQuasienergyGrid: grid sizes must be positive integers, got [${grid.join(', ')}]`);
  }
  const samples: FloquetSample[] = [];
  const total = gridSize(grid);
  for (let i = 0; i < total; i++) samples.push(sampler.at(gridMomentum(grid, i)));
  return { grid: grid.slice(), samples };
}
