/**
 * Gap winding numbers of driven two-dimensional lattices (Rudner, Lindner, Berg,
 * Levin, PRX 3, 031005 (2013)):
 *
 *   W[U_ε] = (1/8π²) ∫₀ᵀ dt ∫ d²k Tr(V⁻¹∂_tV [V⁻¹∂_{k₁}V, V⁻¹∂_{k₂}V]),
 *   V(k, t) = U(k, t) exp(+i H_ε^eff(k) t),   H_ε^eff = (i/T) log_ε U(k, T),
 *
 * the number of chiral edge modes in the quasienergy gap ε that holds even when
 * every band has Chern number zero. W needs the whole evolution over the
 * period, not only U(T).
 *
 * Procedure and evidence:
 * 1. Probe (winding/probe.ts): the distance d from each cut to the spectrum of
 *    U(k, T) is minimised over the zone. Below `closingFloor` the gap is
 *    treated as closed: W is not defined there, and the report says so.
 * 2. Integrate (winding/integral.ts) on grids n × n × (time nodes) that grow by
 *    about 1.5 per level, with points crowded near the minima of d whose width
 *    d/v is below a few grid spacings (winding/grid.ts).
 * 3. Accept when two successive levels both lie within `tolerance` of the same
 *    integer and differ by at most `tolerance`; otherwise the report carries
 *    converged = false and says why. Every level is kept in `history`.
 *    Default tolerance 1e-3: the discretisation error falls with a high power
 *    of the grid (order-8 differences, Gauss–Legendre in time), so two levels
 *    that agree to 1e-3 at an integer leave a wide margin to the ±1/2 that
 *    would change the verdict, at a cost far below a 1e-6 target.
 *
 * Sign conventions: reduced momenta s with k = s₁b₁ + s₂b₂; the integral is
 * computed in s and multiplied by sign det(a₁, a₂), so a left-handed basis
 * gives the same, physical, W. With these conventions a static Hamiltonian run
 * as a drive with bandwidth below 2π/T has W = 0 in the gap at π/T and W = C of
 * the bands below ε = 0 in the gap at 0, and in general
 * W_{ε′} − W_ε = Σ C over the bands between ε and ε′ (docs/conventions.md).
 */
import type { LatticeDrive } from '../../evolution/drive.ts';
import type { WindingReport } from '../../portrait.ts';
import type { RefinementStep } from '../../certificates.ts';
import { integerEstimate } from '../../certificates.ts';
import type { PropagatorOptions } from '../../evolution/propagator.ts';
import { wrapQuasienergy } from '../../quasienergy-bands.ts';
import { UnitaryEigen } from '../../linalg/unitary-eigen.ts';
import { prepareBloch } from '../../evolution/bloch.ts';
import { zeros } from '../../linalg/complex-matrix.ts';
import { HermitianEigen } from '../../linalg/hermitian-eigen.ts';
import type { LoopPlan } from './time-loop.ts';
import { generatorSeries, loopFloquetOperator, magnusSliceCounts, pieceGenerator, planLoop } from './time-loop.ts';
import type { AxisFocus } from './grid.ts';
import { gradedAxis } from './grid.ts';
import type { CutProbe } from './probe.ts';
import { probeCut } from './probe.ts';
import { windingOnGrid } from './integral.ts';
import { unitaryEigenTwo } from './two-band-kernel.ts';
import { latticeOrientation } from '../chern-fhs.ts';

export interface WindingOptions {
  /** Accepted |W − round W| (default 1e-3), also the largest accepted change between the last two levels. */
  tolerance?: number;
  /** Momentum points per direction on the first level (default 16). */
  initialGrid?: number;
  /** Largest momentum grid per direction (default 128). */
  maxGrid?: number;
  /** Half-width r of the central differences in momentum, order 2r (default 4). */
  stencilRadius?: number;
  /** Points per direction of the probe grid for the distance to the cut (default 24). */
  probeGrid?: number;
  /** Distance from cut to spectrum (units π/T) below which the gap counts as closed (default 1e-6). */
  closingFloor?: number;
  /**
   * Options of the time integration of U (time-dependent segments only). W
   * only needs the loop's U(T) to stay well inside the gap (winding/time-loop.ts):
   * by default the tolerance on eigenphases starts at 1e-6 and is tightened to
   * 1/100 of the smallest gap found; with an explicit tolerance, a gap within
   * 100× of it is flagged in the caveat.
   */
  propagator?: PropagatorOptions;
}

