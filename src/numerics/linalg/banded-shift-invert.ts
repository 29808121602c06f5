/**
 * The eigenpairs of a band matrix near one point of its spectrum, without the
 * rest: block shift-and-invert subspace iteration with Rayleigh–Ritz (Saad,
 * Numerical Methods for Large Eigenvalue Problems, 2nd ed. (2011), §5.1 and
 * §4.3; the shift-invert transformation of §4.1). Two settings share it: a
 * unitary U (a Floquet operator; states on an arc of the unit circle around
 * e^{iφ₀}) and a Hermitian H (a static ribbon Hamiltonian; states in an
 * energy interval).
 *
 * (A − σ)⁻¹ has the eigenvectors of A with eigenvalues 1/(λ − σ): the states
 * closest to σ dominate. One banded LU of A − σ (banded-lu.ts, partial
 * pivoting, O(n b²)) serves every iteration; each iteration solves for a block
 * of p vectors (O(n b p)), re-orthonormalises it (modified Gram–Schmidt,
 * twice) and extracts Ritz pairs from the p×p matrix Q†AQ (unitary-eigen.ts or
 * hermitian-eigen.ts). A block starts from the vectors of a nearby problem
 * (the previous momentum) when given, filled up with seeded random vectors.
 *
 * How many states lie in the window is known beforehand, exactly, from an
 * inertia count (unitary-window-count.ts). The block holds that many vectors
 * and GUARD more (the next states outward, whose distance sets the
 * convergence rate |d_in/d_out| per iteration). The iteration stops when that
 * many Ritz values lie in the window with residuals below the tolerance (with
 * a start block from a nearby momentum, after one or two iterations). When
 * that is slow (states of the window close to the next ones outward), after
 * POLISH_AFTER iterations the Ritz values with residuals below
 * COARSE_TOLERANCE are polished one by one by inverse iteration with their own
 * value as the shift
 * (banded-inverse-iteration.ts; close ones re-orthogonalised together and
 * re-diagonalised through V_g†AV_g), which converges in one or two solves. The
 * result stands when the polished states are as many as the count, all in the
 * window, each with ‖Az − λz‖ ≤ tolerance: agreement of the two routes is the
 * certificate that no state in the window was missed. A is normal, so a
 * residual r places an eigenvalue within r of the Ritz value, and eigenvectors
 * of eigenvalues δ apart are accurate to r/δ.
 */
import type { ComplexMatrix } from './complex-matrix.ts';
import { zeros } from './complex-matrix.ts';
import { BandedLu } from './banded-lu.ts';
import { innerProductInto, projectOut, rowNorm } from './complex-rows.ts';
import type { BandedMatrix } from './banded-matrix.ts';
import { UnitaryEigen } from './unitary-eigen.ts';
import { HermitianEigen } from './hermitian-eigen.ts';
import { eigenvaluesInInterval, eigenvaluesOnArc } from './unitary-window-count.ts';
import { bandedInverseIteration, CLUSTER_SEPARATION } from './banded-inverse-iteration.ts';
import { multiplyBandedDense, rediagonaliseGroup } from './banded-unitary-eigen.ts';

/** Vectors kept beyond the states on the arc. */
export const GUARD = 3;
export const DEFAULT_ARC_TOLERANCE = 1e-10;
/** Ritz residual below which a state is handed to inverse iteration with its own shift. */
const COARSE_TOLERANCE = 1e-4;
/** Iterations of the plain block iteration before states are polished one by one. */
const POLISH_AFTER = 4;
const MAX_ITERATIONS = 200;

export interface ArcOptions {
  /** Largest accepted residual ‖Uz − θz‖ of a state on the arc (default 1e-10). */
  tolerance?: number;
  /** Columns of a start block (n × k), e.g. the states found at a nearby momentum. */
  start?: ComplexMatrix;
  /** Seed of the random start vectors. */
  seed?: number;
  /** Give up (crowded = true) when the window holds more states than this (default: no limit). */
  maxCount?: number;
}

