/**
 * Bulk quasienergy gaps of a chain at 0 and at π/T.
 *
 * For the gap named by c (0 or 1, units π/T) and each momentum k, let
 * d₊(k) be the counter-clockwise distance from c up to the nearest
 * eigenphase and d₋(k) the distance down to the nearest one. Then
 *  - the direct gap at k is d₊(k) + d₋(k), the distance between the two
 *    eigenphases that bound c; its minimum over k (and where it occurs) is the
 *    minimal direct gap;
 *  - the free arc around c is (c − min_k d₋, c + min_k d₊), of width the
 *    indirect gap;
 *  - the clearance min_k min(d₊, d₋) is the distance from c to the bulk
 *    spectrum; the gap counts as open while it exceeds the tolerance.
 * With chiral or particle–hole symmetry the spectrum is symmetric about c and
 * the direct gap is twice the clearance; without, they differ (a uniform
 * onsite shift moves the clearance but not the direct gap).
 *
 * Each minimum is located on a uniform k grid and polished by Brent's method
 * (golden section with parabolic steps; R. P. Brent, Algorithms for
 * Minimization without Derivatives (1973), ch. 5; common practice) on the
 * bracket of the two neighbouring grid points, since a closing gap first
 * shows between grid points. The direct gap is polished at its two lowest
 * grid minima.
 *
 * The grid only proposes candidates. Whether the gap is open is decided on a
 * certified lower bound of the minimal direct gap over the whole zone
 * (certified-minimum.ts, with the Lipschitz bound of quasienergies in momentum
 * from evolution/momentum-lipschitz.ts; the clearance, which must stay
 * positive for the direct gap to be continuous, guards the bound), reported
 * with the evaluations it took.
 *
 * The group velocity max |dε/dk| (quasienergy bands sorted upward from the cut
 * in the larger gap) gives the decay-length estimate ξ ≈ v/clearance (cells)
 * used to size open chains.
 */
import type { ComplexMatrix } from '../linalg/complex-matrix.ts';
import type { LatticeDrive } from '../evolution/drive.ts';
import type { PropagatorOptions } from '../evolution/propagator.ts';
import type { Propagation } from '../evolution/propagator.ts';
import { floquetOperator, prepareFloquet } from '../evolution/propagator.ts';
import { UnitaryEigen } from '../linalg/unitary-eigen.ts';
import type { ChainGapReport } from '../portrait.ts';
import { certifiedMinimum } from '../certified-minimum.ts';
import { quasienergyLipschitz } from '../evolution/momentum-lipschitz.ts';

/** A chain's gap at 0 or π/T: the record the chain portrait carries (fields documented in portrait.ts). */
export type ChainGap = ChainGapReport;

/** Eigenphases φ ∈ (−π, π] of U(s, T) and the propagator's accuracy bound. */
export interface PhaseSample {
  phases: Float64Array;
  accuracy: number;
}

export interface BulkGapOptions {
  /** Uniform k points (default 128). */
  points?: number;
  /** Clearance below this counts as closed (units π/T, default 1e-6). */
  gapTolerance?: number;
  propagator?: PropagatorOptions;
  /** Shared Floquet operators (see floquetCache); a private cache is made when absent. */
  cache?: FloquetCache;
  /** Gap tolerance (units π/T) the certified lower bound of the minimal direct gap is decided against (default 1e-3). */
  certifyAbove?: number;
  /** Most Floquet operators the certified lower bound may evaluate per gap (default 20000). */
  certificationBudget?: number;
}

export interface BulkGaps {
  gaps: [ChainGap, ChainGap];
  /** Max |dε/dk| over the grid (units π/T per radian of k). */
  velocity: number;
  grid: number;
  /** Largest accuracy estimate reported by the propagator. */
  propagatorAccuracy: number;
  /** Momenta at which U(k, T) was evaluated (grid and refinement). */
  evaluations: number;
}

/**
 * U(s, T) and its eigenphases memoised per reduced momentum (taken modulo 1,
 * which the periodic Bloch gauge allows), so that the gap scan, its
 * refinement and the det-winding check share Floquet operators.
 */
