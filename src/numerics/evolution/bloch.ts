/**
 * Bloch Hamiltonians H(s, t) of a LatticeDrive, following the conventions of
 * drive.ts exactly: a term (a → b, offset n) contributes
 *     amplitude · f(t) · e^{i q A(t)·d} · e^{−2πi s·n}   at element (b, a)
 * plus the Hermitian conjugate at (a, b); an onsite term (a = b, n = 0) adds
 * amplitude · f(t) once. d = Σ nᵢaᵢ + r_b − r_a is the Cartesian hop vector and
 * q the charge of the hopping particle: the mean of the two states' charges
 * (equal to both for an ordinary hop; 0 for a particle–hole pairing term, whose
 * phase does not depend on the hop vector in this gauge).
 *
 * prepareBloch evaluates the momentum phases e^{−2πi s·n} once, so that time
 * stepping only multiplies by the time-dependent factors f(t) and e^{iqA(t)·d}.
 */
import type { ComplexMatrix } from '../linalg/complex-matrix.ts';
import { zeros } from '../linalg/complex-matrix.ts';
import type { DriveSegment, LatticeDrive, Modulation, VectorPotentialComponent } from './drive.ts';
import { angularFrequency, segmentStartTimes } from './drive.ts';
import { ComponentFinder } from '../linalg/connected-components.ts';
import type { BandedMatrix } from '../linalg/banded-matrix.ts';

interface CompiledTerm {
  from: number;
  to: number;
  onsite: boolean;
  /** amplitude · e^{−2πi s·n} */
  cRe: number;
  cIm: number;
  /** q·d, the hop vector times the charge (Cartesian). */
  qd: Float64Array;
  modulation: Modulation;
}

interface CompiledSegment {
  start: number;
  duration: number;
  terms: CompiledTerm[];
  potential: VectorPotentialComponent[];
  constant: boolean;
  /** Cached matrix of a constant segment. */
  fixed: ComplexMatrix | null;
}

export interface PreparedBloch {
  /** Number of basis states n (H is n×n). */
  readonly size: number;
  /** H(s, t) for t in [0, T] (the segment containing t; at a boundary, the later segment). */
  at(t: number): ComplexMatrix;
  /** True when the segment's matrix does not depend on time (no harmonic modulation, no vector potential). */
  isConstant(segmentIndex: number): boolean;
  /** H of segment `segmentIndex` evaluated at time t (absolute), written into `out` when given. */
  segmentAt(segmentIndex: number, t: number, out?: ComplexMatrix): ComplexMatrix;
  /** As segmentAt, into band storage of bandwidth at least driveBandwidth(drive). */
  segmentAtBanded(segmentIndex: number, t: number, out: BandedMatrix): BandedMatrix;
  /** Index of the segment of positive duration containing t. */
  segmentIndexAt(t: number): number;
  /**
   * Sampler over a fixed list of times in segment `segmentIndex`: node j gives H at
   * times[j]. The momentum-independent factors are computed once per drive and
   * `tableKey` (same key ⇒ same times), so a k grid pays for them once.
   */
  tableSampler(segmentIndex: number, tableKey: string, times: ArrayLike<number>): (node: number, out: ComplexMatrix) => ComplexMatrix;
}

function describeSegment(drive: LatticeDrive, i: number): string {
  const label = drive.segments[i].label;
  return label ? `segment ${i} ("${label}")` : `segment ${i}`;
}

function modulationIsConstant(m: Modulation): boolean {
  return m.kind === 'constant' || m.components.every((c) => c.amplitude === 0 || c.harmonic === 0);
}

function modulationValue(m: Modulation, omega: number, t: number): number {
  if (m.kind === 'constant') return 1;
  let f = m.mean;
  for (const c of m.components) f += c.amplitude * Math.cos(c.harmonic * omega * t + c.phase);
  return f;
}

