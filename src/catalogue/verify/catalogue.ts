/**
 * Verifies a catalogue: load every model file, take unchanged models from the
 * cache, verify the rest in worker threads, and return records sorted by id
 * with the catalogue summary. Results do not depend on the number of workers
 * or the order in which models finish.
 */
import { join } from 'node:path';
import type { LoadedModel } from '../load.ts';
import { loadModels } from '../load.ts';
import type { CacheStats } from '../cache/store.ts';
import { ResultCache } from '../cache/store.ts';
import { cacheKey } from '../cache/cache-key.ts';
import type { EngineFingerprint } from '../cache/engine-fingerprint.ts';
import { engineFingerprint } from '../cache/engine-fingerprint.ts';
import type { CatalogueSummary, ModelRecord, ModelTimings } from '../records/model-record.ts';
import { failedRecord, invalidRecord } from '../records/record-builder.ts';
import { summarize } from '../records/summary.ts';
import { compareCodePoints } from '../records/canonical-json.ts';
import type { ShardSpec } from '../shard.ts';
import { formatShard, inShard } from '../shard.ts';
import type { TaskOutcome } from '../workers/pool.ts';
import { runTasks } from '../workers/pool.ts';
import type { VerifyTask } from '../workers/verify-task.ts';
import type { VerdictPolicy } from './policy.ts';
import { DEFAULT_POLICY } from './policy.ts';
import type { ModelOutcome } from './verify-model.ts';

export interface ProgressEvent {
  id: string;
  /** 0-based position among the models of this run (sorted by id). */
  index: number;
  total: number;
  /** "cached", "started", an engine step such as "analysing", or "done". */
  step: string;
  /** Milliseconds since this model started (0 for cache hits). */
  elapsedMs: number;
}

export interface VerifyCatalogueOptions {
  /** Worker threads (default os.availableParallelism(); 0 runs in this thread). */
  workers?: number;
  /** true (default): .strobe-cache/ under the working directory; false: no cache; or a cache object. */
  cache?: boolean | ResultCache;
  shard?: ShardSpec;
  /** Per-model time limit in milliseconds (default none). */
  timeLimitMs?: number;
  onProgress?: (event: ProgressEvent) => void;
  policy?: VerdictPolicy;
  /** Module exporting handleTask (default the production task with the real engines). */
  taskModule?: string;
  /** Engine identity override (tests). */
  engine?: EngineFingerprint;
}

export interface CatalogueReport {
  records: ModelRecord[];
  summary: CatalogueSummary;
  /** Machine-dependent: compute time per model id. */
  timings: Record<string, ModelTimings>;
  cache: CacheStats | null;
  /** Corrupt cache entries found (and recomputed), with the reason. */
  cacheProblems: string[];
}

export function defaultTaskModule(): string {
  return join(process.cwd(), 'src', 'catalogue', 'workers', 'verify-task.ts');
}

/** The cache key of one loaded model under an engine and policy. */
export function modelCacheKey(model: LoadedModel, engine: EngineFingerprint, policy: VerdictPolicy, overrides?: Record<string, number>): string {
  return cacheKey({ content: model.document, engine, options: { policy }, ...(overrides ? { overrides } : {}) });
}

function failureId(file: string, id: string | undefined): string {
  return id ?? file.replace(/^.*\//, '').replace(/\.json$/, '');
}

export async function verifyCatalogue(paths: string[], options: VerifyCatalogueOptions = {}): Promise<CatalogueReport> {
  const engine = options.engine ?? engineFingerprint();
  const identity = { version: engine.version, numericsHash: engine.numericsHash };
  const policy = options.policy ?? DEFAULT_POLICY;
  const cache = options.cache === false ? null : options.cache instanceof ResultCache ? options.cache : new ResultCache();
  const loaded = await loadModels(paths);

  const records: ModelRecord[] = [];
  const timings: Record<string, ModelTimings> = {};
  const cacheProblems: string[] = [];
  const taken = new Set(loaded.models.map((m) => m.id));
  for (const failure of loaded.failures) {
    let id = failureId(failure.file, failure.id);
    // A second file claiming a used id must not overwrite that model's record.
    for (let n = 2; taken.has(id); n++) id = `${failureId(failure.file, failure.id)}--duplicate-${n}`;
    taken.add(id);
    if (!inShard(id, options.shard)) continue;
    records.push(invalidRecord(identity, id, failure.file, failure.diagnostics));
    timings[id] = { totalMs: 0, stages: {}, cached: false };
  }

  const models = loaded.models.filter((m) => inShard(m.id, options.shard)).sort((a, b) => compareCodePoints(a.id, b.id));
  const total = models.length;
  const pending: { model: LoadedModel; key: string; index: number }[] = [];
  models.forEach((model, index) => {
    const key = modelCacheKey(model, engine, policy);
    const hit = cache?.read<ModelOutcome>(key);
    if (hit?.state === 'hit') {
      records.push(hit.value.record);
      timings[model.id] = { totalMs: 0, stages: hit.value.timings.stages, cached: true };
      options.onProgress?.({ id: model.id, index, total, step: 'cached', elapsedMs: 0 });
      return;
    }
    if (hit?.state === 'corrupt') cacheProblems.push(hit.reason);
    pending.push({ model, key, index });
  });

  const tasks: VerifyTask[] = pending.map(({ model }) => ({ model, engine: identity, policy }));
  const started = new Map<number, number>();
  // One model left and no time limit (the usual warm run): starting a worker thread would cost
  // more than the model, and there is nothing to enforce, so it runs in this thread.
  const size = options.workers ?? (tasks.length <= 1 && options.timeLimitMs === undefined ? 0 : undefined);
  const outcomes = await runTasks<VerifyTask, ModelOutcome>(tasks, {
    entry: options.taskModule ?? defaultTaskModule(),
    ...(size !== undefined ? { size } : {}),
    ...(options.timeLimitMs !== undefined ? { timeLimitMs: options.timeLimitMs } : {}),
    onProgress: (i, step) => {
      if (step === 'started') started.set(i, performance.now());
      const p = pending[i];
      options.onProgress?.({ id: p.model.id, index: p.index, total, step, elapsedMs: performance.now() - (started.get(i) ?? performance.now()) });
    },
    onSettled: (i, outcome) => {
      const p = pending[i];
      options.onProgress?.({ id: p.model.id, index: p.index, total, step: outcome.state === 'done' ? 'done' : outcome.state, elapsedMs: outcome.elapsedMs });
    },
  });

  outcomes.forEach((outcome: TaskOutcome<ModelOutcome>, i) => {
    const { model, key } = pending[i];
    if (outcome.state === 'done') {
      records.push(outcome.result.record);
      timings[model.id] = outcome.result.timings;
      if (cache && outcome.result.record.status !== 'failed') cache.write(key, outcome.result);
      return;
    }
    const kind = outcome.state === 'timed-out' ? 'timed-out' : outcome.state === 'crashed' ? 'crashed' : 'error';
    const message = outcome.state === 'threw' ? `the engine raised an error: ${outcome.message}` : outcome.message;
    records.push(failedRecord(identity, model, kind, message));
    timings[model.id] = { totalMs: outcome.elapsedMs, stages: {}, cached: false };
  });

  records.sort((a, b) => compareCodePoints(a.id, b.id) || compareCodePoints(a.file, b.file));
  const summary = summarize(records, identity, options.shard ? formatShard(options.shard) : null);
  return { records, summary, timings, cache: cache ? { ...cache.stats } : null, cacheProblems };
}
