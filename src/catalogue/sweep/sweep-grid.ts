/**
 * Phase-diagram sweeps: one or two parameters varied over a grid (count
 * points from start to stop inclusive, first axis fastest); at each point the
 * model is recompiled with the parameters overridden (everything depending on
 * them is re-evaluated) and the requested quantities are mapped. A point that
 * cannot be computed (e.g. a duration turns negative) records why and the
 * sweep goes on. Values are settled integers or null, minimal gaps in π/T.
 */
import type { LoadedModel } from '../load.ts';
import type { SweepPoint, SweepRecord } from '../records/model-record.ts';
import type { NormalizedClaim } from '../verify/claims.ts';
import { claimedGapLabels, gapKey } from '../verify/claims.ts';
import type { EngineSet } from '../verify/engines.ts';
import type { VerdictPolicy } from '../verify/policy.ts';
import { analysePoint } from '../verify/analyse-point.ts';
import { sameLabel } from '../verify/sheet-verdicts.ts';

export type SweepQuantity = 'minimalGap' | 'chern' | 'winding' | 'invariant';
export const SWEEP_QUANTITIES: readonly SweepQuantity[] = ['minimalGap', 'chern', 'winding', 'invariant'];

export interface SweepAxisValues {
  parameter: string;
  start: number;
  stop: number;
  count: number;
}

export interface SweepSpec {
  name: string;
  title: string | null;
  axes: SweepAxisValues[];
  quantities: SweepQuantity[];
}

/** count points from start to stop inclusive; the last is exactly `stop`. */
export function axisValues(axis: SweepAxisValues): number[] {
  if (!Number.isInteger(axis.count) || axis.count < 2) throw new RangeError(`sweep axis ${axis.parameter}: count must be an integer ≥ 2, got ${axis.count}`);
  return Array.from({ length: axis.count }, (_, i) => (i === axis.count - 1 ? axis.stop : axis.start + ((axis.stop - axis.start) * i) / (axis.count - 1)));
}

export function runSweepGrid(
  loaded: LoadedModel,
  claims: NormalizedClaim[],
  engines: EngineSet,
  policy: VerdictPolicy,
  spec: SweepSpec,
  symmetricTimes: number[],
  onPoint?: (done: number, total: number) => void,
): SweepRecord {
  if (spec.axes.length < 1 || spec.axes.length > 2) throw new RangeError(`sweep ${spec.name}: give one or two axes, got ${spec.axes.length}`);
  const values = spec.axes.map(axisValues);
  const total = values.reduce((n, v) => n * v.length, 1);
  const labels = claimedGapLabels(claims);
  const gapLabels = labels.length > 0 ? labels : [0, 1];
  const skip = new Set<'chern' | 'winding' | 'edges'>(['edges']);
  if (!spec.quantities.includes('chern')) skip.add('chern');
  if (!spec.quantities.includes('winding')) skip.add('winding');
  const points: SweepPoint[] = [];
  for (let n = 0; n < total; n++) {
    const overrides: Record<string, number> = {};
    let rest = n;
    spec.axes.forEach((axis, a) => {
      overrides[axis.parameter] = values[a][rest % values[a].length];
      rest = Math.floor(rest / values[a].length);
    });
    points.push(sweepPoint(loaded, claims, engines, policy, spec.quantities, overrides, gapLabels, skip, symmetricTimes));
    onPoint?.(n + 1, total);
  }
  return {
    name: spec.name,
    title: spec.title,
    axes: spec.axes.map((axis, a) => ({ parameter: axis.parameter, values: values[a] })),
    quantities: [...spec.quantities],
    points,
  };
}

function sweepPoint(
  loaded: LoadedModel,
  claims: NormalizedClaim[],
  engines: EngineSet,
  policy: VerdictPolicy,
  quantities: SweepQuantity[],
  overrides: Record<string, number>,
  gapLabels: number[],
  skip: Set<'chern' | 'winding' | 'edges'>,
  symmetricTimes: number[],
): SweepPoint {
  // Claims are judged at every point only to reuse one code path; sweeps keep the values, not the verdicts.
  let result;
  try {
    result = analysePoint(loaded, claims.filter((c) => c.kind !== 'anomalous'), engines, policy, { overrides, skip, symmetricTimes, extraLabels: gapLabels });
  } catch (error) {
    return { parameters: overrides, values: {}, error: error instanceof Error ? error.message : String(error) };
  }
  const out: Record<string, number | null> = {};
  if (quantities.includes('minimalGap')) {
    for (const label of gapLabels) {
      const gap = result.analysis.gaps.find((g) => sameLabel(g.label, label));
      out[`gap-${gapKey(label)}/minimal-gap`] = gap ? gap.minimalGap : 0;
    }
  }
  // Band numbers count upward from the cut and between the model's gaps. Where the cut gap is
  // closed the engine counts from another gap, and where one of the model's gaps is closed two
  // bands merge into one group: "band 0" would then name something else, so such points are
  // unsettled rather than showing the Chern number of a different group.
  const cutClaim = claims.find((c) => c.kind === 'chern');
  const requestedCut = cutClaim?.kind === 'chern' ? cutClaim.cut : 1;
  const engineCut = result.analysis.facts['cut'];
  const modelGapsOpen = gapLabels.every((label) => result.analysis.gaps.some((g) => sameLabel(g.label, label) && g.open));
  const cutHolds = engineCut !== undefined && sameLabel(engineCut, requestedCut) && modelGapsOpen;
  for (const e of result.entries) {
    if (quantities.includes('chern') && e.quantity === 'chern') out[e.id] = cutHolds ? e.value : null;
    if (quantities.includes('winding') && e.quantity === 'winding') out[e.id] = e.value;
    if (quantities.includes('invariant') && e.quantity === 'gap-invariant') out[e.id] = e.value;
  }
  return { parameters: overrides, values: out, error: null };
}