export class FloquetCache {
  private readonly operators = new Map<number, { operator: ComplexMatrix; accuracy: number }>();
  private readonly spectra = new Map<number, PhaseSample>();
  private propagate: ((s: ArrayLike<number>) => Propagation) | undefined;
  /** Floquet operators computed (cache misses). */
  evaluations = 0;

  constructor(readonly drive: LatticeDrive, readonly propagator?: PropagatorOptions) {}

  operator(s: number): { operator: ComplexMatrix; accuracy: number } {
    const key = s - Math.floor(s);
    let hit = this.operators.get(key);
    if (hit === undefined) {
      this.propagate ??= prepareFloquet(this.drive, this.propagator);
      const p = this.propagate([key]);
      hit = { operator: p.operator, accuracy: p.accuracy };
      this.operators.set(key, hit);
      this.evaluations++;
    }
    return hit;
  }

  phases(s: number): PhaseSample {
    const key = s - Math.floor(s);
    let hit = this.spectra.get(key);
    if (hit === undefined) {
      const { operator, accuracy } = this.operator(key);
      hit = { phases: operator.rows === 2 ? twoBandPhases(operator) : new UnitaryEigen(operator).phases, accuracy };
      this.spectra.set(key, hit);
    }
    return hit;
  }
}

/**
 * Eigenphases of a 2×2 unitary in closed form: with e^{2iα} = det U, M = e^{−iα}U lies in
 * SU(2), M = cos β + i sin β n̂·σ, and the eigenphases are α ± β. β is taken as
 * atan2(|sin β n̂|, cos β) from the components of M directly, so it stays accurate to
 * rounding near β = 0 and β = π, where the two eigenphases (nearly) meet: exactly where
 * gap minima are measured. (The choice of α modulo π only swaps the two phases mod 2π.)
 */
export function twoBandPhases(u: ComplexMatrix): Float64Array {
  const r = u.re, i = u.im;
  const detRe = r[0] * r[3] - i[0] * i[3] - (r[1] * r[2] - i[1] * i[2]);
  const detIm = r[0] * i[3] + i[0] * r[3] - (r[1] * i[2] + i[1] * r[2]);
  const alpha = 0.5 * Math.atan2(detIm, detRe);
  const cr = Math.cos(alpha), ci = -Math.sin(alpha);
  // M = e^{−iα}U; a = (M₀₀ + conj M₁₁)/2 = cos β + i sin β n_z, b = (M₀₁ − conj M₁₀)/2 = sin β (n_y + i n_x).
  const m = (p: number) => [cr * r[p] - ci * i[p], cr * i[p] + ci * r[p]];
  const [m00r, m00i] = m(0), [m01r, m01i] = m(1), [m10r, m10i] = m(2), [m11r, m11i] = m(3);
  const aRe = 0.5 * (m00r + m11r), aIm = 0.5 * (m00i - m11i);
  const bRe = 0.5 * (m01r - m10r), bIm = 0.5 * (m01i + m10i);
  const beta = Math.atan2(Math.sqrt(aIm * aIm + bRe * bRe + bIm * bIm), aRe);
  const fold = (x: number) => x - 2 * Math.PI * Math.ceil((x - Math.PI) / (2 * Math.PI)); // into (−π, π]
  return Float64Array.of(fold(alpha - beta), fold(alpha + beta));
}

/** Quasienergy (units π/T) of eigenphase φ. */
const quasienergy = (phi: number): number => -phi / Math.PI;
/** Counter-clockwise distance from c up to x on the quasienergy circle (circumference 2), in [0, 2). */
const upFrom = (x: number, c: number): number => {
  const d = x - c;
  return d - 2 * Math.floor(d / 2);
};

/** d₊ and d₋: distances (units π/T) from `label` up and down to the nearest eigenphase. */
export function boundingDistances(phases: Float64Array, label: number): { above: number; below: number } {
  let above = Infinity, below = Infinity;
  for (const phi of phases) {
    const e = quasienergy(phi);
    const up = upFrom(e, label);
    above = Math.min(above, up);
    below = Math.min(below, up === 0 ? 0 : 2 - up);
  }
  return { above, below };
}