function compileSegment(drive: LatticeDrive, index: number, segment: DriveSegment, start: number, s: ArrayLike<number>): CompiledSegment {
  const n = drive.states.length;
  const where = describeSegment(drive, index);
  const terms: CompiledTerm[] = segment.terms.map((term, j) => {
    if (!(term.from >= 0 && term.from < n && term.to >= 0 && term.to < n)) {
      throw new RangeError(`blochHamiltonian: ${where}, term ${j}: state index out of range (from ${term.from}, to ${term.to}; the model has ${n} states)`);
    }
    if (term.offset.length !== drive.dimension) {
      throw new RangeError(`blochHamiltonian: ${where}, term ${j}: offset has ${term.offset.length} entries, the lattice has dimension ${drive.dimension}`);
    }
    const onsite = term.from === term.to && term.offset.every((x) => x === 0);
    if (onsite && term.amplitude.im !== 0) {
      throw new RangeError(`blochHamiltonian: ${where}, term ${j}: an onsite amplitude must be real (imaginary part ${term.amplitude.im})`);
    }
    let arg = 0;
    for (let i = 0; i < drive.dimension; i++) arg -= 2 * Math.PI * s[i] * term.offset[i];
    const cr = Math.cos(arg), ci = Math.sin(arg);
    const q = 0.5 * (drive.states[term.from].charge + drive.states[term.to].charge);
    const qd = new Float64Array(drive.spaceDimension);
    for (let c = 0; c < drive.spaceDimension; c++) {
      let d = drive.states[term.to].position[c] - drive.states[term.from].position[c];
      for (let i = 0; i < drive.dimension; i++) d += term.offset[i] * drive.latticeVectors[i][c];
      qd[c] = q * d;
    }
    return {
      from: term.from,
      to: term.to,
      onsite,
      cRe: term.amplitude.re * cr - term.amplitude.im * ci,
      cIm: term.amplitude.re * ci + term.amplitude.im * cr,
      qd,
      modulation: term.modulation,
    };
  });
  const potential = (segment.vectorPotential ?? []).filter((c) => c.amplitude.some((x) => x !== 0));
  const constant = potential.every((c) => c.harmonic === 0) && terms.every((t) => modulationIsConstant(t.modulation));
  return { start, duration: segment.duration, terms, potential, constant, fixed: null };
}

/**
 * The time-dependent factor g(t) = f(t)·e^{iqA(t)·d} of every term of a segment,
 * interleaved [re₀, im₀, re₁, im₁, …]. It does not depend on the momentum, so a k
 * grid evaluated at the same Magnus nodes reuses it: node tables are cached per
 * drive object (drives are treated as immutable once compiled).
 */
function computeTimeFactors(seg: CompiledSegment, omega: number, t: number): Float64Array {
  const g = new Float64Array(2 * seg.terms.length);
  const dims = seg.potential.length > 0 ? seg.potential[0].amplitude.length : 0;
  const a = new Float64Array(dims);
  for (const c of seg.potential) {
    const w = Math.cos(c.harmonic * omega * t + c.phase);
    for (let k = 0; k < dims; k++) a[k] += c.amplitude[k] * w;
  }
  seg.terms.forEach((term, j) => {
    const f = modulationValue(term.modulation, omega, t);
    if (term.onsite || dims === 0) {
      g[2 * j] = f;
      return;
    }
    let phase = 0;
    for (let k = 0; k < dims; k++) phase += a[k] * term.qd[k];
    g[2 * j] = f * Math.cos(phase);
    g[2 * j + 1] = f * Math.sin(phase);
  });
  return g;
}

const tableCache = new WeakMap<LatticeDrive, Map<string, Float64Array[]>>();
/** Bound on cached node tables per drive (a full cache is dropped, not grown). */
const MAX_CACHED_TABLES = 256;

