/**
 * Time evolution U(s, t) = 𝒯 exp(−i∫₀ᵗ H(s, t′) dt′) of a LatticeDrive at one momentum.
 *
 * Constant segments and kicks are exact (one exponential each). Segments with
 * harmonic modulation or a vector potential use the fourth-order commutator-free
 * Magnus integrator (magnus.ts), refined by slice doubling: the slice count of a
 * segment doubles until ‖U_2N − U_N‖₂ ≤ tolerance / (number of such segments).
 * For unitary matrices the spectral norm ‖U_2N − U_N‖₂ bounds the optimal
 * matching distance of the two spectra (Bhatia & Davis, Linear Multilinear
 * Algebra 15, 71 (1984)), hence the change of every eigenphase·(1 + O(δ²)). We
 * bound ‖D‖₂ from above by min(‖D‖_F, √(‖D‖₁‖D‖_∞)) (common practice): the
 * second stays local on ribbons, where ‖D‖_F grows with the width. The finer
 * result is kept, so the reported accuracy is conservative (the CF4 error of
 * U_2N is about 1/16 of the reported change).
 *
 * Sweeps over many momenta (prepareFloquet) do not redo the doubling at every
 * momentum: the slice counts are settled once per drive at a few probe momenta
 * where ‖H‖ is largest (the CF4 error grows with (h‖H‖)⁴, so these are the
 * hardest points) and reused everywhere. Each momentum still measures what it
 * achieved, ‖U_N − U_{N/2}‖_F, and doubles further on its own in the rare case
 * that this exceeds the tolerance.
 */
import type { ComplexMatrix } from '../linalg/complex-matrix.ts';
import { identity, multiply, zeros } from '../linalg/complex-matrix.ts';
import { expMinusIHt, expMinusIHtBlocks, prepareExponential } from '../linalg/exponential.ts';
import type { LatticeDrive } from './drive.ts';
import { angularFrequency, segmentStartTimes } from './drive.ts';
import type { ConstantDrive, PreparedBloch } from './bloch.ts';
import { compileConstantDrive, prepareBloch } from './bloch.ts';
import { cf4NodeTimes, magnusCF4AtNodes } from './magnus.ts';

export interface PropagatorOptions {
  /** Target accuracy of quasienergies·T (eigenphases), default 1e-10. */
  tolerance?: number;
  /** Largest number of Magnus slices per segment, default 4096. */
  maxSlices?: number;
  /**
   * Starting number of Magnus slices per period (a segment of duration τ starts
   * from ⌈startSlices·τ/T⌉, at least 2) before doubling; default from an
   * estimate of ‖H‖ (half a radian of phase per slice). Model files set it
   * with numerics.timeSlices.
   */
  startSlices?: number;
}

export interface Propagation {
  operator: ComplexMatrix;
  /** Estimated error: summed eigenphase-change bound ‖U_N − U_{N/2}‖₂ of the last slice doubling, radians (0 for exact piecewise-constant drives). */
  accuracy: number;
  /** Slices used per segment (1 for constant segments and kicks). */
  slices: number[];
  /** False when a segment reached maxSlices before meeting the tolerance. */
  converged: boolean;
  /** Why the result missed its tolerance, when it did. */
  caveat?: string;
}

export const DEFAULT_PROPAGATOR_TOLERANCE = 1e-10;
export const DEFAULT_MAX_SLICES = 4096;

interface SegmentPlan {
  slices: number;
  operator: ComplexMatrix;
  accuracy: number;
  converged: boolean;
}

/**
 * The eigenphase tolerance (radians) that the verdicts need, from the gap
 * tolerance (units π/T: a gap narrower than this counts as closed) and the
 * integer tolerance (accepted |x − round x| of an invariant):
 *     δ = π · gapTolerance · min(integerTolerance, 1/100).
 * Why: (i) every gap counted open is ≥ π·gapTolerance in eigenphase, so δ is at
 * most 1/100 of it and the open/closed decision and the sign of every
 * quasienergy relative to a cut are unchanged; the integrated loop of the gap
 * winding number then stays homotopic to the exact one (winding/time-loop.ts asks for
 * the same factor 100). (ii) Eigenvectors move by at most ‖δU‖/Δ (Davis–Kahan),
 * Δ ≥ π·gapTolerance the gap, so projector-built quantities (link variables,
 * winding densities, edge weights) move by at most a fraction integerTolerance
 * of themselves. Defaults gap 1e-3, integer 1e-3 give δ = π·10⁻⁶ (10⁻⁶ in units π/T).
 * Counts of edge or end states are not residual-tested integers, so only (i)
 * applies to open geometries: pass integerTolerance = 1/100 there.
 */
