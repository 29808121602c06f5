/**
 * Quasienergy gaps and band groups of a sampled Floquet spectrum.
 *
 * Gap detection. Quasienergies live on a circle (circumference 2 in units of
 * π/T). On a grid, each band is only seen at sample points, so an empty arc in
 * the union of samples may be a true gap or a hole between two samples of a
 * steep band. We decide with spectral continuity: along every grid link
 * (k, k + step) the sorted eigenphases at both ends are matched by the cyclic
 * shift that minimises the total squared circular distance, and each matched
 * pair covers the short arc between its two values (the band passes through
 * it). Arcs covered by no sample and no link are the gaps. This is exact for
 * bands that move by less than half the mismatch to their neighbours between
 * adjacent grid points; refine the grid otherwise.
 *
 * Direct gap. For a gap named by c, the direct gap at k is the distance
 * between the two eigenvalues that bound c at that k. Its minimum is found on
 * the grid and then refined around the lowest few local minima by a pattern
 * search (moves of ±h in every direction, h halved when no move improves,
 * starting from half a grid spacing). The coarse grid only proposes
 * candidates: whether the gap is open is decided on a certified lower bound
 * of the minimum over the whole zone (certified-minimum.ts), from the
 * Lipschitz bound of quasienergies in momentum (evolution/momentum-lipschitz.ts):
 * each direct gap is the sum of two distances from c to the spectrum, so it
 * moves by at most 2 Σ_d L_d |δs_d|, as long as no band crosses c (the
 * distance from c to the spectrum, L-Lipschitz itself, guards that). The gap
 * is open when the lower bound exceeds the gap tolerance; the bracket
 * [lower bound, refined minimum] is reported with the evaluations it took.
 *
 * Band groups. Between two consecutive open gaps lie one or more eigenphase
 * branches; they are grouped (a band group) and flagged as touching when two
 * branches inside come closer than the gap tolerance somewhere.
 */
import type { GapReport } from '../portrait.ts';
import type { FloquetSampler, QuasienergyGrid } from '../quasienergy-bands.ts';
import { aboveCut, gridMomentum, gridNeighbour, wrapQuasienergy } from '../quasienergy-bands.ts';
import { certifiedMinimum } from '../certified-minimum.ts';
import { quasienergyLipschitz } from '../evolution/momentum-lipschitz.ts';

/** Default gap tolerance in units of π/T: gaps whose minimal direct gap is not above it count as closed. */
export const DEFAULT_GAP_TOLERANCE = 1e-3;
/** Empty arcs narrower than this (units π/T) are treated as rounding, not as gaps. */
export const MINIMAL_ARC_WIDTH = 1e-9;

export interface GapOptions {
  /** Minimal direct gap (units π/T) for a gap to count as open (default 1e-3). */
  gapTolerance?: number;
  /** Claimed gap labels (units π/T): a gap containing one is named by it. */
  labels?: number[];
  /** Step halvings of the local search around each grid minimum of the direct gap (default 14: resolution 2⁻¹⁵ grid spacings). */
  refinementLevels?: number;
  /** How many of the lowest grid minima to refine (default 3). */
  refinedMinima?: number;
  /** Most Floquet operators the certified lower bound may evaluate per gap (default 20000). */
  certificationBudget?: number;
  /** Once above the tolerance, the lower bound is pushed up to this fraction of the refined minimum (default 0.5; 0: stop at the tolerance). */
  certifiedFraction?: number;
}

/** Default budget of the certified lower bound, in Floquet operators per gap. */
export const DEFAULT_CERTIFICATION_BUDGET = 20000;
/** The lower bound is pushed up to at least this fraction of the refined minimum once it clears the tolerance. */
export const CERTIFIED_FRACTION = 0.5;

/** A gap with the diagnostics behind it. */
export interface DetectedGap extends GapReport {
  /** Number of extra Floquet operators evaluated while refining the minimum. */
  refinementEvaluations: number;
}

/** Position on [0, 2) used internally: x ↦ x mod 2. */
function circlePosition(x: number): number {
  return x - 2 * Math.floor(x / 2);
}