/**
 * Brent's minimisation of f on [a, b] to an absolute tolerance `tol` in x
 * (golden-section steps with parabolic interpolation; Brent 1973, ch. 5).
 */
export function brentMinimum(f: (x: number) => number, a: number, b: number, tol: number, maxIterations = 100): { x: number; value: number } {
  const golden = (3 - Math.sqrt(5)) / 2;
  let x = a + golden * (b - a), w = x, v = x;
  let fx = f(x), fw = fx, fv = fx;
  let d = 0, e = 0;
  for (let it = 0; it < maxIterations; it++) {
    const mid = 0.5 * (a + b);
    const tol2 = 2 * tol;
    if (Math.abs(x - mid) <= tol2 - 0.5 * (b - a)) break;
    let parabolic = false;
    if (Math.abs(e) > tol) {
      const r = (x - w) * (fx - fv);
      let q = (x - v) * (fx - fw);
      let p = (x - v) * q - (x - w) * r;
      q = 2 * (q - r);
      if (q > 0) p = -p;
      q = Math.abs(q);
      if (Math.abs(p) < Math.abs(0.5 * q * e) && p > q * (a - x) && p < q * (b - x)) {
        e = d;
        d = p / q;
        const u = x + d;
        if (u - a < tol2 || b - u < tol2) d = mid >= x ? tol : -tol;
        parabolic = true;
      }
    }
    if (!parabolic) {
      e = x >= mid ? a - x : b - x;
      d = golden * e;
    }
    const u = Math.abs(d) >= tol ? x + d : x + (d >= 0 ? tol : -tol);
    const fu = f(u);
    if (fu <= fx) {
      if (u >= x) a = x;
      else b = x;
      v = w; fv = fw;
      w = x; fw = fx;
      x = u; fx = fu;
    } else {
      if (u < x) a = u;
      else b = u;
      if (fu <= fw || w === x) {
        v = w; fv = fw;
        w = u; fw = fu;
      } else if (fu <= fv || v === x || v === w) {
        v = u; fv = fu;
      }
    }
  }
  return { x, value: fx };
}

/** Absolute tolerance (reduced momentum) of the Brent polish. */
const MOMENTUM_TOLERANCE = 1e-10;

/** Improvement (units π/T) a polished minimum needs over the grid value to replace it. */
const ROUNDING_MARGIN = 1e-13;

/** Indices of the local minima of a periodic sequence, lowest value first (a plateau gives its first point). */
function localMinima(values: number[]): number[] {
  const n = values.length;
  const out: number[] = [];
  for (let j = 0; j < n; j++) {
    const prev = values[(j - 1 + n) % n], next = values[(j + 1) % n];
    if (values[j] < prev && values[j] <= next) out.push(j);
  }
  if (out.length === 0) out.push(values.indexOf(Math.min(...values)));
  return out.sort((a, b) => values[a] - values[b]);
}

/** The smallest of f over the grid minima `starts`, each polished on the bracket of its grid neighbours. */
function polishedMinimum(f: (s: number) => number, grid: number[], n: number, starts: number[]): { s: number; value: number } {
  let best = { s: 0, value: Infinity };
  for (const j of starts) {
    if (grid[j] < best.value) best = { s: j / n, value: grid[j] };
    const r = brentMinimum(f, (j - 1) / n, (j + 1) / n, MOMENTUM_TOLERANCE);
    // A polished point must beat the grid by more than rounding (a minimum on a grid point stays there).
    if (r.value < best.value - ROUNDING_MARGIN) best = { s: r.x, value: r.value };
  }
  return { s: best.s - Math.floor(best.s), value: best.value };
}

const wrapLabel = (x: number): number => {
  let y = x - 2 * Math.floor((x + 1) / 2);
  if (y <= -1) y += 2;
  return y;
};