export function verdictPropagatorTolerance(gapTolerance: number, integerTolerance: number): number {
  if (!(gapTolerance > 0) || !(integerTolerance > 0)) {
    throw new RangeError(`verdictPropagatorTolerance: tolerances must be positive, got gap ${gapTolerance}, integer ${integerTolerance}`);
  }
  return Math.PI * gapTolerance * Math.min(integerTolerance, 0.01);
}

function checkOptions(options: PropagatorOptions): { tolerance: number; maxSlices: number; startSlices: number | undefined } {
  const tolerance = options.tolerance ?? DEFAULT_PROPAGATOR_TOLERANCE;
  const maxSlices = options.maxSlices ?? DEFAULT_MAX_SLICES;
  const startSlices = options.startSlices;
  if (!(tolerance > 0)) throw new RangeError(`floquetOperator: tolerance must be positive, got ${tolerance}`);
  if (!(Number.isInteger(maxSlices) && maxSlices >= 1)) throw new RangeError(`floquetOperator: maxSlices must be a positive integer, got ${maxSlices}`);
  if (startSlices !== undefined && !(Number.isInteger(startSlices) && startSlices >= 1)) {
    throw new RangeError(`floquetOperator: startSlices must be a positive integer, got ${startSlices}`);
  }
  return { tolerance, maxSlices, startSlices };
}

/** Largest frequency present in a segment (harmonics of modulations and vector potential), in absolute units. */
function segmentFrequency(drive: LatticeDrive, index: number): number {
  const seg = drive.segments[index];
  let h = 0;
  for (const term of seg.terms) if (term.modulation.kind === 'harmonic') for (const c of term.modulation.components) h = Math.max(h, Math.abs(c.harmonic));
  for (const c of seg.vectorPotential ?? []) h = Math.max(h, Math.abs(c.harmonic));
  return h * angularFrequency(drive);
}

/** An upper bound on ‖A − B‖₂: min(‖A − B‖_F, √(‖A − B‖₁‖A − B‖_∞)). */
export function spectralDistanceBound(a: ComplexMatrix, b: ComplexMatrix): number {
  const n = a.rows, m = a.cols;
  const colSums = new Float64Array(m);
  let rowMax = 0, frobenius = 0;
  for (let r = 0; r < n; r++) {
    let row = 0;
    for (let c = 0; c < m; c++) {
      const p = r * m + c;
      const dr = a.re[p] - b.re[p], di = a.im[p] - b.im[p];
      const sq = dr * dr + di * di;
      const abs = Math.sqrt(sq);
      frobenius += sq;
      row += abs;
      colSums[c] += abs;
    }
    rowMax = Math.max(rowMax, row);
  }
  const colMax = colSums.reduce((x, y) => Math.max(x, y), 0);
  return Math.min(Math.sqrt(frobenius), Math.sqrt(colMax * rowMax));
}

/** U over [t0, t1] of a time-dependent segment with `slices` CF4 steps, node factors cached per drive. */
export function magnusSegment(bloch: PreparedBloch, index: number, t0: number, t1: number, slices: number): ComplexMatrix {
  const sampler = bloch.tableSampler(index, `${t0}|${t1}|${slices}`, cf4NodeTimes(t0, t1, slices));
  return magnusCF4AtNodes(sampler, bloch.size, t0, t1, slices);
}

/**
 * A momentum-independent bound on ‖H(s, t)‖₂ over a segment: the largest
 * absolute row sum of H (which bounds the spectral norm of a Hermitian matrix),
 * with each term counted at |amplitude|·max|f| in the rows of both states it
 * couples. Row sums stay local: on a ribbon or open chain the bound is that of
 * one cell's neighbourhood, not the sum over the whole width. Starting every
 * momentum from the same slice count keeps the Magnus grids (and the cached
 * node tables) shared across a k grid.
 */