/** Arcs [start, end] on the unrolled circle (end − start < 2) covered by the spectrum. */
function coveredArcs(data: QuasienergyGrid): [number, number][] {
  const arcs: [number, number][] = [];
  const positions = data.samples.map((s) => Array.from(s.quasienergies, circlePosition).sort((a, b) => a - b));
  for (const p of positions) for (const x of p) arcs.push([x, x]);
  for (let i = 0; i < positions.length; i++) {
    for (let d = 0; d < data.grid.length; d++) {
      if (data.grid[d] < 2) continue;
      const j = gridNeighbour(data.grid, i, d);
      const a = positions[i], b = positions[j];
      const n = a.length;
      let bestShift = 0, bestCost = Infinity;
      for (let shift = 0; shift < n; shift++) {
        let cost = 0;
        for (let m = 0; m < n; m++) {
          const diff = wrapQuasienergy(b[(m + shift) % n] - a[m]);
          cost += diff * diff;
        }
        if (cost < bestCost) {
          bestCost = cost;
          bestShift = shift;
        }
      }
      for (let m = 0; m < n; m++) {
        const x = a[m];
        const diff = wrapQuasienergy(b[(m + bestShift) % n] - x);
        arcs.push(diff >= 0 ? [x, x + diff] : [x + diff, x]);
      }
    }
  }
  return arcs;
}

/** Empty arcs (lower, upper) as positions on [0, 2), upper possibly beyond 2 for the arc through 0. */
function emptyArcs(data: QuasienergyGrid): [number, number][] {
  const intervals: [number, number][] = [];
  for (const [s, e] of coveredArcs(data)) {
    // Normalise so that the start lies in [0, 2); split arcs that run past 2 or below 0.
    const start = circlePosition(s);
    const end = start + (e - s);
    if (end < 2) intervals.push([start, end]);
    else {
      intervals.push([start, 2]);
      intervals.push([0, end - 2]);
    }
  }
  if (intervals.length === 0) return [];
  intervals.sort((a, b) => a[0] - b[0]);
  const merged: [number, number][] = [];
  for (const iv of intervals) {
    const last = merged[merged.length - 1];
    if (last !== undefined && iv[0] <= last[1]) last[1] = Math.max(last[1], iv[1]);
    else merged.push([iv[0], iv[1]]);
  }
  const holes: [number, number][] = [];
  for (let i = 0; i + 1 < merged.length; i++) holes.push([merged[i][1], merged[i + 1][0]]);
  // The hole through the point 0 ≡ 2 joins the end of the last interval to the start of the first.
  holes.push([merged[merged.length - 1][1], merged[0][0] + 2]);
  return holes.filter(([lo, hi]) => hi - lo > MINIMAL_ARC_WIDTH);
}

/** Distance (units π/T) from the cut c to the nearest quasienergy. */
export function clearanceAt(quasienergies: Float64Array, cut: number): number {
  let d = Infinity;
  for (const x of quasienergies) {
    const a = aboveCut(x, cut);
    d = Math.min(d, a, 2 - a);
  }
  return d;
}

/** Direct gap around the cut c at one momentum: distance between the eigenvalues just above and just below c. */
export function directGapAt(quasienergies: Float64Array, cut: number): number {
  if (quasienergies.length === 0) return 2;
  let lowest = Infinity, highest = -Infinity;
  for (const x of quasienergies) {
    const a = aboveCut(x, cut);
    if (a < lowest) lowest = a;
    if (a > highest) highest = a;
  }
  return lowest + (2 - highest);
}

/**
 * Pattern (compass) search for the smallest direct gap near a grid minimum:
 * evaluate the 3^d − 1 neighbours at distance h per direction, move to the best
 * if it improves, else halve h; stop after `halvings` halvings.
 */