export function bulkGaps(drive: LatticeDrive, options: BulkGapOptions = {}): BulkGaps {
  const n = options.points ?? 128;
  const tol = options.gapTolerance ?? 1e-6;
  const cache = options.cache ?? new FloquetCache(drive, options.propagator);
  const before = cache.evaluations;
  let accuracy = 0;
  const at = (s: number): Float64Array => {
    const r = cache.phases(s);
    accuracy = Math.max(accuracy, r.accuracy);
    return r.phases;
  };
  const samples = Array.from({ length: n }, (_, j) => at(j / n));
  const slope = quasienergyLipschitz(drive)[0];
  const clearanceOf = (p: Float64Array, label: 0 | 1): number => {
    const d = boundingDistances(p, label);
    return Math.min(d.above, d.below);
  };
  // Bands sorted upward from the cut in the larger gap; velocity from neighbouring differences.
  const bigger: 0 | 1 = Math.min(...samples.map((p) => clearanceOf(p, 0))) >= Math.min(...samples.map((p) => clearanceOf(p, 1))) ? 0 : 1;
  const sorted = samples.map((p) => Array.from(p, (phi) => upFrom(quasienergy(phi), bigger)).sort((a, b) => a - b));
  let velocity = 0;
  const dk = (2 * Math.PI) / n;
  for (let j = 0; j < n; j++) {
    const a = sorted[j], b = sorted[(j + 1) % n];
    for (let m = 0; m < a.length; m++) velocity = Math.max(velocity, Math.abs(b[m] - a[m]) / dk);
  }
  const gap = (label: 0 | 1): ChainGap => {
    const above = (s: number) => boundingDistances(at(s), label).above;
    const below = (s: number) => boundingDistances(at(s), label).below;
    const direct = (s: number) => above(s) + below(s);
    const gridAbove = samples.map((p) => boundingDistances(p, label).above);
    const gridBelow = samples.map((p) => boundingDistances(p, label).below);
    const gridDirect = gridAbove.map((x, j) => x + gridBelow[j]);
    const up = polishedMinimum(above, gridAbove, n, localMinima(gridAbove).slice(0, 1));
    const down = polishedMinimum(below, gridBelow, n, localMinima(gridBelow).slice(0, 1));
    const clearance = Math.min(up.value, down.value);
    const clearanceMomentum = up.value <= down.value ? up.s : down.s;
    const dg = clearance > tol ? polishedMinimum(direct, gridDirect, n, localMinima(gridDirect).slice(0, 2)) : { s: clearanceMomentum, value: 2 * clearance };
    const guard = (s: number) => {
      const d = boundingDistances(at(s), label);
      return Math.min(d.above, d.below);
    };
    const bound = certifiedMinimum({
      evaluate: (s) => ({ value: direct(s[0]), guard: guard(s[0]) }),
      lipschitz: [2 * slope],
      guardLipschitz: [slope],
      grid: [n],
      initial: gridDirect.map((value, j) => ({ value, guard: Math.min(gridAbove[j], gridBelow[j]) })),
      decisionLevel: Math.max(options.certifyAbove ?? 1e-3, tol),
      relative: 0.5,
      budget: options.certificationBudget ?? 20000,
      margin: (2 * accuracy) / Math.PI + 1e-12,
      knownBest: { value: dg.value, at: [dg.s] },
    });
    const open = clearance > tol && bound.status === 'above';
    return {
      label,
      minimalGap: dg.value,
      momentumAtMinimum: dg.s,
      lower: wrapLabel(label - down.value),
      upper: wrapLabel(label + up.value),
      arcWidth: up.value + down.value,
      clearance,
      clearanceMomentum,
      open,
      decayLengthEstimate: open ? Math.max(velocity, clearance) / clearance : Infinity,
      certified: {
        lower: Math.max(bound.lower, 0),
        status: bound.status,
        evaluations: bound.evaluations,
        cells: bound.cells,
        lipschitz: [2 * slope],
        margin: (2 * accuracy) / Math.PI + 1e-12,
        decisionLevel: Math.max(options.certifyAbove ?? 1e-3, tol),
      },
    };
  };
  const gaps: [ChainGap, ChainGap] = [gap(0), gap(1)];
  return { gaps, velocity, grid: n, propagatorAccuracy: accuracy, evaluations: cache.evaluations - before };
}