function segmentEnergyScale(drive: LatticeDrive, index: number): number {
  const rows = new Float64Array(drive.states.length);
  for (const term of drive.segments[index].terms) {
    const m = term.modulation;
    const fMax = m.kind === 'constant' ? 1 : Math.abs(m.mean) + m.components.reduce((sum, c) => sum + Math.abs(c.amplitude), 0);
    const size = Math.hypot(term.amplitude.re, term.amplitude.im) * fMax;
    const onsite = term.from === term.to && term.offset.every((x) => x === 0);
    rows[term.to] += size;
    if (!onsite) rows[term.from] += size;
  }
  return rows.reduce((a, b) => Math.max(a, b), 0);
}

/**
 * First slice count of a time-dependent segment: from startSlices (per period)
 * or two radians of phase per slice. Doubling compares this count with twice
 * it first, so a low start lets the smallest sufficient count be found.
 */
function startingSlices(drive: LatticeDrive, index: number, startSlices: number | undefined, maxSlices: number): number {
  const seg = drive.segments[index];
  const guess =
    startSlices !== undefined
      ? Math.ceil((startSlices * seg.duration) / drive.period)
      : Math.ceil((seg.duration * (segmentEnergyScale(drive, index) + segmentFrequency(drive, index))) / 2);
  return Math.min(maxSlices, Math.max(2, guess));
}

/**
 * Slice doubling of one time-dependent segment from `slices` (whose operator is
 * `coarse` when already known) until ‖U_2N − U_N‖_F ≤ tolerance; keeps the finer.
 */
function refineSegment(bloch: PreparedBloch, index: number, start: number, duration: number, slices: number, coarse: ComplexMatrix | undefined, tolerance: number, maxSlices: number): SegmentPlan {
  let current = coarse ?? magnusSegment(bloch, index, start, start + duration, slices);
  for (;;) {
    if (2 * slices > maxSlices) return { slices, operator: current, accuracy: Infinity, converged: false };
    const fine = magnusSegment(bloch, index, start, start + duration, 2 * slices);
    const change = spectralDistanceBound(fine, current);
    slices *= 2;
    if (change <= tolerance) return { slices, operator: fine, accuracy: change, converged: true };
    if (2 * slices > maxSlices) return { slices, operator: fine, accuracy: change, converged: false };
    current = fine;
  }
}

/** Refines the Magnus slice count of one time-dependent segment by doubling from a k-independent start. */
function planSegment(drive: LatticeDrive, bloch: PreparedBloch, index: number, start: number, tolerance: number, maxSlices: number, startSlices?: number): SegmentPlan {
  return refineSegment(bloch, index, start, drive.segments[index].duration, startingSlices(drive, index, startSlices, maxSlices), undefined, tolerance, maxSlices);
}

/**
 * U of a time-dependent segment with the slice count N of the drive's plan: the
 * achieved accuracy is measured at this momentum as ‖U_N − U_{N/2}‖_F, and only
 * if that misses the tolerance does doubling continue here.
 */
function plannedSegment(bloch: PreparedBloch, index: number, start: number, duration: number, slices: number, tolerance: number, maxSlices: number): SegmentPlan {
  const fine = magnusSegment(bloch, index, start, start + duration, slices);
  if (slices < 2) return refineSegment(bloch, index, start, duration, slices, fine, tolerance, maxSlices);
  const change = spectralDistanceBound(fine, magnusSegment(bloch, index, start, start + duration, slices / 2));
  if (change <= tolerance) return { slices, operator: fine, accuracy: change, converged: true };
  return refineSegment(bloch, index, start, duration, slices, fine, tolerance, maxSlices);
}

/** Momenta {0, 1/4, 1/2, 3/4}^dimension (eight points on a chain), the candidates for probing. */
function candidateMomenta(dimension: number): number[][] {
  const per = dimension === 1 ? 8 : 4;
  let out: number[][] = [[]];
  for (let d = 0; d < dimension; d++) out = out.flatMap((s) => Array.from({ length: per }, (_, j) => [...s, j / per]));
  return out;
}

/** Largest absolute row sum of H(s, t) at a few times in each time-dependent segment (a bound on ‖H‖₂). */
function sampledNorm(bloch: PreparedBloch, drive: LatticeDrive, timeDependent: number[], starts: number[]): number {
  const n = bloch.size, h = zeros(n, n);
  let best = 0;
  for (const i of timeDependent) {
    for (let j = 0; j < 8; j++) {
      bloch.segmentAt(i, starts[i] + ((j + 0.5) / 8) * drive.segments[i].duration, h);
      for (let r = 0; r < n; r++) {
        let sum = 0;
        for (let c = 0; c < n; c++) sum += Math.hypot(h.re[r * n + c], h.im[r * n + c]);
        best = Math.max(best, sum);
      }
    }
  }
  return best;
}