export interface ArcEigenpairs {
  /** Eigenphases (radians, in (−π, π]) of the states on the arc, ordered by φ − φ₀ ascending (energies, ascending, for eigenpairsInInterval). */
  phases: Float64Array;
  /** Unit eigenvectors as columns (n × count), in the order of `phases`. */
  vectors: ComplexMatrix;
  /** ‖Uz − e^{iφ}z‖ per state. */
  residuals: Float64Array;
  /** Number of states on the arc by the inertia count (= phases.length when `converged`). */
  count: number;
  converged: boolean;
  iterations: number;
  /** Why the search did not converge, when it did not. */
  caveat?: string;
  /** True when the window held more than maxCount states and was not searched. */
  crowded?: boolean;
}

function fold(x: number): number {
  let p = x - 2 * Math.PI * Math.round(x / (2 * Math.PI));
  if (p <= -Math.PI) p += 2 * Math.PI;
  return p;
}

/** What distinguishes the unitary and the Hermitian setting. */
interface Setting {
  hermitian: boolean;
  /** The shift σ of the factorisation. */
  shiftRe: number;
  shiftIm: number;
  /** Exact number of eigenvalues in the window, or null when the count cannot be trusted. */
  count(): number | null;
  /** Eigenvalues (as coordinates: phases or energies) and eigenvectors (columns) of the projected p×p matrix. */
  ritz(m: ComplexMatrix): { values: Float64Array; vectors: ComplexMatrix };
  /** Eigenvalue (re, im) of a coordinate, for residuals and shifts. */
  value(x: number): [number, number];
  /** Coordinate of the Rayleigh quotient v†Av = (re, im) of a unit vector. */
  coordinate(re: number, im: number): number;
  /** Signed position of a coordinate relative to the centre (for ordering) and whether it lies in the window. */
  offset(x: number): number;
  inside(x: number): boolean;
}

/** Every eigenpair of the unitary band matrix `u` with |φ − centre| < halfWidth (radians). */
export function eigenpairsOnArc(u: BandedMatrix, centre: number, halfWidth: number, options: ArcOptions = {}): ArcEigenpairs {
  const chord = 2 * Math.sin(halfWidth / 2);
  return eigenpairsNear(u, {
    hermitian: false,
    shiftRe: Math.cos(centre),
    shiftIm: Math.sin(centre),
    count: () => eigenvaluesOnArc(u, centre, halfWidth),
    ritz: (m) => {
      const e = new UnitaryEigen(m, { unitarityTolerance: Infinity });
      return { values: e.phases, vectors: e.vectors };
    },
    value: (x) => [Math.cos(x), Math.sin(x)],
    coordinate: (re, im) => Math.atan2(im, re),
    offset: (x) => fold(x - centre),
    inside: (x) => 2 * Math.abs(Math.sin(0.5 * fold(x - centre))) < chord,
  }, options);
}

/** Every eigenpair of the Hermitian band matrix `h` with lower < E < upper. */
export function eigenpairsInInterval(h: BandedMatrix, lower: number, upper: number, options: ArcOptions = {}): ArcEigenpairs {
  const centre = 0.5 * (lower + upper);
  return eigenpairsNear(h, {
    hermitian: true,
    shiftRe: centre,
    shiftIm: 0,
    count: () => eigenvaluesInInterval(h, lower, upper),
    ritz: (m) => {
      const e = new HermitianEigen(m, { hermiticityTolerance: Infinity });
      return { values: e.values, vectors: e.vectors };
    },
    value: (x) => [x, 0],
    coordinate: (re) => re,
    offset: (x) => x - centre,
    inside: (x) => x > lower && x < upper,
  }, options);
}

