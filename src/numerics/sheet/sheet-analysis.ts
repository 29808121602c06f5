/**
 * The portrait of a driven sheet (2D drive) at one parameter point: quasienergy
 * bands and gaps, Chern numbers of every band group, gap winding numbers,
 * signed edge counts on ribbons, and the relations between them.
 *
 * Relations checked (derived in docs/conventions.md):
 *  - Σ C over all band groups = 0;
 *  - W(gap above) − W(gap below) = C of the group between them
 *    (Rudner, Lindner, Berg, Levin, PRX 3, 031005 (2013));
 *  - on a ribbon finite along a₁ (finiteDirection 0): high-edge count = +W,
 *    low-edge count = −W; finite along a₂ (finiteDirection 1): low = +W, high = −W
 *    (right-handed a₁, a₂; a left-handed basis flips these signs, since C and W
 *    are reported in Cartesian orientation while k∥ follows the lattice vector);
 *  - between consecutive gaps, edge counts change by the same signs times C
 *    (this one needs no winding numbers).
 */
import type { LatticeDrive } from '../evolution/drive.ts';
import type { BandGroupReport, ConsistencyCheck, EdgeCountReport, GapReport, RibbonReport, SheetPortrait, WindingReport } from '../portrait.ts';
import type { ChernOptions } from './chern-fhs.ts';
import { chernNumber, latticeOrientation } from './chern-fhs.ts';
import type { DetectedGap } from './gaps.ts';
import { bandGroups, DEFAULT_GAP_TOLERANCE, findGaps, orderFromCut } from './gaps.ts';
import type { PropagatorOptions } from '../evolution/propagator.ts';
import { verdictPropagatorTolerance } from '../evolution/propagator.ts';
import type { QuasienergyGrid } from '../quasienergy-bands.ts';
import { aboveCut, FloquetSampler, gridNeighbour, sampleQuasienergyGrid } from '../quasienergy-bands.ts';
import type { EdgeCountOptions } from './edge-modes.ts';
import { ribbonEdgeCounts, type RibbonCountOptions } from './ribbon-edge-counts.ts';
import type { WindingOptions } from './winding/gap-winding.ts';
import { gapWindingNumbers } from './winding/gap-winding.ts';
import type { DeclaredOperators } from '../symmetry/altland-zirnbauer.ts';
import { declaredSymmetryClass } from '../symmetry/altland-zirnbauer.ts';
import { declaredSymmetryReports } from '../symmetry/declared-symmetries.ts';

/** Ribbon settings of a sheet analysis: the directions to cut, and for each cut the options of ribbon-edge-counts.ts. */
export type SheetRibbonOptions = {
  /** Finite directions to cut (default both, [0, 1]). */
  directions?: number[];
} & Pick<RibbonCountOptions, 'width' | 'maxWidth' | 'widenFor' | 'edgeCells' | 'momenta' | 'denseStates'>;

export interface SheetOptions {
  /** Band grid n1 × n2 (default [24, 24]); the Chern refinement starts at max(n1, n2) unless chern.initialGrid says otherwise. */
  grid?: number[];
  /** Gap tolerance, units π/T (default 1e-3): a gap is open when the certified lower bound of its minimal direct gap exceeds it. */
  gapTolerance?: number;
  /** Most Floquet operators the certified lower bound of each gap may evaluate (default 20000, gaps.ts). */
  gapEvaluations?: number;
  /** Claimed gap labels (units π/T): gaps containing one are named by it. */
  labels?: number[];
  /** Band groups are counted upward from the open gap containing this quasienergy (default 1, the gap at π/T). */
  cut?: number;
  chern?: ChernOptions;
  winding?: WindingOptions;
  ribbon?: SheetRibbonOptions;
  edges?: EdgeCountOptions;
  /**
   * Time integration of time-dependent segments. Without a tolerance, bands
   * and Chern numbers use verdictPropagatorTolerance(gapTolerance, integer
   * accuracy) with the model's integer tolerance, else BAND_INTEGER_ACCURACY,
   * ribbons verdictPropagatorTolerance(gapTolerance, 1/100) (propagator.ts
   * states the rule); the winding numbers choose their own unless one is given here.
   */
  propagator?: PropagatorOptions;
  /** Stages to run (all default true). */
  run?: { chern?: boolean; winding?: boolean; edges?: boolean };
  /** Declared symmetry operators: each gets residuals (checked with the chains' strict time integration). */
  symmetries?: DeclaredOperators;
}