export interface MagnusSlicePlan {
  /** Slices per segment (1 for constant segments and kicks). */
  slices: number[];
  /** Momenta the counts were settled at. */
  probes: number[][];
  /** Largest summed ‖U_N − U_{N/2}‖_F over the probes. */
  accuracy: number;
  /** False when a segment reached maxSlices at a probe. */
  converged: boolean;
}

/** Number of probe momenta (those with the largest ‖H‖) at which the slice counts of a drive are settled. */
export const SLICE_PROBES = 3;

/**
 * Magnus slice counts for a whole drive, settled once: doubling at the
 * SLICE_PROBES candidate momenta with the largest ‖H(s, t)‖ (the CF4 error
 * grows with (h‖H‖)⁴), plus any `extraMomenta` the caller needs; each probe
 * starts from the counts the previous ones reached, so agreeing probes cost one
 * comparison each.
 */
export function magnusSlicePlan(drive: LatticeDrive, options: PropagatorOptions = {}, extraMomenta: number[][] = []): MagnusSlicePlan {
  const { tolerance, maxSlices, startSlices } = checkOptions(options);
  checkDurations(drive);
  const starts = segmentStartTimes(drive);
  const reference = prepareBloch(drive, new Array<number>(drive.dimension).fill(0));
  const timeDependent = drive.segments.map((seg, i) => (seg.duration > 0 && !reference.isConstant(i) ? i : -1)).filter((i) => i >= 0);
  const slices = drive.segments.map(() => 1);
  if (timeDependent.length === 0) return { slices, probes: [], accuracy: 0, converged: true };
  const ranked = candidateMomenta(drive.dimension)
    .map((s) => ({ s, norm: sampledNorm(prepareBloch(drive, s), drive, timeDependent, starts) }))
    .sort((a, b) => b.norm - a.norm)
    .slice(0, SLICE_PROBES)
    .map((c) => c.s);
  const probes = [...ranked, ...extraMomenta];
  const current = drive.segments.map((_, i) => (timeDependent.includes(i) ? startingSlices(drive, i, startSlices, maxSlices) : 1));
  let accuracy = 0, converged = true;
  for (const s of probes) {
    const bloch = prepareBloch(drive, s);
    let summed = 0;
    for (const i of timeDependent) {
      // Check the current count N against N/2 (refinement from N/2 compares exactly these two first).
      const from = slices[i] > 1 ? slices[i] / 2 : current[i];
      const p = refineSegment(bloch, i, starts[i], drive.segments[i].duration, from, undefined, tolerance / timeDependent.length, maxSlices);
      slices[i] = Math.max(slices[i], p.slices);
      summed += p.accuracy;
      converged &&= p.converged;
    }
    accuracy = Math.max(accuracy, summed);
  }
  return { slices, probes, accuracy, converged };
}

interface Plan {
  bloch: PreparedBloch;
  starts: number[];
  segments: SegmentPlan[];
}

/**
 * Per-segment operators at one momentum: exact for constant segments and kicks;
 * time-dependent segments either with the drive's planned slice counts
 * (`planned`, see magnusSlicePlan) or by doubling from the starting count.
 */
function plan(drive: LatticeDrive, s: ArrayLike<number>, options: PropagatorOptions, planned?: number[]): Plan {
  const { tolerance, maxSlices, startSlices } = checkOptions(options);
  const bloch = prepareBloch(drive, s);
  const n = bloch.size;
  checkDurations(drive);
  const starts = segmentStartTimes(drive);
  const timeDependent = drive.segments.filter((seg, i) => seg.duration > 0 && !bloch.isConstant(i)).length;
  const segments = drive.segments.map((seg, i): SegmentPlan => {
    if (seg.duration === 0) return { slices: 1, operator: expMinusIHt(bloch.segmentAt(i, starts[i], zeros(n, n)), 1), accuracy: 0, converged: true };
    if (bloch.isConstant(i)) return { slices: 1, operator: expMinusIHt(bloch.segmentAt(i, starts[i]), seg.duration), accuracy: 0, converged: true };
    if (planned !== undefined) return plannedSegment(bloch, i, starts[i], seg.duration, planned[i], tolerance / timeDependent, maxSlices);
    return planSegment(drive, bloch, i, starts[i], tolerance / timeDependent, maxSlices, startSlices);
  });
  return { bloch, starts, segments };
}