function refineMinimum(
  sampler: FloquetSampler,
  cut: number,
  start: number[],
  spacing: number[],
  halvings: number,
): { gap: number; momentum: number[]; evaluations: number } {
  let centre = start.slice();
  let step = spacing.map((h) => h / 2);
  let best = directGapAt(sampler.at(centre).quasienergies, cut);
  let evaluations = 0;
  const offsets: number[][] = [[]];
  for (let d = 0; d < centre.length; d++) {
    const grown: number[][] = [];
    for (const o of offsets) for (const x of [-1, 0, 1]) grown.push([...o, x]);
    offsets.splice(0, offsets.length, ...grown);
  }
  const moves = offsets.filter((o) => o.some((x) => x !== 0));
  let halved = 0, guard = 0;
  while (halved < halvings && guard++ < 50 * (halvings + 1)) {
    let next: number[] | undefined;
    for (const o of moves) {
      const s = centre.map((c, d) => c + o[d] * step[d]);
      const g = directGapAt(sampler.at(s).quasienergies, cut);
      evaluations++;
      if (g < best) {
        best = g;
        next = s;
      }
    }
    if (next !== undefined) centre = next;
    else {
      step = step.map((h) => h / 2);
      halved++;
    }
  }
  return { gap: best, momentum: centre.map((c) => c - Math.floor(c)), evaluations };
}

function labelInside(labels: number[] | undefined, lower: number, width: number): number | undefined {
  for (const label of labels ?? []) {
    const a = aboveCut(label, lower);
    if (a > 0 && a < width) return wrapQuasienergy(label);
  }
  return undefined;
}

/** Finds every gap of the sampled spectrum, with its minimal direct gap refined locally. */
export function findGaps(sampler: FloquetSampler, data: QuasienergyGrid, options: GapOptions = {}): DetectedGap[] {
  const tolerance = options.gapTolerance ?? DEFAULT_GAP_TOLERANCE;
  const levels = options.refinementLevels ?? 14;
  const refined = options.refinedMinima ?? 3;
  const slopes = quasienergyLipschitz(sampler.drive);
  // One evaluation errs by the time integration's bound on each of the two eigenvalues (and by rounding).
  const margin = 2 * Math.max(...data.samples.map((s) => s.propagatorAccuracy), 0) + 1e-12;
  const gaps: DetectedGap[] = [];
  for (const [lo, hi] of emptyArcs(data)) {
    const width = hi - lo;
    const label = labelInside(options.labels, lo, width) ?? wrapQuasienergy(lo + width / 2);
    const direct = data.samples.map((s) => directGapAt(s.quasienergies, label));
    // Local minima of the direct gap on the grid (periodic neighbours), lowest first.
    const minima: number[] = [];
    for (let i = 0; i < direct.length; i++) {
      let isMin = true;
      for (let d = 0; d < data.grid.length && isMin; d++) {
        if (data.grid[d] < 2) continue;
        if (direct[gridNeighbour(data.grid, i, d, 1)] < direct[i]) isMin = false;
        if (direct[gridNeighbour(data.grid, i, d, -1)] < direct[i]) isMin = false;
      }
      if (isMin) minima.push(i);
    }
    minima.sort((a, b) => direct[a] - direct[b]);
    let best = Infinity, where: number[] = [], evaluations = 0;
    for (const i of minima.slice(0, Math.max(1, refined))) {
      const spacing = data.grid.map((n) => 1 / n);
      const r = refineMinimum(sampler, label, gridMomentum(data.grid, i), spacing, levels);
      evaluations += r.evaluations;
      if (r.gap < best) {
        best = r.gap;
        where = r.momentum;
      }
    }
    if (minima.length === 0) {
      best = Math.min(...direct);
      where = gridMomentum(data.grid, direct.indexOf(best));
    }
    const bound = certifiedMinimum({
      evaluate: (s) => {
        const q = sampler.at(s).quasienergies;
        return { value: directGapAt(q, label), guard: clearanceAt(q, label) };
      },
      lipschitz: slopes.map((l) => 2 * l),
      guardLipschitz: slopes,
      grid: data.grid,
      initial: data.samples.map((s, i) => ({ value: direct[i], guard: clearanceAt(s.quasienergies, label) })),
      decisionLevel: tolerance,
      relative: 1 - (options.certifiedFraction ?? CERTIFIED_FRACTION),
      budget: options.certificationBudget ?? DEFAULT_CERTIFICATION_BUDGET,
      margin,
      knownBest: { value: best, at: where },
    });
    if (bound.best < best) {
      best = bound.best;
      where = bound.at;
    }
    gaps.push({
      label,
      lower: wrapQuasienergy(lo),
      upper: wrapQuasienergy(hi),
      minimalGap: best,
      momentumAtMinimum: where,
      open: bound.status === 'above',
      arcWidth: width,
      refinementEvaluations: evaluations + bound.evaluations,
      certified: {
        lower: Math.max(bound.lower, 0),
        status: bound.status,
        evaluations: bound.evaluations,
        cells: bound.cells,
        lipschitz: slopes.map((l) => 2 * l),
        margin,
        decisionLevel: tolerance,
      },
    });
  }
  return gaps;
}