/** Relative tolerance of the symmetry relations, and the time-integration tolerance (radians) they are checked with, as for chains. */
export const SYMMETRY_TOLERANCE = 1e-10;
export const SYMMETRY_PROPAGATOR_TOLERANCE = 1e-9;

export const DEFAULT_SHEET_GRID = [24, 24];

/**
 * The integer accuracy the band propagator is held to when the model sets no
 * integer tolerance: eigenvectors then move by at most 10⁻³ of themselves
 * (propagator.ts, verdictPropagatorTolerance), ample for the Fukui–Hatsugai–Suzuki
 * links and the gap bounds. The gap winding numbers integrate their own loop
 * (winding/time-loop.ts) and are not bound by it.
 */
export const BAND_INTEGER_ACCURACY = 1e-3;

/**
 * Sign σ with count(edge) = σ · W for a ribbon finite along lattice vector
 * `finiteDirection` (docs/conventions.md, "Ribbons"): for a right-handed basis
 * (orientation +1) the low edge counts −W when finite along a₁ and +W when
 * finite along a₂; the high edge the opposite. A left-handed basis flips all.
 */
export function edgeSign(finiteDirection: number, edge: 'low' | 'high', orientation: 1 | -1 = 1): 1 | -1 {
  const lowSign = finiteDirection === 0 ? -1 : 1;
  return (orientation * (edge === 'low' ? lowSign : -lowSign)) as 1 | -1;
}

/** Decay length (cells) of edge states in a gap, estimated from the bulk: ξ ≈ v/(πΔ), v = max |dε/ds_f| of the two bounding branches. */
export function bulkDecayLength(data: QuasienergyGrid, gap: GapReport, finiteDirection: number): number {
  const n = data.grid[finiteDirection];
  const bounds = data.samples.map((s) => {
    let below = -Infinity, above = Infinity;
    for (const x of s.quasienergies) {
      const a = aboveCut(x, gap.label);
      if (a < above) above = a;
      if (a > below) below = a;
    }
    return [below - 2, above];
  });
  let v = 0;
  for (let i = 0; i < data.samples.length; i++) {
    const j = gridNeighbour(data.grid, i, finiteDirection);
    for (let b = 0; b < 2; b++) v = Math.max(v, Math.abs(bounds[j][b] - bounds[i][b]) * n);
  }
  return v / (Math.PI * gap.minimalGap);
}

function settledInteger(e: { converged: boolean; nearest: number } | undefined): number | undefined {
  return e !== undefined && e.converged ? e.nearest : undefined;
}

