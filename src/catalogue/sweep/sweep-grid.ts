/**
 * Phase-diagram sweeps: one or two parameters varied over a grid (count
 * points from start to stop inclusive, first axis fastest); at each point the
 * model is recompiled with the parameters overridden (everything depending on
 * them is re-evaluated) and the requested quantities are mapped. A point that
 * cannot be computed (e.g. a duration turns negative) records why and the
 * sweep goes on. Values are settled integers or null, minimal gaps in π/T.
 *
 * Points are numbered p = 0 … total−1 (first axis fastest) and can be computed
 * in any subset (a shard: shard.ts) and in any order: a point depends only on
 * the model, its parameter values and the quantities asked for, and so is
 * cached on its own (`PointCache`), shareable between sweeps, runs and jobs.
 */
import type { LoadedModel } from '../load.ts';
import type { ResultCache } from '../cache/store.ts';
import { cacheKey } from '../cache/cache-key.ts';
import type { EngineFingerprint } from '../cache/engine-fingerprint.ts';
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

/** A cache of single sweep points: the store and the content key of a point's parameter values. */
export interface PointCache {
  cache: ResultCache;
  key(overrides: Record<string, number>): string;
}

/** Total number of points of a sweep. */
export function sweepSize(spec: SweepSpec): number {
  return spec.axes.map(axisValues).reduce((n, v) => n * v.length, 1);
}

/** Parameter values of point `index` (first axis fastest). */
export function pointParameters(spec: SweepSpec, index: number): Record<string, number> {
  const overrides: Record<string, number> = {};
  let rest = index;
  spec.axes.forEach((axis) => {
    const values = axisValues(axis);
    overrides[axis.parameter] = values[rest % values.length];
    rest = Math.floor(rest / values.length);
  });
  return overrides;
}

/** The record of a sweep from its points, in index order. */
export function assembleSweep(spec: SweepSpec, points: SweepPoint[]): SweepRecord {
  return {
    name: spec.name,
    title: spec.title,
    axes: spec.axes.map((axis) => ({ parameter: axis.parameter, values: axisValues(axis) })),
    quantities: [...spec.quantities],
    points,
  };
}

export function runSweepGrid(
  loaded: LoadedModel,
  claims: NormalizedClaim[],
  engines: EngineSet,
  policy: VerdictPolicy,
  spec: SweepSpec,
  symmetricTimes: number[],
  onPoint?: (done: number, total: number) => void,
  pointCache?: PointCache,
): SweepRecord {
  const total = sweepSize(spec);
  const points = runSweepPoints(loaded, claims, engines, policy, spec, symmetricTimes, Array.from({ length: total }, (_, i) => i), onPoint, pointCache);
  return assembleSweep(spec, points);
}

/** The points `indices` of a sweep (in that order), each taken from `pointCache` when there. */
export function runSweepPoints(
  loaded: LoadedModel,
  claims: NormalizedClaim[],
  engines: EngineSet,
  policy: VerdictPolicy,
  spec: SweepSpec,
  symmetricTimes: number[],
  indices: number[],
  onPoint?: (done: number, total: number) => void,
  pointCache?: PointCache,
): SweepPoint[] {
  if (spec.axes.length < 1 || spec.axes.length > 2) throw new RangeError(`sweep ${spec.name}: give one or two axes, got ${spec.axes.length}`);
  const labels = claimedGapLabels(claims);
  const gapLabels = labels.length > 0 ? labels : [0, 1];
  const skip = new Set<'chern' | 'winding' | 'edges'>(['edges']);
  if (!spec.quantities.includes('chern')) skip.add('chern');
  if (!spec.quantities.includes('winding')) skip.add('winding');
  const points: SweepPoint[] = [];
  indices.forEach((index, done) => {
    const overrides = pointParameters(spec, index);
    const key = pointCache?.key(overrides);
    const hit = key !== undefined ? pointCache!.cache.read<SweepPoint>(key) : undefined;
    let point: SweepPoint;
    if (hit?.state === 'hit') point = hit.value;
    else {
      point = sweepPoint(loaded, claims, engines, policy, spec.quantities, overrides, gapLabels, skip, symmetricTimes);
      if (key !== undefined && point.error === null) pointCache!.cache.write(key, point);
    }
    points.push(point);
    onPoint?.(done + 1, indices.length);
  });
  return points;
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

/**
 * The point cache of one model: a point's key is the model's canonical
 * content, the parameter values, the engine, the verdict policy and the
 * quantities, so the same point is shared by every sweep that passes through
 * it, in any run or job using the same cache directory.
 */
export function pointCacheFor(cache: ResultCache, loaded: LoadedModel, engine: Pick<EngineFingerprint, 'version' | 'numericsHash'>, policy: VerdictPolicy, quantities: SweepQuantity[]): PointCache {
  const sorted = [...quantities].sort();
  return { cache, key: (overrides) => cacheKey({ content: loaded.document, overrides, engine: { version: engine.version, numericsHash: engine.numericsHash, files: 0 }, options: { policy, sweepPoint: sorted } }) };
}
