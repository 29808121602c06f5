/**
 * Sweeps asked for on the command line (`strobe sweep`): one or two parameters
 * of one model over a grid. Results are cached like verification results,
 * keyed by the model's content, the sweep and the engine, and every point on
 * its own (sweep-grid.ts, pointCacheFor), so shards of a sweep run as separate
 * jobs share their points through a common cache directory. With a shard
 * (shard.ts) only that shard's points are computed and returned as a part
 * (sweep-part.ts) for `strobe merge`.
 */
import { loadModels } from '../load.ts';
import type { LoadedModel } from '../load.ts';
import { cacheKey } from '../cache/cache-key.ts';
import { engineFingerprint, type EngineFingerprint } from '../cache/engine-fingerprint.ts';
import { ResultCache } from '../cache/store.ts';
import type { SweepRecord } from '../records/model-record.ts';
import type { EngineSet } from '../verify/engines.ts';
import { DEFAULT_POLICY, type VerdictPolicy } from '../verify/policy.ts';
import { realEngines } from '../verify/real-engines.ts';
import { modelSetup } from '../verify/verify-model.ts';
import { resolveModelPath } from '../verify/inspect.ts';
import { assembleSweep, pointCacheFor, runSweepPoints, sweepSize, SWEEP_QUANTITIES, type SweepAxisValues, type SweepQuantity, type SweepSpec } from './sweep-grid.ts';
import type { SweepPart } from './sweep-part.ts';
import { makeSweepPart } from './sweep-part.ts';
import type { ShardSpec } from '../shard.ts';
import { shardOfPoint } from '../shard.ts';

export class SweepRequestError extends Error {}

export interface SweepVary {
  name: string;
  start: number;
  stop: number;
  count: number;
}

export interface RunSweepOptions {
  onProgress?: (done: number, total: number) => void;
  cache?: boolean | ResultCache;
  policy?: VerdictPolicy;
  engines?: EngineSet;
  engine?: EngineFingerprint;
  name?: string;
}

/** Parses NAME=start:stop:count as given to --vary. */
export function parseVary(text: string): SweepVary {
  const match = /^([A-Za-z][A-Za-z0-9_]*)=([^:]+):([^:]+):([^:]+)$/.exec(text.trim());
  if (!match) throw new SweepRequestError(`--vary expects NAME=start:stop:count such as m=-3:3:61, got "${text}"`);
  const [, name, a, b, c] = match;
  const start = Number(a), stop = Number(b), count = Number(c);
  if (!Number.isFinite(start) || !Number.isFinite(stop)) throw new SweepRequestError(`--vary ${text}: start and stop must be numbers`);
  if (!Number.isInteger(count) || count < 2 || count > 401) throw new SweepRequestError(`--vary ${text}: count must be an integer from 2 to 401`);
  return { name, start, stop, count };
}

async function loadOne(model: string | LoadedModel): Promise<LoadedModel> {
  if (typeof model !== 'string') return model;
  const path = resolveModelPath(model);
  const { models, failures } = await loadModels([path]);
  if (models.length === 0) {
    const d = failures[0]?.diagnostics[0];
    throw new SweepRequestError(d ? `${d.file}:${d.line}:${d.column} ${d.message}` : `${path} did not load`);
  }
  return models[0];
}

interface PreparedSweep {
  loaded: LoadedModel;
  spec: SweepSpec;
  policy: VerdictPolicy;
  engine: EngineFingerprint;
  cache: ResultCache | null;
  run(indices: number[], onProgress?: (done: number, total: number) => void): ReturnType<typeof runSweepPoints>;
}

async function prepareSweep(model: string | LoadedModel, vary: SweepVary[], quantities: SweepQuantity[], options: RunSweepOptions): Promise<PreparedSweep> {
  const loaded = await loadOne(model);
  if (vary.length < 1 || vary.length > 2) throw new SweepRequestError(`give one or two --vary options, got ${vary.length}`);
  const declared = Object.keys(loaded.document.parameters ?? {});
  for (const v of vary) {
    if (!declared.includes(v.name)) throw new SweepRequestError(`${loaded.file}: no parameter "${v.name}"; parameters are ${declared.join(', ') || '(none)'}`);
  }
  if (quantities.length === 0) quantities = loaded.document.lattice.dimension === 2 ? ['minimalGap', 'chern', 'winding'] : ['minimalGap', 'invariant'];
  const unknown = quantities.filter((q) => !SWEEP_QUANTITIES.includes(q));
  if (unknown.length > 0) throw new SweepRequestError(`unknown quantity "${unknown[0]}"; choose from ${SWEEP_QUANTITIES.join(', ')}`);
  const policy = options.policy ?? DEFAULT_POLICY;
  const axes: SweepAxisValues[] = vary.map((v) => ({ parameter: v.name, start: v.start, stop: v.stop, count: v.count }));
  const spec: SweepSpec = { name: options.name ?? vary.map((v) => v.name).join('-').toLowerCase(), title: null, axes, quantities };
  const engine = options.engine ?? engineFingerprint();
  const cache = options.cache === false ? null : options.cache instanceof ResultCache ? options.cache : new ResultCache();
  const { claims, symmetricTimes } = modelSetup(loaded);
  const points = cache ? pointCacheFor(cache, loaded, engine, policy, spec.quantities) : undefined;
  return {
    loaded,
    spec,
    policy,
    engine,
    cache,
    run: (indices, onProgress) => runSweepPoints(loaded, claims, options.engines ?? realEngines, policy, spec, symmetricTimes, indices, onProgress, points),
  };
}

export async function runSweep(model: string | LoadedModel, vary: SweepVary[], quantities: SweepQuantity[], options: RunSweepOptions = {}): Promise<SweepRecord> {
  const prepared = await prepareSweep(model, vary, quantities, options);
  const { loaded, spec, policy, engine, cache } = prepared;
  const key = cacheKey({ content: loaded.document, engine, options: { policy, sweep: spec } });
  const hit = cache?.read<SweepRecord>(key);
  if (hit?.state === 'hit') return hit.value;
  const total = sweepSize(spec);
  const points = prepared.run(Array.from({ length: total }, (_, i) => i), options.onProgress);
  const result = assembleSweep(spec, points);
  cache?.write(key, result);
  return result;
}

/** The part of a sweep owned by `shard`: every point whose index p has (p mod n) + 1 = i. */
export async function runSweepShard(model: string | LoadedModel, vary: SweepVary[], quantities: SweepQuantity[], shard: ShardSpec, options: RunSweepOptions = {}): Promise<SweepPart> {
  const prepared = await prepareSweep(model, vary, quantities, options);
  const total = sweepSize(prepared.spec);
  const indices = Array.from({ length: total }, (_, i) => i).filter((i) => shardOfPoint(i, shard.count) === shard.index);
  const points = prepared.run(indices, options.onProgress);
  return makeSweepPart(prepared.engine, { id: prepared.loaded.id, file: prepared.loaded.file, document: prepared.loaded.document }, prepared.spec, shard, indices.map((index, k) => ({ index, point: points[k] })));
}