export function analyseSheet(drive: LatticeDrive, options: SheetOptions = {}): SheetPortrait {
  if (drive.dimension !== 2) throw new RangeError(`analyseSheet: needs a drive with two periodic directions, got dimension ${drive.dimension}`);
  const timings: Record<string, number> = {};
  const clock = (): number => globalThis.performance.now();
  const run = { chern: true, winding: true, edges: true, ...options.run };
  const tolerance = options.gapTolerance ?? DEFAULT_GAP_TOLERANCE;
  const grid = options.grid ?? DEFAULT_SHEET_GRID;
  const integerTolerance = options.winding?.tolerance ?? BAND_INTEGER_ACCURACY;
  const propagator: PropagatorOptions = { ...options.propagator, tolerance: options.propagator?.tolerance ?? verdictPropagatorTolerance(tolerance, integerTolerance) };
  // Edge counts are counts, not residual-tested integers: only the gap part of the rule applies to ribbons.
  const ribbonPropagator: PropagatorOptions = { ...options.propagator, tolerance: options.propagator?.tolerance ?? verdictPropagatorTolerance(tolerance, 0.01) };
  const chernOptions: ChernOptions = { initialGrid: Math.max(...grid), ...options.chern };
  const sampler = new FloquetSampler(drive, { propagator });

  let t = clock();
  const data = sampleQuasienergyGrid(sampler, grid);
  timings.bands = clock() - t;

  t = clock();
  const detected: DetectedGap[] = findGaps(sampler, data, {
    gapTolerance: tolerance,
    labels: options.labels,
    ...(options.gapEvaluations !== undefined ? { certificationBudget: options.gapEvaluations } : {}),
  });
  const gaps: GapReport[] = detected.map((g) => ({
    label: g.label,
    lower: g.lower,
    upper: g.upper,
    minimalGap: g.minimalGap,
    momentumAtMinimum: g.momentumAtMinimum,
    open: g.open,
    arcWidth: g.arcWidth,
    ...(g.certified ? { certified: g.certified } : {}),
  }));
  const ordered = orderFromCut(detected, options.cut ?? 1);
  const groups = bandGroups(data, ordered, tolerance);
  timings.gaps = clock() - t;

  t = clock();
  const bands: BandGroupReport[] = groups.map((g) => {
    const report: BandGroupReport = {
      index: g.index,
      branches: g.branches,
      gapBelow: g.gapBelow ?? NaN,
      gapAbove: g.gapAbove ?? NaN,
      range: g.range,
      minimalInternalGap: g.minimalInternalGap,
      touching: g.touching,
    };
    if (run.chern) report.chern = chernNumber(sampler, g.gapBelow, g.gapAbove, g.branches, chernOptions);
    return report;
  });
  timings.chern = clock() - t;

  t = clock();
  const windings: WindingReport[] =
    run.winding && ordered.length > 0
      ? gapWindingNumbers(
          drive,
          ordered.map((g) => g.label),
          { propagator: options.propagator, ...options.winding },
        )
      : [];
  timings.winding = clock() - t;

  t = clock();
  const ribbons: RibbonReport[] = [];
  if (run.edges && ordered.length > 0) {
    const { directions = [0, 1], ...perCut } = options.ribbon ?? {};
    for (const direction of directions) {
      const gaps = ordered.map((gap) => ({ arc: gap, bulkDecayLength: bulkDecayLength(data, gap, direction) }));
      ribbons.push(
        ribbonEdgeCounts(drive, gaps, {
          ...perCut,
          finiteDirection: direction,
          propagator: ribbonPropagator,
          ...(options.edges !== undefined ? { edges: options.edges } : {}),
        }),
      );
    }
  }
  timings.edges = clock() - t;

  t = clock();
  const declared = options.symmetries ?? {};
  const symmetries = declaredSymmetryReports(drive, declared, SYMMETRY_TOLERANCE, { ...options.propagator, tolerance: Math.min(options.propagator?.tolerance ?? Infinity, SYMMETRY_PROPAGATOR_TOLERANCE) });
  timings.symmetries = clock() - t;

  const consistency = consistencyChecks(ordered, bands, windings, ribbons, latticeOrientation(drive));
  return {
    kind: 'sheet',
    grid: grid.slice(),
    gaps,
    bands,
    windings,
    ribbons,
    consistency,
    propagatorAccuracy: sampler.worstPropagatorAccuracy,
    gapTolerance: tolerance,
    cut: ordered.length > 0 ? ordered[0].label : NaN,
    eigenResidual: sampler.worstEigenResidual,
    floquetEvaluations: sampler.evaluations,
    symmetries,
    symmetryClass: declaredSymmetryClass(declared),
    timings,
  };
}