export const DEFAULT_WINDING_TOLERANCE = 1e-3;
export const DEFAULT_CLOSING_FLOOR = 1e-6;
/** First tolerance on eigenphases for Magnus-sliced segments; tightened to gap/GAP_OVER_TOLERANCE when the gap is narrower. */
export const DEFAULT_WINDING_PROPAGATOR_TOLERANCE = 1e-6;
const GAP_OVER_TOLERANCE = 100;
/** A minimum of the distance is crowded when its width d/v is below this many first-level spacings. */
const FOCUS_SPACINGS = 4;
/** Ratio of successive widths in the ladder of foci around one minimum. */
const LADDER_RATIO = 8;
/** Growth of the grid per level. */
const GROWTH = 1.5;

function resolved(options: WindingOptions) {
  const o = {
    tolerance: options.tolerance ?? DEFAULT_WINDING_TOLERANCE,
    initialGrid: options.initialGrid ?? 16,
    maxGrid: options.maxGrid ?? 128,
    stencilRadius: options.stencilRadius ?? 4,
    probeGrid: options.probeGrid ?? 24,
    closingFloor: options.closingFloor ?? DEFAULT_CLOSING_FLOOR,
  };
  const positiveInt = (name: string, v: number, min: number) => {
    if (!(Number.isInteger(v) && v >= min)) throw new RangeError(`gapWindingNumbers: option ${name} must be an integer ≥ ${min}, got ${v}`);
  };
  if (!(o.tolerance > 0 && o.tolerance < 0.5)) throw new RangeError(`gapWindingNumbers: option tolerance must lie in (0, 0.5), got ${o.tolerance}`);
  positiveInt('stencilRadius', o.stencilRadius, 1);
  positiveInt('initialGrid', o.initialGrid, 2 * o.stencilRadius + 1);
  positiveInt('maxGrid', o.maxGrid, o.initialGrid);
  positiveInt('probeGrid', o.probeGrid, 3);
  if (!(o.closingFloor >= 0)) throw new RangeError(`gapWindingNumbers: option closingFloor must be ≥ 0, got ${o.closingFloor}`);
  return o;
}

/** Gauss–Legendre nodes per piece: enough for the phase the integrand can turn through on the piece (trigonometric in t). */
function baseNodes(drive: LatticeDrive, plan: LoopPlan, momenta: number[][]): number[] {
  const n = drive.states.length;
  const spread = plan.pieces.map(() => 0);
  const gen = zeros(n, n), scratch = zeros(n, n);
  for (const s of momenta) {
    const bloch = prepareBloch(drive, s);
    plan.pieces.forEach((piece, p) => {
      const values = new HermitianEigen(pieceGenerator(bloch, piece, gen, scratch), { vectors: false }).values;
      spread[p] = Math.max(spread[p], values[values.length - 1] - values[0]);
    });
  }
  return plan.pieces.map((piece, p) => {
    const phase = piece.duration * (spread[p] + (2 * Math.PI) / plan.length);
    // Magnus slices are short: the integrand is nearly a low-order polynomial on each.
    return piece.kind === 'slice' ? Math.ceil(0.6 * phase) || 1 : Math.ceil(4 + 0.6 * phase);
  });
}

function levelSizes(initial: number, max: number): number[] {
  const sizes: number[] = [];
  for (let n = initial; n <= max; n = Math.round(n * GROWTH)) sizes.push(n + (n % 2));
  return sizes.filter((n, i) => n <= max + 1 && (i === 0 || n !== sizes[i - 1]));
}

/**
 * Foci of the graded axes. Around a Dirac-like minimum of width w the density
 * falls off only as a power of the distance q (its integral outside radius q
 * goes like w/q), so a single concentration of width w leaves the range
 * w ≪ q ≪ spacing under-resolved and convergence algebraic. A geometric ladder
 * of widths w, 8w, 64w, … up to the first-level spacing gives a point density
 * of about 1/q over that range (spacing ∝ distance, as in geometrically graded
 * meshes), which restores fast convergence; measured on the Qi–Wu–Zhang model
 * with gap 2·10⁻³, 5·10⁻⁵ off the integer on a 54 × 54 grid.
 */