/** Time factors at each of `times` for segment `index`, cached per drive under `key`. */
function timeFactorTable(drive: LatticeDrive, key: string, seg: CompiledSegment, omega: number, times: ArrayLike<number>): Float64Array[] {
  let perDrive = tableCache.get(drive);
  if (perDrive === undefined || perDrive.size >= MAX_CACHED_TABLES) tableCache.set(drive, (perDrive = new Map()));
  let table = perDrive.get(key);
  if (table === undefined) {
    table = Array.from(times, (t) => computeTimeFactors(seg, omega, t));
    perDrive.set(key, table);
  }
  return table;
}

/**
 * Adds one term (g·c)|to⟩⟨from| + h.c. to a Bloch matrix held in (re, im), g the
 * time factor and c the momentum-dressed amplitude; p is the position of entry
 * (to, from) and q that of (from, to). An onsite term (p = q on the diagonal)
 * adds Re(g·c) once (drive.ts conventions). Dense and band storage both write
 * through here.
 */
function addTerm(re: Float64Array, im: Float64Array, p: number, q: number, onsite: boolean, gr: number, gi: number, cRe: number, cIm: number): void {
  if (onsite) {
    re[p] += gr * cRe;
    return;
  }
  const hr = gr * cRe - gi * cIm, hi = gr * cIm + gi * cRe;
  re[p] += hr;
  im[p] += hi;
  re[q] += hr;
  im[q] -= hi;
}

function fillSegment(seg: CompiledSegment, g: Float64Array, out: ComplexMatrix): ComplexMatrix {
  const n = out.rows;
  out.re.fill(0);
  out.im.fill(0);
  const terms = seg.terms;
  for (let j = 0; j < terms.length; j++) {
    const term = terms[j];
    addTerm(out.re, out.im, term.to * n + term.from, term.from * n + term.to, term.onsite, g[2 * j], g[2 * j + 1], term.cRe, term.cIm);
  }
  return out;
}

/** As fillSegment, into band storage (the bandwidth must hold every term, see driveBandwidth). */
function fillSegmentBanded(seg: CompiledSegment, g: Float64Array, out: BandedMatrix): BandedMatrix {
  out.re.fill(0);
  out.im.fill(0);
  const terms = seg.terms;
  for (let j = 0; j < terms.length; j++) {
    const term = terms[j];
    addTerm(out.re, out.im, out.index(term.to, term.from), out.index(term.from, term.to), term.onsite, g[2 * j], g[2 * j + 1], term.cRe, term.cIm);
  }
  return out;
}

/**
 * Largest |to − from| over the terms of every segment: the half-bandwidth of
 * every H(s, t) of the drive. For a ribbon or open chain built by truncateDrive
 * (states numbered cell by cell) it is a few cells' worth of states, whatever the width.
 */
export function driveBandwidth(drive: LatticeDrive): number {
  let b = 0;
  for (const seg of drive.segments) for (const t of seg.terms) b = Math.max(b, Math.abs(t.to - t.from));
  return b;
}