const fmt = (x: number): string => (Number.isFinite(x) ? x.toFixed(4) : String(x));

/** The relations between C, W and edge counts, each reported with its inputs. */
export function consistencyChecks(
  ordered: GapReport[],
  bands: BandGroupReport[],
  windings: WindingReport[],
  ribbons: RibbonReport[],
  orientation: 1 | -1 = 1,
): ConsistencyCheck[] {
  const checks: ConsistencyCheck[] = [];
  const inconclusive = (name: string, detail: string): ConsistencyCheck => ({ name, holds: false, detail, inconclusive: true });
  const cherns = bands.map((b) => settledInteger(b.chern));
  if (bands.length > 0 && bands.every((b) => b.chern !== undefined)) {
    if (cherns.every((c) => c !== undefined)) {
      const sum = (cherns as number[]).reduce((a, b) => a + b, 0);
      checks.push({ name: 'chern-sum', holds: sum === 0, detail: `Σ C over all band groups = ${sum} (must be 0): ${cherns.join(', ')}` });
    } else checks.push(inconclusive('chern-sum', 'Σ C = 0 not tested: a Chern number is unsettled'));
  }
  const windingAt = (label: number): number | undefined => settledInteger(windings.find((w) => Math.abs(w.gap - label) < 1e-9)?.winding);
  if (windings.length > 0) {
    for (const band of bands) {
      if (!Number.isFinite(band.gapBelow)) continue;
      const name = `winding-step:band-${band.index}`;
      const below = windingAt(band.gapBelow), above = windingAt(band.gapAbove), c = settledInteger(band.chern);
      if (below === undefined || above === undefined || c === undefined) {
        checks.push(inconclusive(name, `W(${fmt(band.gapAbove)}) − W(${fmt(band.gapBelow)}) = C not tested: an input is unsettled`));
      } else {
        checks.push({ name, holds: above - below === c, detail: `W(${fmt(band.gapAbove)}) − W(${fmt(band.gapBelow)}) = ${above} − ${below} = ${above - below}, C = ${c}` });
      }
    }
  }
  for (const ribbon of ribbons) {
    for (const edge of ['low', 'high'] as const) {
      const sign = edgeSign(ribbon.finiteDirection, edge, orientation);
      const countAt = (label: number): number | null | undefined => ribbon.counts.find((c) => c.edge === edge && Math.abs(c.gap - label) < 1e-9)?.count;
      if (windings.length > 0) {
        for (const gap of ordered) {
          const name = `edge-winding:f${ribbon.finiteDirection}:${edge}:${fmt(gap.label)}`;
          const n = countAt(gap.label), w = windingAt(gap.label);
          if (n === null || n === undefined || w === undefined) checks.push(inconclusive(name, 'edge count or winding number unsettled'));
          else checks.push({ name, holds: n === sign * w, detail: `${edge}-edge count ${n} on the ribbon finite along a${ribbon.finiteDirection + 1}, expected ${sign > 0 ? '+' : '−'}W = ${sign * w}` });
        }
      }
      for (const band of bands) {
        if (!Number.isFinite(band.gapBelow) || ordered.length < 2) continue;
        const name = `edge-step:f${ribbon.finiteDirection}:${edge}:band-${band.index}`;
        const lo = countAt(band.gapBelow), hi = countAt(band.gapAbove), c = settledInteger(band.chern);
        if (lo === null || lo === undefined || hi === null || hi === undefined || c === undefined) checks.push(inconclusive(name, 'edge count or Chern number unsettled'));
        else {
          checks.push({
            name,
            holds: hi - lo === sign * c,
            detail: `${edge}-edge counts ${hi} (gap ${fmt(band.gapAbove)}) − ${lo} (gap ${fmt(band.gapBelow)}) = ${hi - lo}, expected ${sign > 0 ? '+' : '−'}C = ${sign * c}`,
          });
        }
      }
    }
  }
  return checks;
}