function describeFailure(drive: LatticeDrive, segments: SegmentPlan[], maxSlices: number): string | undefined {
  const failed = segments.map((p, i) => (p.converged ? -1 : i)).filter((i) => i >= 0);
  if (failed.length === 0) return undefined;
  const names = failed.map((i) => (drive.segments[i].label ? `${i} ("${drive.segments[i].label}")` : `${i}`)).join(', ');
  return `time integration did not reach the tolerance within ${maxSlices} slices in segment(s) ${names}; raise maxSlices or loosen the tolerance`;
}

/** U(s, T), the Floquet operator, with the accuracy and slice counts behind it. */
export function floquetOperator(drive: LatticeDrive, s: ArrayLike<number>, options: PropagatorOptions = {}): Propagation {
  return prepareFloquet(drive, options)(s);
}

/**
 * s ↦ U(s, T) for one drive, for sweeps over many momenta. A piecewise-constant
 * drive is compiled once (bloch.ts compileConstantDrive): per momentum only the
 * Bloch phases, one exponential per step on the step's fixed block structure and
 * the products remain, in preallocated work matrices (2×2 entirely in scalars).
 * Other drives settle their Magnus slice counts once (magnusSlicePlan) and reuse
 * them at every momentum, each momentum reporting the accuracy it achieved. The
 * drive must not change while the returned function is in use.
 */
export function prepareFloquet(drive: LatticeDrive, options: PropagatorOptions = {}): (s: ArrayLike<number>) => Propagation {
  checkOptions(options);
  const compiled = compileConstantDrive(drive);
  if (compiled === null) {
    const planned = magnusSlicePlan(drive, options).slices;
    return (s) => generalFloquet(drive, s, options, planned);
  }
  checkDurations(drive);
  return constantFloquet(compiled);
}

function checkDurations(drive: LatticeDrive): void {
  let t = 0;
  for (const seg of drive.segments) {
    if (!(seg.duration >= 0) || !Number.isFinite(seg.duration)) throw new RangeError(`floquetOperator: segment duration ${seg.duration} is not a non-negative number`);
    t += seg.duration;
  }
  if (Math.abs(t - drive.period) > 1e-9 * drive.period) {
    throw new RangeError(`floquetOperator: segment durations sum to ${t}, the period is ${drive.period}`);
  }
}

function checkMomentum(compiled: ConstantDrive, s: ArrayLike<number>): void {
  if (s.length !== compiled.dimension) {
    throw new RangeError(`blochHamiltonian: momentum has ${s.length} components, the lattice has dimension ${compiled.dimension}`);
  }
  for (let i = 0; i < s.length; i++) {
    if (!Number.isFinite(s[i])) throw new RangeError(`blochHamiltonian: momentum component ${i} is not finite (${s[i]})`);
  }
}

function constantFloquet(compiled: ConstantDrive): (s: ArrayLike<number>) => Propagation {
  const n = compiled.size, count = compiled.durations.length;
  const times = compiled.durations.map((d) => (d === 0 ? 1 : d));
  const slices = new Array<number>(count).fill(1);
  const h = zeros(n, n), e = zeros(n, n);
  if (n === 2) {
    return (s) => {
      checkMomentum(compiled, s);
      // u = e_last ⋯ e_1 accumulated in scalars, the same sums as multiply().
      let u00r = 1, u00i = 0, u01r = 0, u01i = 0, u10r = 0, u10i = 0, u11r = 1, u11i = 0;
      const er = e.re, ei = e.im;
      for (let i = 0; i < count; i++) {
        compiled.fill(i, s, h);
        expMinusIHtBlocks(h, compiled.blocks[i], times[i], e);
        const a00r = er[0] * u00r - ei[0] * u00i + (er[1] * u10r - ei[1] * u10i);
        const a00i = er[0] * u00i + ei[0] * u00r + (er[1] * u10i + ei[1] * u10r);
        const a01r = er[0] * u01r - ei[0] * u01i + (er[1] * u11r - ei[1] * u11i);
        const a01i = er[0] * u01i + ei[0] * u01r + (er[1] * u11i + ei[1] * u11r);
        const a10r = er[2] * u00r - ei[2] * u00i + (er[3] * u10r - ei[3] * u10i);
        const a10i = er[2] * u00i + ei[2] * u00r + (er[3] * u10i + ei[3] * u10r);
        const a11r = er[2] * u01r - ei[2] * u01i + (er[3] * u11r - ei[3] * u11i);
        const a11i = er[2] * u01i + ei[2] * u01r + (er[3] * u11i + ei[3] * u11r);
        u00r = a00r; u00i = a00i; u01r = a01r; u01i = a01i; u10r = a10r; u10i = a10i; u11r = a11r; u11i = a11i;
      }
      const operator = { rows: 2, cols: 2, re: Float64Array.of(u00r, u01r, u10r, u11r), im: Float64Array.of(u00i, u01i, u10i, u11i) };
      return { operator, accuracy: 0, slices: slices.slice(), converged: true };
    };
  }
  return (s) => {
    checkMomentum(compiled, s);
    let u = identity(n), spare = zeros(n, n);
    for (let i = 0; i < count; i++) {
      compiled.fill(i, s, h);
      expMinusIHtBlocks(h, compiled.blocks[i], times[i], e);
      const next = multiply(e, u, spare);
      spare = u;
      u = next;
    }
    return { operator: u, accuracy: 0, slices: slices.slice(), converged: true };
  };
}