export function prepareBloch(drive: LatticeDrive, s: ArrayLike<number>): PreparedBloch {
  if (s.length !== drive.dimension) {
    throw new RangeError(`blochHamiltonian: momentum has ${s.length} components, the lattice has dimension ${drive.dimension}`);
  }
  for (let i = 0; i < s.length; i++) {
    if (!Number.isFinite(s[i])) throw new RangeError(`blochHamiltonian: momentum component ${i} is not finite (${s[i]})`);
  }
  const n = drive.states.length;
  const omega = angularFrequency(drive);
  const starts = segmentStartTimes(drive);
  const segments = drive.segments.map((seg, i) => compileSegment(drive, i, seg, starts[i], s));
  const positive = segments.map((seg, i) => (seg.duration > 0 ? i : -1)).filter((i) => i >= 0);
  const checkIndex = (i: number) => {
    if (!(Number.isInteger(i) && i >= 0 && i < segments.length)) {
      throw new RangeError(`blochHamiltonian: segment index ${i} out of range (the drive has ${segments.length} segments)`);
    }
  };
  const segmentIndexAt = (t: number): number => {
    if (!(t >= 0 && t <= drive.period * (1 + 1e-12))) {
      throw new RangeError(`blochHamiltonian: time ${t} outside the period [0, ${drive.period}]`);
    }
    if (positive.length === 0) throw new RangeError('blochHamiltonian: the drive has no segment of positive duration');
    for (const i of positive) if (t < segments[i].start + segments[i].duration) return i;
    return positive[positive.length - 1];
  };
  const segmentAt = (i: number, t: number, out?: ComplexMatrix): ComplexMatrix => {
    checkIndex(i);
    const seg = segments[i];
    const target = out ?? zeros(n, n);
    if (seg.constant) {
      if (seg.fixed === null) seg.fixed = fillSegment(seg, computeTimeFactors(seg, omega, seg.start), zeros(n, n));
      target.re.set(seg.fixed.re);
      target.im.set(seg.fixed.im);
      return target;
    }
    return fillSegment(seg, computeTimeFactors(seg, omega, t), target);
  };
  const segmentAtBanded = (i: number, t: number, out: BandedMatrix): BandedMatrix => {
    checkIndex(i);
    const seg = segments[i];
    return fillSegmentBanded(seg, computeTimeFactors(seg, omega, seg.constant ? seg.start : t), out);
  };
  const tableSampler = (i: number, key: string, times: ArrayLike<number>) => {
    checkIndex(i);
    const seg = segments[i];
    const table = timeFactorTable(drive, `${i}|${key}`, seg, omega, times);
    return (node: number, out: ComplexMatrix) => fillSegment(seg, table[node], out);
  };
  return {
    size: n,
    tableSampler,
    at: (t) => segmentAt(segmentIndexAt(t), t),
    isConstant: (i) => {
      checkIndex(i);
      return segments[i].constant;
    },
    segmentAt,
    segmentAtBanded,
    segmentIndexAt,
  };
}

/** Hermitian H(s, t): reduced momenta s, absolute time t in [0, T]. */
export function blochHamiltonian(drive: LatticeDrive, s: ArrayLike<number>, t: number): ComplexMatrix {
  return prepareBloch(drive, s).at(t);
}

/** K of a kick segment (duration 0), Hermitian, with U_kick = exp(−iK); modulations are evaluated at the kick time. */
export function kickGenerator(drive: LatticeDrive, s: ArrayLike<number>, segmentIndex: number): ComplexMatrix {
  const segment = drive.segments[segmentIndex];
  if (segment === undefined) throw new RangeError(`kickGenerator: segment index ${segmentIndex} out of range (the drive has ${drive.segments.length} segments)`);
  if (segment.duration !== 0) {
    throw new RangeError(`kickGenerator: ${describeSegment(drive, segmentIndex)} has duration ${segment.duration}; only zero-duration segments are kicks`);
  }
  return prepareBloch(drive, s).segmentAt(segmentIndex, segmentStartTimes(drive)[segmentIndex]);
}

/**
 * A piecewise-constant drive compiled once for many momenta: every segment of
 * positive duration is constant in time (kicks are evaluated at their time), so
 * H(s) of a segment is Σ_terms amplitude·g·e^{−2πi s·n}, with the time factor g
 * fixed. `fill` writes a segment's H(s) into a caller-owned matrix without
 * allocating (`fillBanded` into band storage, for ribbons and open chains);
 * `blocks` are the connected components of the segment's bond graph (a
 * structural, momentum-independent block structure for the exponential). The
 * momentum phases are evaluated once per distinct cell offset and call.
 * Arithmetic follows prepareBloch term by term, so both give identical matrices.
 */
export interface ConstantDrive {
  readonly size: number;
  readonly dimension: number;
  readonly durations: readonly number[];
  readonly blocks: readonly (readonly number[][])[];
  fill(segmentIndex: number, s: ArrayLike<number>, out: ComplexMatrix): ComplexMatrix;
  fillBanded(segmentIndex: number, s: ArrayLike<number>, out: BandedMatrix): BandedMatrix;
}

