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
 *    U(s, T) on a probe grid, its local minima polished, with their widths d/v.
 *    A cut that comes within `closingFloor` of the spectrum is closed: W is not
 *    defined there, and the report says so. (Whether a gap is open for a
 *    verdict is decided by the certified bound of sheet/gaps.ts.)
 * 2. Mesh (winding/cell-mesh.ts): cells quartered until each is small against
 *    its distance from every cut (L₁h₁ + L₂h₂ ≤ κ·d with the Lipschitz bound L
 *    of the loop's quasienergies and κ = 16, since L overestimates the slope)
 *    and graded geometrically towards every polished minimum down to its width.
 * 3. Time rule: Gauss–Legendre nodes per loop piece, raised until about a
 *    quarter more nodes per piece change the density by less than
 *    tolerance/1000 (relative) at the momenta closest to each cut and at
 *    generic ones; the rule is exponentially convergent (the integrand is
 *    trigonometric in t on each piece), so the change bounds the error of the
 *    coarser rule, which is the one used.
 * 4. Integrate (winding/adaptive-quadrature.ts, winding/density.ts): adaptive
 *    Gauss–Kronrod cubature of the exactly differentiated density, refined
 *    where its local error estimate is largest, budgeted by evaluations.
 * 5. Accept when the error estimate and |W − round W| are both within
 *    `tolerance` and the nested Gauss and Kronrod sums on the final cells
 *    round to the same integer; otherwise the report carries converged = false
 *    and says what would settle it. The history lists the Kronrod value at each
 *    checkpoint (after the first mesh, then whenever the evaluations have
 *    doubled), then the nested 7-point Gauss and the 15-point Kronrod sums on
 *    the final cells.
 *
 * Sign conventions: reduced momenta s with k = s₁b₁ + s₂b₂; the integral is
 * computed in s and multiplied by sign det(a₁, a₂), so a left-handed basis
 * gives the same, physical, W. With these conventions a static Hamiltonian run
 * as a drive with bandwidth below 2π/T has W = 0 in the gap at π/T and W = C of
 * the bands below ε = 0 in the gap at 0, and in general
 * W_{ε′} − W_ε = Σ C over the bands between ε and ε′ (docs/conventions.md).
 */
import type { LatticeDrive } from '../../evolution/drive.ts';
import type { WindingQuadrature, WindingReport } from '../../portrait.ts';
import type { RefinementStep } from '../../certificates.ts';
import { integerEstimate } from '../../certificates.ts';
import type { PropagatorOptions } from '../../evolution/propagator.ts';
import { wrapQuasienergy } from '../../quasienergy-bands.ts';
import { UnitaryEigen } from '../../linalg/unitary-eigen.ts';
import { prepareBloch } from '../../evolution/bloch.ts';
import { zeros } from '../../linalg/complex-matrix.ts';
import { HermitianEigen } from '../../linalg/hermitian-eigen.ts';
import type { LoopPlan } from './time-loop.ts';
import { generatorSeries, loopFloquetOperator, loopLipschitz, magnusSliceCounts, pieceGenerator, planLoop } from './time-loop.ts';
import { unitaryEigenTwo } from './two-band-kernel.ts';
import { latticeOrientation } from '../chern-fhs.ts';
import { formatNumber } from '../../number-format.ts';
import { gradedMesh } from './cell-mesh.ts';
import { probeCut } from './probe.ts';
import type { DensityEvaluator } from './density.ts';
import { WindingDensity } from './density.ts';
import { TwoBandWindingDensity } from './two-band-density.ts';
import { adaptiveCubature, POINTS_PER_CELL } from './adaptive-quadrature.ts';

export interface WindingOptions {
  /** Accepted |W − round W| and accepted error estimate of the quadrature (default 1e-6). */
  tolerance?: number;
  /** Most evaluations of the winding density (momenta, each integrated over the loop) per call (default 400000). */
  evaluations?: number;
  /** Cells per direction of the uniform start of the mesh (default 4). */
  initialCells?: number;
  /** Distance from cut to spectrum (units π/T) below which the gap counts as closed (default 1e-6). */
  closingFloor?: number;
  /**
   * Options of the time integration of U (time-dependent segments only). W
   * only needs the loop's U(T) to stay well inside the gap (winding/time-loop.ts):
   * by default the tolerance on eigenphases starts at 1e-3 and is tightened to
   * 1/20 of the smallest distance from a cut to the spectrum; with an explicit
   * tolerance, a distance within 20× of it is flagged in the caveat.
   */
  propagator?: PropagatorOptions;
}

export const DEFAULT_WINDING_TOLERANCE = 1e-6;
export const DEFAULT_WINDING_EVALUATIONS = 400000;
export const DEFAULT_CLOSING_FLOOR = 1e-6;
/**
 * First tolerance on eigenphases (radians) for Magnus-sliced segments; tightened to
 * (distance to the cut)/GAP_OVER_TOLERANCE when a cut comes closer. The loop is a
 * piecewise-constant drive whose own W is integrated exactly; it has the W of the
 * true drive as long as its U(T) stays inside the gap (winding/time-loop.ts), which
 * an eigenphase error of a twentieth of the distance to the cut leaves far from doubt.
 */
export const DEFAULT_WINDING_PROPAGATOR_TOLERANCE = 1e-3;
const GAP_OVER_TOLERANCE = 20;
/** The time rule is accepted when one more node per piece changes the density by at most this fraction of the W tolerance (relative). */
const TIME_RULE_FRACTION = 1e-3;
/** Share of the W tolerance granted to the momentum quadrature's error estimate. */
const QUADRATURE_SHARE = 0.5;
/** κ of the quadrature's first mesh (winding/cell-mesh.ts). */
const MESH_FRACTION = 16;
/** Points per direction of the probe grid, and how sharp (width in reduced momentum) a minimum must be to become a focus. */
const PROBE_GRID = 24;
const SHARP_WIDTH = 0.25;

function resolved(options: WindingOptions) {
  const o = {
    tolerance: options.tolerance ?? DEFAULT_WINDING_TOLERANCE,
    evaluations: options.evaluations ?? DEFAULT_WINDING_EVALUATIONS,
    initialCells: options.initialCells ?? 4,
    closingFloor: options.closingFloor ?? DEFAULT_CLOSING_FLOOR,
  };
  if (!(o.tolerance > 0 && o.tolerance < 0.5)) throw new RangeError(`gapWindingNumbers: option tolerance must lie in (0, 0.5), got ${o.tolerance}`);
  if (!(Number.isInteger(o.evaluations) && o.evaluations >= 2 * POINTS_PER_CELL)) {
    throw new RangeError(`gapWindingNumbers: option evaluations must be an integer ≥ ${2 * POINTS_PER_CELL}, got ${o.evaluations}`);
  }
  if (!(Number.isInteger(o.initialCells) && o.initialCells >= 1)) throw new RangeError(`gapWindingNumbers: option initialCells must be a positive integer, got ${o.initialCells}`);
  if (!(o.closingFloor >= 0)) throw new RangeError(`gapWindingNumbers: option closingFloor must be ≥ 0, got ${o.closingFloor}`);
  return o;
}

/** The density evaluator for the loop: the closed-form 2×2 path for two bands. */
export function windingDensity(plan: LoopPlan, series: ReturnType<typeof generatorSeries>, cuts: number[], nodes: number[]): DensityEvaluator {
  return series[0].size === 2 ? new TwoBandWindingDensity(plan, series, cuts, nodes) : new WindingDensity(plan, series, cuts, nodes);
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

const fmt = formatNumber;

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
  return { plan, series, nodes, spectrum, lipschitz: loopLipschitz(series, plan) };
}

/**
 * Node counts for the time integral: the base counts, raised by about a quarter
 * per round until that raise changes the density at the probe momenta by at
 * most TIME_RULE_FRACTION·tolerance relative to its size. Returns the counts
 * (the coarser of the last pair) and the largest relative change seen.
 */
function settleTimeRule(plan: LoopPlan, series: ReturnType<typeof generatorSeries>, cuts: number[], base: number[], probes: number[][], tolerance: number) {
  const limit = TIME_RULE_FRACTION * tolerance;
  const g = cuts.length;
  const a = new Float64Array(g), b = new Float64Array(g), im = new Float64Array(g), dist = new Float64Array(g);
  let nodes = base.slice(), change = Infinity, evaluations = 0;
  for (let round = 0; round < 8; round++) {
    const finer = nodes.map((m) => m + Math.max(1, Math.ceil(m / 4)));
    const coarse = windingDensity(plan, series, cuts, nodes), fine = windingDensity(plan, series, cuts, finer);
    change = 0;
    for (const s of probes) {
      coarse.evaluate(s[0], s[1], a, im, dist);
      fine.evaluate(s[0], s[1], b, im, dist);
      evaluations += 2;
      for (let j = 0; j < g; j++) change = Math.max(change, Math.abs(a[j] - b[j]) / (1 + Math.abs(b[j])));
    }
    if (change <= limit) break;
    nodes = finer;
  }
  return { nodes, change, evaluations };
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
  // the gap, so the slicing starts loose and is tightened once the mesh has measured the gap.
  let propagator = { tolerance: DEFAULT_WINDING_PROPAGATOR_TOLERANCE, ...options.propagator };
  let loop = prepareLoop(drive, propagator, corners);
  const meshFor = () => {
    const probes = gapLabels.map((g) => probeCut(loop.spectrum, g, PROBE_GRID, { sharpWidth: SHARP_WIDTH, floor: o.closingFloor / 10 }));
    const foci = probes.flatMap((p) => (p.minimalDistance < o.closingFloor ? [] : p.foci.map((f) => ({ centre: f.momentum, widths: f.widths }))));
    const graded = gradedMesh({ spectrum: loop.spectrum, cuts: gapLabels, lipschitz: loop.lipschitz, initial: o.initialCells, closingFloor: o.closingFloor, fraction: MESH_FRACTION, foci });
    // The probe's polished minima are finer than the mesh centres: they decide closing and report the minimum.
    probes.forEach((p, i) => {
      const cut = graded.cuts[i];
      if (p.minimalDistance < cut.smallest) {
        cut.smallest = p.minimalDistance;
        cut.at = p.momentumAtMinimum;
      }
      if (p.minimalDistance < o.closingFloor) cut.closed = true;
    });
    return graded;
  };
  let mesh = meshFor();
  const sliced = loop.plan.pieces.some((piece) => piece.kind === 'slice');
  const narrowest = Math.min(...mesh.cuts.map((c) => (c.closed ? Infinity : c.smallest)));
  if (sliced && options.propagator?.tolerance === undefined && narrowest * Math.PI < GAP_OVER_TOLERANCE * propagator.tolerance) {
    propagator = { ...propagator, tolerance: Math.max((narrowest * Math.PI) / GAP_OVER_TOLERANCE, 1e-12) };
    loop = prepareLoop(drive, propagator, corners);
    mesh = meshFor();
  }
  const { plan, series } = loop;
  const notes: string[][] = gapLabels.map(() => []);
  if (sliced) {
    mesh.cuts.forEach((c, i) => {
      // After the automatic tightening the rebuilt loop may find the cut a little closer: only a margin below half is flagged.
      const margin = options.propagator?.tolerance === undefined ? GAP_OVER_TOLERANCE / 2 : GAP_OVER_TOLERANCE;
      if (!c.closed && c.smallest * Math.PI < margin * propagator.tolerance) {
        notes[i].push(`the distance from the cut to the spectrum (${fmt(c.smallest)} π/T) is within ${margin}× the time-integration tolerance ${fmt(propagator.tolerance)} rad; to settle, tighten numerics.tolerances.propagator`);
      }
    });
  }
  const open = gapLabels.map((_, i) => i).filter((i) => !mesh.cuts[i].closed);
  const history: RefinementStep[][] = gapLabels.map(() => []);
  const quadrature: (WindingQuadrature | undefined)[] = gapLabels.map(() => undefined);
  const values = gapLabels.map(() => NaN), errors = gapLabels.map(() => Infinity);
  let budgetSpent = false;
  const firstMesh = mesh.cells.length * POINTS_PER_CELL;
  const tooSmall = firstMesh > o.evaluations;
  if (tooSmall) {
    open.forEach((i) =>
      notes[i].push(`the first mesh (${mesh.cells.length} cells, ${firstMesh} evaluations) exceeds the budget of ${o.evaluations} evaluations; to settle, raise numerics.windingEvaluations to at least ${2 * firstMesh}`),
    );
  }
  if (open.length > 0 && !tooSmall) {
    const cuts = open.map((i) => gapLabels[i]);
    // Time rule, checked where each cut is closest to the spectrum and at generic momenta.
    const probes = [...open.map((i) => mesh.cuts[i].at), [0.1234, 0.5678], [0.731, 0.219]];
    const time = settleTimeRule(plan, series, cuts, loop.nodes, probes, o.tolerance);
    const density = windingDensity(plan, series, cuts, time.nodes);
    const scale = sign / (8 * Math.PI * Math.PI);
    const im = new Float64Array(cuts.length), dist = new Float64Array(cuts.length);
    let imaginary = 0;
    const result = adaptiveCubature({
      components: cuts.length,
      integrand: (s1, s2, out) => {
        density.evaluate(s1, s2, out, im, dist);
        for (let j = 0; j < cuts.length; j++) imaginary = Math.max(imaginary, Math.abs(im[j]));
      },
      cells: mesh.cells,
      tolerance: cuts.map(() => (QUADRATURE_SHARE * o.tolerance) / Math.abs(scale)),
      budget: Math.max(o.evaluations - time.evaluations, 2 * POINTS_PER_CELL),
      checkpoint: (state) => {
        open.forEach((gap, j) => {
          history[gap].push({ grid: [state.evaluations], value: state.values[j] * scale, label: `${state.evaluations} evaluations, ${state.cells} cells` });
        });
      },
    });
    budgetSpent = result.budgetSpent;
    open.forEach((gap, j) => {
      values[gap] = result.values[j] * scale;
      errors[gap] = result.errors[j] * Math.abs(scale);
      // The last checkpoint is replaced by the nested pair on the final cells.
      const h = history[gap];
      if (h.length > 0 && h[h.length - 1].grid[0] === result.evaluations) h.pop();
      h.push({ grid: [result.evaluations], value: result.gaussValues[j] * scale, label: `7-point Gauss on the final ${result.cells} cells` });
      h.push({ grid: [result.evaluations], value: values[gap], label: `15-point Kronrod on the final ${result.cells} cells (${result.evaluations} evaluations)` });
      quadrature[gap] = {
        evaluations: result.evaluations + time.evaluations,
        cells: result.cells,
        meshCells: mesh.cells.length,
        errorEstimate: errors[gap],
        raw: values[gap],
        timeNodes: time.nodes.reduce((x, y) => x + y, 0),
        timeRuleChange: time.change,
        minimalDistance: mesh.cuts[gap].smallest,
        momentumAtMinimum: mesh.cuts[gap].at,
      };
    });
    if (imaginary * Math.abs(scale) > o.tolerance) open.forEach((gap) => notes[gap].push(`imaginary part up to ${fmt(imaginary * Math.abs(scale))} (should vanish)`));
  }

  return gapLabels.map((label, i) => {
    const h = history[i];
    const cut = mesh.cuts[i];
    const where = `(${cut.at.map((x) => x.toFixed(4)).join(', ')})`;
    let caveat: string | undefined;
    let stable = false;
    if (cut.closed) {
      caveat =
        `the gap at ${label} closes: the spectrum comes within ${fmt(cut.smallest)} π/T of the cut at s = ${where}, ` +
        `below the closing floor ${fmt(o.closingFloor)}; the winding number is not defined there`;
    } else {
      const value = values[i];
      const residual = Math.abs(value - Math.round(value));
      const gauss = h.length > 1 ? h[h.length - 2].value : NaN;
      stable = Math.round(gauss) === Math.round(value) && errors[i] <= o.tolerance;
      if (!stable || residual > o.tolerance) {
        const why = Number.isNaN(value)
          ? 'the integral was not computed'
          : errors[i] > o.tolerance
            ? `the quadrature error estimate ${fmt(errors[i])} exceeds the tolerance ${fmt(o.tolerance)}${budgetSpent ? ` after ${quadrature[i]?.evaluations} evaluations (the budget)` : ''}`
            : residual > o.tolerance
              ? `|W − round W| = ${fmt(residual)} exceeds the tolerance ${fmt(o.tolerance)} although the error estimate is ${fmt(errors[i])}`
              : 'the nested Gauss and Kronrod sums round to different integers';
        caveat = `did not converge: ${why}; smallest distance from the cut to the spectrum ${fmt(cut.smallest)} π/T at s = ${where}${tooSmall ? '' : '; to settle, raise numerics.windingEvaluations'}`;
        stable = false;
      }
    }
    if (notes[i].length > 0) caveat = [caveat, ...notes[i]].filter((x) => x !== undefined).join('; ');
    const last = h[h.length - 1];
    const raw = cut.closed ? (last?.value ?? NaN) : values[i];
    const estimate = integerEstimate(raw, o.tolerance, last ? last.grid : [0], h, stable, caveat);
    const report: WindingReport = { gap: label, winding: estimate };
    const q = quadrature[i];
    if (q !== undefined) report.quadrature = q;
    return report;
  });
}