/** The branches between two open gaps, on the band grid. */
export interface BandGroup {
  /** 0-based position counted upward from the cut gap. */
  index: number;
  branches: number;
  /** Labels of the bounding gaps (units π/T); null when the spectrum has no open gap. */
  gapBelow: number | null;
  gapAbove: number | null;
  /** Lowest and highest quasienergy of the group on the grid (units π/T); lower > upper when it runs through π. */
  range: [number, number];
  /** Smallest distance between two branches of the group on the grid (Infinity for one branch). */
  minimalInternalGap: number;
  /** True when branches inside the group come closer than the gap tolerance. */
  touching: boolean;
  /** False when the branch count changed across the grid (a gap closed between samples). */
  consistent: boolean;
}

/** Extent above `lower` (counter-clockwise, units π/T) of the arc from gap `lower` to gap `upper`; 2 for the whole circle. */
export function groupSpan(lower: number, upper: number): number {
  const span = aboveCut(upper, lower);
  return span === 0 ? 2 : span;
}

/** Column indices of the eigenvalues lying between gap labels `lower` and `upper` (counter-clockwise). */
export function groupColumns(quasienergies: Float64Array, lower: number | null, upper: number | null): number[] {
  const columns: number[] = [];
  if (lower === null || upper === null) return Array.from({ length: quasienergies.length }, (_, i) => i);
  const span = groupSpan(lower, upper);
  quasienergies.forEach((x, i) => {
    if (aboveCut(x, lower) < span) columns.push(i);
  });
  return columns;
}

/** Open gaps ordered upward from the cut gap: the gap containing `cut` (default 1, i.e. π/T), else the next one above it. */
export function orderFromCut(gaps: DetectedGap[], cut = 1): DetectedGap[] {
  const open = gaps.filter((g) => g.open);
  if (open.length === 0) return [];
  const containing = open.find((g) => {
    const a = aboveCut(cut, g.lower);
    return a > 0 && a < g.arcWidth;
  });
  const first = containing ?? open.slice().sort((a, b) => aboveCut(a.label, cut) - aboveCut(b.label, cut))[0];
  return open.slice().sort((a, b) => aboveCut(a.label, first.label) - aboveCut(b.label, first.label));
}

export function bandGroups(data: QuasienergyGrid, ordered: DetectedGap[], tolerance = DEFAULT_GAP_TOLERANCE): BandGroup[] {
  const labels: (number | null)[] = ordered.length === 0 ? [null] : ordered.map((g) => g.label);
  const groups: BandGroup[] = [];
  for (let i = 0; i < labels.length; i++) {
    const lower = labels[i];
    const upper = labels[(i + 1) % labels.length];
    const reference = lower ?? -1;
    let branches = -1, consistent = true, lowest = Infinity, highest = -Infinity, internal = Infinity;
    for (const sample of data.samples) {
      const cols = groupColumns(sample.quasienergies, lower, upper);
      if (branches === -1) branches = cols.length;
      else if (branches !== cols.length) consistent = false;
      const positions = cols.map((c) => aboveCut(sample.quasienergies[c], reference)).sort((a, b) => a - b);
      for (let m = 0; m < positions.length; m++) {
        lowest = Math.min(lowest, positions[m]);
        highest = Math.max(highest, positions[m]);
        if (m > 0) internal = Math.min(internal, positions[m] - positions[m - 1]);
      }
      if (lower === null && positions.length > 1) {
        internal = Math.min(internal, positions[0] + 2 - positions[positions.length - 1]);
      }
    }
    groups.push({
      index: i,
      branches: Math.max(0, branches),
      gapBelow: lower,
      gapAbove: upper,
      range: [wrapQuasienergy(reference + lowest), wrapQuasienergy(reference + highest)],
      minimalInternalGap: internal,
      touching: internal <= tolerance,
      consistent,
    });
  }
  return groups;
}