function eigenpairsNear(u: BandedMatrix, setting: Setting, options: ArcOptions): ArcEigenpairs {
  const n = u.n;
  const tolerance = options.tolerance ?? DEFAULT_ARC_TOLERANCE;
  const counted = setting.count();
  const count = counted ?? 0;
  const empty = (converged: boolean, iterations: number, caveat?: string): ArcEigenpairs => ({
    phases: new Float64Array(0), vectors: zeros(n, 0), residuals: new Float64Array(0), count, converged, iterations, ...(caveat ? { caveat } : {}),
  });
  if (counted === null) return empty(false, 0, 'the inertia counts of the window disagree (an eigenvalue sits on every Cayley cut tried)');
  if (count === 0) return empty(true, 0);
  if (options.maxCount !== undefined && count > options.maxCount) return { ...empty(false, 0, `the window holds ${count} states, more than the ${options.maxCount} expected near a gap label`), crowded: true };
  const p = Math.min(n, count + GUARD);
  const lu = new BandedLu(n, u.b).factorBanded(u, 1, 0, -setting.shiftRe, -setting.shiftIm, 2 ** -52);
  // Block, column j stored contiguously at j·n.
  const qr = new Float64Array(p * n), qi = new Float64Array(p * n);
  let seed = (options.seed ?? 0x9e3779b9) >>> 0;
  const random = () => {
    seed = (Math.imul(seed, 1103515245) + 12345) >>> 0;
    return seed / 4294967296 - 0.5;
  };
  const fillRandom = (j: number) => {
    for (let r = 0; r < n; r++) {
      qr[j * n + r] = random();
      qi[j * n + r] = random();
    }
  };
  const start = options.start;
  for (let j = 0; j < p; j++) {
    if (start !== undefined && j < start.cols && start.rows === n) {
      for (let r = 0; r < n; r++) {
        qr[j * n + r] = start.re[r * start.cols + j];
        qi[j * n + r] = start.im[r * start.cols + j];
      }
    } else fillRandom(j);
  }
  orthonormalise(qr, qi, n, p, fillRandom);
  const xr = new Float64Array(n), xi = new Float64Array(n);
  const ur = new Float64Array(p * n), ui = new Float64Array(p * n);
  const yr = new Float64Array(n), yi = new Float64Array(n);
  for (let iteration = 1; iteration <= MAX_ITERATIONS; iteration++) {
    for (let j = 0; j < p; j++) {
      xr.set(qr.subarray(j * n, j * n + n));
      xi.set(qi.subarray(j * n, j * n + n));
      lu.solveInPlace(xr, xi);
      qr.set(xr, j * n);
      qi.set(xi, j * n);
    }
    orthonormalise(qr, qi, n, p, fillRandom);
    // Rayleigh–Ritz: M = Q†AQ.
    for (let j = 0; j < p; j++) {
      u.apply(qr.subarray(j * n, j * n + n), qi.subarray(j * n, j * n + n), yr, yi);
      ur.set(yr, j * n);
      ui.set(yi, j * n);
    }
    const m = zeros(p, p);
    const entry = new Float64Array(2);
    for (let a = 0; a < p; a++) {
      for (let c = 0; c < p; c++) {
        innerProductInto(entry, qr, qi, a * n, ur, ui, c * n, n);
        m.re[a * p + c] = entry[0];
        m.im[a * p + c] = entry[1];
      }
    }
    const eig = setting.ritz(m);
    // Ritz vectors z = Qy (and Az = AQy) of the values in the window, with residuals ‖Az − λz‖.
    const ritz: { x: number; residual: number; zr: Float64Array; zi: Float64Array }[] = [];
    for (let k = 0; k < p; k++) {
      const x = eig.values[k];
      if (!setting.inside(x)) continue;
      const [cr, ci] = setting.value(x);
      const zr = new Float64Array(n), zi = new Float64Array(n);
      let s = 0;
      for (let r = 0; r < n; r++) {
        let ar = 0, ai = 0, wr = 0, wi = 0;
        for (let c = 0; c < p; c++) {
          const vr = eig.vectors.re[c * p + k], vi = eig.vectors.im[c * p + k];
          const q1 = qr[c * n + r], q2 = qi[c * n + r], u1 = ur[c * n + r], u2 = ui[c * n + r];
          ar += q1 * vr - q2 * vi;
          ai += q1 * vi + q2 * vr;
          wr += u1 * vr - u2 * vi;
          wi += u1 * vi + u2 * vr;
        }
        zr[r] = ar;
        zi[r] = ai;
        const dr = wr - (ar * cr - ai * ci), di = wi - (ar * ci + ai * cr);
        s += dr * dr + di * di;
      }
      ritz.push({ x, residual: Math.sqrt(s), zr, zi });
    }
    const converged = ritz.filter((z) => z.residual <= tolerance);
    if (converged.length === count) {
      converged.sort((a, b) => setting.offset(a.x) - setting.offset(b.x));
      const vectors = zeros(n, count);
      converged.forEach((z, c) => {
        for (let r = 0; r < n; r++) {
          vectors.re[r * count + c] = z.zr[r];
          vectors.im[r * count + c] = z.zi[r];
        }
      });
      return { phases: Float64Array.from(converged, (z) => z.x), vectors, residuals: Float64Array.from(converged, (z) => z.residual), count, converged: true, iterations: iteration };
    }
    // Slow convergence (states of the window close to the next ones outward): polish each by inverse iteration.
    const coarse = ritz.filter((z) => z.residual <= COARSE_TOLERANCE).map((z) => z.x);
    if (iteration >= POLISH_AFTER && coarse.length >= count) {
      const polished = polish(u, coarse, setting);
      if (polished.phases.length === count && polished.residuals.every((r) => r <= tolerance)) return { ...polished, count, converged: true, iterations: iteration };
    }
  }
  return empty(false, MAX_ITERATIONS, `shift-invert did not find the ${count} states of the window in ${MAX_ITERATIONS} iterations`);
}