/** The drive compiled for momentum sweeps, or null when a segment of positive duration depends on time. */
export function compileConstantDrive(drive: LatticeDrive): ConstantDrive | null {
  const zero = new Array<number>(drive.dimension).fill(0);
  const prepared = prepareBloch(drive, zero);
  if (drive.segments.some((seg, i) => seg.duration > 0 && !prepared.isConstant(i))) return null;
  const n = drive.states.length;
  const omega = angularFrequency(drive);
  const starts = segmentStartTimes(drive);
  const segments = drive.segments.map((seg, i) => compileSegment(drive, i, seg, starts[i], zero));
  const factors = segments.map((seg) => computeTimeFactors(seg, omega, seg.start));
  const amplitudes = drive.segments.map((seg) => seg.terms.map((t) => [t.amplitude.re, t.amplitude.im]));
  const blocks = segments.map((seg) => bondBlocks(n, seg.terms));
  const dimension = drive.dimension;
  // Distinct cell offsets of each segment, and the offset of every term.
  const offsetLists = drive.segments.map((seg) => {
    const keys = new Map<string, number>();
    const list: number[][] = [];
    const ofTerm = seg.terms.map((t) => {
      const key = t.offset.join(',');
      let k = keys.get(key);
      if (k === undefined) {
        k = list.length;
        keys.set(key, k);
        list.push(t.offset.slice());
      }
      return k;
    });
    return { list, ofTerm: Int32Array.from(ofTerm) };
  });
  const phases = drive.segments.map((_, i) => new Float64Array(2 * offsetLists[i].list.length));
  const evaluatePhases = (i: number, s: ArrayLike<number>): Float64Array => {
    const { list } = offsetLists[i], out = phases[i];
    for (let k = 0; k < list.length; k++) {
      let arg = 0;
      for (let d = 0; d < dimension; d++) arg -= 2 * Math.PI * s[d] * list[k][d];
      out[2 * k] = Math.cos(arg);
      out[2 * k + 1] = Math.sin(arg);
    }
    return out;
  };
  const write = (i: number, s: ArrayLike<number>, re: Float64Array, im: Float64Array, position: (row: number, col: number) => number) => {
    const seg = segments[i], g = factors[i], amps = amplitudes[i], of = offsetLists[i].ofTerm;
    const phase = evaluatePhases(i, s);
    const terms = seg.terms;
    re.fill(0);
    im.fill(0);
    for (let j = 0; j < terms.length; j++) {
      const term = terms[j];
      const cr = phase[2 * of[j]], ci = phase[2 * of[j] + 1];
      const ar = amps[j][0], ai = amps[j][1];
      const cRe = ar * cr - ai * ci, cIm = ar * ci + ai * cr;
      addTerm(re, im, position(term.to, term.from), position(term.from, term.to), term.onsite, g[2 * j], g[2 * j + 1], cRe, cIm);
    }
  };
  const fill = (i: number, s: ArrayLike<number>, out: ComplexMatrix): ComplexMatrix => {
    write(i, s, out.re, out.im, (r, c) => r * n + c);
    return out;
  };
  const fillBanded = (i: number, s: ArrayLike<number>, out: BandedMatrix): BandedMatrix => {
    write(i, s, out.re, out.im, (r, c) => out.index(r, c));
    return out;
  };
  return { size: n, dimension, durations: drive.segments.map((seg) => seg.duration), blocks, fill, fillBanded };
}

/** Connected components of the graph whose edges are the hopping terms of a segment, each sorted ascending. */
function bondBlocks(n: number, terms: CompiledTerm[]): number[][] {
  const finder = new ComponentFinder(n);
  for (const t of terms) {
    if (t.onsite || t.from === t.to) continue;
    finder.join(t.from, t.to);
  }
  return finder.components();
}