function focusAxes(probes: CutProbe[], initialGrid: number): [AxisFocus[], AxisFocus[]] {
  const axes: [AxisFocus[], AxisFocus[]] = [[], []];
  const top = FOCUS_SPACINGS / initialGrid;
  for (const probe of probes) {
    for (const focus of probe.foci) {
      for (const axis of [0, 1]) {
        for (let w = focus.widths[axis]; w < top; w *= LADDER_RATIO) axes[axis].push({ centre: focus.momentum[axis], width: w });
      }
    }
  }
  return axes;
}

const fmt = (x: number) => (Math.abs(x) >= 1e-3 && Math.abs(x) < 1e4 ? x.toPrecision(4) : x.toExponential(2));

/** Loop plan, generator series, base node counts and the loop's own spectrum for one propagator tolerance. */
function prepareLoop(drive: LatticeDrive, propagator: PropagatorOptions, corners: number[][]) {
  const plan = planLoop(drive, prepareBloch(drive, [0, 0]), magnusSliceCounts(drive, corners, propagator));
  const series = generatorSeries(drive, plan);
  const nodes = baseNodes(drive, plan, corners);
  // Quasienergies (units π/T) of the loop's own U(s, T), the operator the integral closes on.
  const twoPhases = new Float64Array(2), twoVectors = [new Float64Array(4), new Float64Array(4)];
  const spectrum = (s: number[]) => {
    const u = loopFloquetOperator(series, plan, s[0], s[1]);
    let phases: ArrayLike<number>;
    if (u.rows === 2) {
      unitaryEigenTwo(u.re, u.im, 0, twoPhases, 0, twoVectors[0], twoVectors[1]);
      phases = twoPhases;
    } else phases = new UnitaryEigen(u).phases;
    return Array.from(phases, (phi) => wrapQuasienergy(-phi / Math.PI));
  };
  return { plan, series, nodes, spectrum };
}

/**
 * Rudner–Lindner–Berg–Levin winding numbers of the gaps named by `gapLabels`
 * (quasienergies in units of π/T, each inside the gap it names).
 */