/**
 * Inverse iteration at each approximate eigenvalue, then the states kept in
 * the window, ordered by their offset from the centre, with Rayleigh values
 * and residuals.
 */
function polish(u: BandedMatrix, approximate: number[], setting: Setting): { phases: Float64Array; vectors: ComplexMatrix; residuals: Float64Array } {
  const n = u.n, m = approximate.length;
  const order = Array.from({ length: m }, (_, j) => j).sort((a, b) => setting.offset(approximate[a]) - setting.offset(approximate[b]));
  const shifts = approximate.map((x) => setting.value(x));
  const v = bandedInverseIteration({ banded: u }, Float64Array.from(shifts, (z) => z[0]), Float64Array.from(shifts, (z) => z[1]), order);
  const uv = multiplyBandedDense(u, v);
  // Close shifts were re-orthogonalised together: diagonalise A inside their span.
  let group: number[] = [];
  const flush = () => {
    if (group.length > 1) rediagonaliseGroup(v, uv, group, setting.hermitian);
    group = [];
  };
  for (let k = 0; k < m; k++) {
    const j = order[k], i = order[k - 1];
    if (k > 0 && Math.hypot(shifts[j][0] - shifts[i][0], shifts[j][1] - shifts[i][1]) >= CLUSTER_SEPARATION) flush();
    group.push(j);
  }
  flush();
  const states: { x: number; residual: number; column: number }[] = [];
  for (let j = 0; j < m; j++) {
    let sr = 0, si = 0, q = 0;
    for (let r = 0; r < n; r++) {
      const p = r * m + j;
      sr += v.re[p] * uv.re[p] + v.im[p] * uv.im[p];
      si += v.re[p] * uv.im[p] - v.im[p] * uv.re[p];
      q += v.re[p] * v.re[p] + v.im[p] * v.im[p];
    }
    const x = setting.coordinate(sr / q, si / q);
    const [cr, ci] = setting.value(x);
    let s = 0;
    for (let r = 0; r < n; r++) {
      const p = r * m + j;
      const dr = uv.re[p] - (v.re[p] * cr - v.im[p] * ci), di = uv.im[p] - (v.re[p] * ci + v.im[p] * cr);
      s += dr * dr + di * di;
    }
    if (setting.inside(x)) states.push({ x, residual: Math.sqrt(s / q), column: j });
  }
  states.sort((a, b) => setting.offset(a.x) - setting.offset(b.x));
  const k = states.length;
  const vectors = zeros(n, k);
  states.forEach((z, c) => {
    for (let r = 0; r < n; r++) {
      vectors.re[r * k + c] = v.re[r * m + z.column];
      vectors.im[r * k + c] = v.im[r * m + z.column];
    }
  });
  return { phases: Float64Array.from(states, (z) => z.x), vectors, residuals: Float64Array.from(states, (z) => z.residual) };
}

/** Modified Gram–Schmidt, twice, on the p columns (stored contiguously); a column that collapses is replaced by a random one. */
function orthonormalise(qr: Float64Array, qi: Float64Array, n: number, p: number, refill: (j: number) => void): void {
  for (let j = 0; j < p; j++) {
    for (let attempt = 0; attempt < 3; attempt++) {
      const before = rowNorm(qr, qi, j * n, n);
      for (let pass = 0; pass < 2; pass++) {
        for (let i = 0; i < j; i++) projectOut(qr, qi, i * n, qr, qi, j * n, n);
      }
      const after = rowNorm(qr, qi, j * n, n);
      if (after > 1e-8 * before && after > 0) {
        const inv = 1 / after;
        for (let r = 0; r < n; r++) {
          qr[j * n + r] *= inv;
          qi[j * n + r] *= inv;
        }
        break;
      }
      refill(j);
    }
  }
}