function generalFloquet(drive: LatticeDrive, s: ArrayLike<number>, options: PropagatorOptions, planned?: number[]): Propagation {
  const p = plan(drive, s, options, planned);
  const n = p.bloch.size;
  let u = identity(n);
  let accuracy = 0;
  for (const seg of p.segments) {
    u = multiply(seg.operator, u);
    accuracy += seg.accuracy;
  }
  const converged = p.segments.every((seg) => seg.converged);
  const result: Propagation = { operator: u, accuracy, slices: p.segments.map((seg) => seg.slices), converged };
  const caveat = describeFailure(drive, p.segments, checkOptions(options).maxSlices);
  if (caveat !== undefined) result.caveat = caveat;
  return result;
}

/**
 * U(s, t) for each t in `times` (non-decreasing, within [0, T]); right-continuous at
 * kicks: a time equal to a kick's time includes that kick. Time-dependent segments
 * are integrated with the slice density found for the whole segment.
 */
export function evolutionOperators(drive: LatticeDrive, s: ArrayLike<number>, times: number[], options: PropagatorOptions = {}): ComplexMatrix[] {
  for (let r = 0; r < times.length; r++) {
    const t = times[r];
    if (!(t >= 0 && t <= drive.period * (1 + 1e-12))) throw new RangeError(`evolutionOperators: times[${r}] = ${t} is outside the period [0, ${drive.period}]`);
    if (r > 0 && t < times[r - 1]) throw new RangeError(`evolutionOperators: times must be non-decreasing (times[${r - 1}] = ${times[r - 1]} > times[${r}] = ${t})`);
  }
  const p = plan(drive, s, options);
  const out: ComplexMatrix[] = [];
  let u = identity(p.bloch.size);
  let r = 0;
  for (let i = 0; i < drive.segments.length; i++) {
    const seg = drive.segments[i];
    if (seg.duration === 0) {
      // Times before the kick were emitted by the preceding segments; times at it come after it.
      u = multiply(p.segments[i].operator, u);
      continue;
    }
    const a = p.starts[i], b = a + seg.duration;
    const step = p.bloch.isConstant(i) ? constantStepper(p.bloch.segmentAt(i, a)) : magnusStepper(p.bloch, i, seg.duration, p.segments[i].slices);
    let tc = a;
    for (; r < times.length && times[r] < b; r++) {
      const t = times[r];
      if (t > tc) {
        u = multiply(step(tc, t), u);
        tc = t;
      }
      out.push(u);
    }
    u = multiply(tc === a ? p.segments[i].operator : step(tc, b), u);
  }
  for (; r < times.length; r++) out.push(u);
  return out;
}

function constantStepper(h: ComplexMatrix): (t0: number, t1: number) => ComplexMatrix {
  const exp = prepareExponential(h);
  return (t0, t1) => exp(t1 - t0);
}

function magnusStepper(bloch: PreparedBloch, index: number, duration: number, slices: number): (t0: number, t1: number) => ComplexMatrix {
  return (t0, t1) => magnusSegment(bloch, index, t0, t1, Math.max(1, Math.ceil((slices * (t1 - t0)) / duration)));
}