export function gapWindingNumbers(drive: LatticeDrive, gapLabels: number[], options: WindingOptions = {}): WindingReport[] {
  if (drive.dimension !== 2) throw new RangeError(`gapWindingNumbers: the winding number is defined for two-dimensional lattices; this drive has dimension ${drive.dimension}`);
  gapLabels.forEach((g, i) => {
    if (!Number.isFinite(g)) throw new RangeError(`gapWindingNumbers: gap label ${i} is not a finite quasienergy (${g})`);
  });
  const o = resolved(options);
  const sign = latticeOrientation(drive);
  if (gapLabels.length === 0) return [];

  const corners = [[0, 0], [0.5, 0], [0, 0.5], [0.5, 0.5], [0.25, 0.75]];
  // Time-dependent segments become Magnus slices (winding/time-loop.ts). Their U(T) only has to stay far inside
  // the gap, so the slicing starts loose and is tightened once the probe has measured the gap.
  let propagator = { tolerance: DEFAULT_WINDING_PROPAGATOR_TOLERANCE, ...options.propagator };
  let loop = prepareLoop(drive, propagator, corners);
  const probeAll = () => gapLabels.map((g) => probeCut(loop.spectrum, g, o.probeGrid, { sharpWidth: FOCUS_SPACINGS / o.initialGrid, floor: o.closingFloor / 10 }));
  let probes = probeAll();
  const sliced = loop.plan.pieces.some((piece) => piece.kind === 'slice');
  const narrowest = Math.min(...probes.map((p) => (p.minimalDistance >= o.closingFloor ? p.minimalDistance : Infinity)));
  if (sliced && options.propagator?.tolerance === undefined && narrowest * Math.PI < GAP_OVER_TOLERANCE * propagator.tolerance) {
    propagator = { ...propagator, tolerance: Math.max((narrowest * Math.PI) / GAP_OVER_TOLERANCE, 1e-12) };
    loop = prepareLoop(drive, propagator, corners);
    probes = probeAll();
  }
  const { plan, series, nodes: nodes0 } = loop;

  const closed = probes.map((p) => p.minimalDistance < o.closingFloor);
  const open = gapLabels.map((_, i) => i).filter((i) => !closed[i]);
  const [foci1, foci2] = focusAxes(open.map((i) => probes[i]), o.initialGrid);

  const history: RefinementStep[][] = gapLabels.map(() => []);
  const done = gapLabels.map(() => false);
  const stable = gapLabels.map(() => false);
  const notes: string[][] = gapLabels.map(() => []);
  if (sliced) {
    probes.forEach((probe, i) => {
      if (!closed[i] && probe.minimalDistance * Math.PI < GAP_OVER_TOLERANCE * propagator.tolerance) {
        notes[i].push(
          `the gap (${fmt(probe.minimalDistance)} units π/T) is within ${GAP_OVER_TOLERANCE}× the time-integration tolerance ${fmt(propagator.tolerance)}; tighten options.propagator.tolerance`,
        );
      }
    });
  }
  let active = gapLabels.map((_, i) => i);
  const sizes = levelSizes(o.initialGrid, o.maxGrid);
  for (let level = 0; level < sizes.length && active.length > 0; level++) {
    const n = sizes[level];
    const grid = {
      axes: [gradedAxis(n, foci1), gradedAxis(n, foci2)] as [Float64Array, Float64Array],
      // Magnus slices already form a fine time grid: one more node per slice every second level.
      nodesPerPiece: nodes0.map((m, p) => m + (plan.pieces[p].kind === 'slice' ? Math.floor(level / 2) : 2 * level)),
      stencilRadius: o.stencilRadius,
    };
    const result = windingOnGrid(plan, series, active.map((i) => gapLabels[i]), grid, sign);
    active.forEach((gap, j) => {
      const value = result.values[j];
      const h = history[gap];
      h.push({ grid: [n, n, result.timeNodes], value });
      if (Math.abs(result.imaginary[j]) > o.tolerance) notes[gap].push(`imaginary part ${fmt(result.imaginary[j])} on grid ${n}×${n}`);
      if (result.closureDefect > 1e-8) notes[gap].push(`loop closes only to ${fmt(result.closureDefect)} on grid ${n}×${n}`);
      if (closed[gap]) {
        done[gap] = true;
        return;
      }
      const prev = h.length > 1 ? h[h.length - 2].value : NaN;
      const near = Math.abs(value - Math.round(value)) <= o.tolerance;
      if (near && Math.abs(value - prev) <= o.tolerance && Math.round(prev) === Math.round(value)) {
        stable[gap] = true;
        done[gap] = true;
      }
    });
    active = active.filter((i) => !done[i]);
  }

  return gapLabels.map((label, i) => {
    const h = history[i];
    const last = h[h.length - 1];
    const probe = probes[i];
    const where = `(${probe.momentumAtMinimum.map((x) => x.toFixed(4)).join(', ')})`;
    let caveat: string | undefined;
    if (closed[i]) {
      caveat =
        `the gap at ${label} closes: the spectrum comes within ${fmt(probe.minimalDistance)} (units π/T) of the cut at s = ${where}, ` +
        `below the closing floor ${fmt(o.closingFloor)}; the winding number is not defined there`;
    } else if (!stable[i]) {
      const residual = Math.abs(last.value - Math.round(last.value));
      caveat =
        `did not converge: |W − round W| = ${fmt(residual)} (tolerance ${fmt(o.tolerance)}) on the largest grid ${last.grid.join('×')}; ` +
        `smallest distance from the cut to the spectrum ${fmt(probe.minimalDistance)} (units π/T) at s = ${where}; raise maxGrid`;
    }
    if (notes[i].length > 0) caveat = [caveat, ...notes[i]].filter((x) => x !== undefined).join('; ');
    return { gap: label, winding: integerEstimate(last.value, o.tolerance, last.grid, h, stable[i], caveat) };
  });
}
