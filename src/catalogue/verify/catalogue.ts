/**
 * Verifies a catalogue: load every model file, take unchanged models from the
 * cache, verify the rest in worker threads, and return records sorted by id
 * with the catalogue summary. Results do not depend on the number of workers
 * or the order in which models finish.
 *
 * Sharded runs (--shard i/n, n > 1) split the work two ways: each model's
 * claims are verified by the one shard that owns the model (shard.ts), and the
 * points of every declared sweep are spread over all shards (point p to shard
 * (p mod n) + 1). A shard's records then carry no sweeps; its points come back
 * as sweep parts (sweep-part.ts), and `strobe merge` puts the records together
 * again, identical to those of a whole run.
 */
import { join } from 'node:path';
import type { LoadedModel, ModelFailure } from '../load.ts';
import { diagnosticFor, loadModels } from '../load.ts';
import type { CacheStats } from '../cache/store.ts';
import { ResultCache } from '../cache/store.ts';
import { cacheKey } from '../cache/cache-key.ts';
import type { EngineFingerprint } from '../cache/engine-fingerprint.ts';
import { engineFingerprint } from '../cache/engine-fingerprint.ts';
import type { BudgetRecord, CatalogueSummary, ModelRecord, ModelTimings } from '../records/model-record.ts';
import { failedRecord, invalidRecord } from '../records/record-builder.ts';
import { summarize } from '../records/summary.ts';
import { compareCodePoints } from '../records/canonical-json.ts';
import type { ShardSpec } from '../shard.ts';
import { formatShard, inShard } from '../shard.ts';
import type { TaskOutcome } from '../workers/pool.ts';
import { runTasks } from '../workers/pool.ts';
import type { VerifyTask } from '../workers/verify-task.ts';
import { recordIdForFile } from '../inventory.ts';
import { estimateWork } from '../budget/work-estimate.ts';
import { budgetIssue, limitsFor, type LimitOptions } from '../budget/limits.ts';
import type { VerdictPolicy } from './policy.ts';
import { DEFAULT_POLICY } from './policy.ts';
import type { ModelOutcome } from './verify-model.ts';
import { modelSetup } from './verify-model.ts';
import type { EngineSet } from './engines.ts';
import { realEngines } from './real-engines.ts';
import { pointCacheFor, runSweepPoints, sweepSize } from '../sweep/sweep-grid.ts';
import type { SweepPart } from '../sweep/sweep-part.ts';
import { makeSweepPart } from '../sweep/sweep-part.ts';
import { shardOfPoint } from '../shard.ts';

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

export interface VerifyCatalogueOptions extends LimitOptions {
  /**
   * Worker threads (default os.availableParallelism()). 0 runs in this thread, where a
   * running model cannot be stopped: time limits are then enforced only when
   * timeLimitSeconds is given (one worker thread is used for it); the work estimate
   * refuses over-budget models either way.
   */
  workers?: number;
  /** true (default): .strobe-cache/ under the working directory; false: no cache; or a cache object. */
  cache?: boolean | ResultCache;
  shard?: ShardSpec;
  onProgress?: (event: ProgressEvent) => void;
  /**
   * Called with each record as soon as it is final, before its progress event
   * and before the next model is reported: whatever a progress line says
   * finished has been handed over (`strobe check` writes it to disk here).
   */
  onRecord?: (record: ModelRecord, timing: ModelTimings) => void;
  policy?: VerdictPolicy;
  /** Module exporting handleTask (default the production task with the real engines). */
  taskModule?: string;
  /** Engine identity override (tests). */
  engine?: EngineFingerprint;
  /** Engines for the sweep points of a sharded run (default the real ones). */
  engines?: EngineSet;
}

export interface CatalogueReport {
  records: ModelRecord[];
  summary: CatalogueSummary;
  /** Machine-dependent: compute time per model id. */
  timings: Record<string, ModelTimings>;
  cache: CacheStats | null;
  /** Corrupt cache entries found (and recomputed), with the reason. */
  cacheProblems: string[];
  /** Sharded runs: this shard's points of every declared sweep of every model (records then carry no sweeps). */
  sweepParts: SweepPart[];
}

export function defaultTaskModule(): string {
  return join(process.cwd(), 'src', 'catalogue', 'workers', 'verify-task.ts');
}

/** The cache key of one loaded model under an engine and policy. */
export function modelCacheKey(model: LoadedModel, engine: EngineFingerprint, policy: VerdictPolicy, overrides?: Record<string, number>, deferSweeps = false): string {
  return cacheKey({ content: model.document, engine, options: deferSweeps ? { policy, sweeps: 'deferred' } : { policy }, ...(overrides ? { overrides } : {}) });
}

/** Record ids of the files that did not load: the id they claim, else one made from the file name; never one in use. */
function failureIds(failures: ModelFailure[], taken: Set<string>): string[] {
  return failures.map((failure) => {
    const base = failure.id ?? recordIdForFile(failure.file);
    let id = base;
    // A second file claiming a used id must not overwrite that model's record.
    for (let n = 2; taken.has(id); n++) id = `${base}--duplicate-${n}`;
    taken.add(id);
    return id;
  });
}

function budgetRecord(model: LoadedModel, options: LimitOptions): { budget: BudgetRecord; refusal?: ReturnType<typeof budgetIssue> } {
  const estimate = estimateWork(model.document);
  const limits = limitsFor(model.document, options);
  const budget: BudgetRecord = {
    ...limits,
    estimate: {
      seconds: estimate.seconds,
      memoryBytes: estimate.memoryBytes,
      stages: estimate.stages.map((s) => ({ stage: s.stage, seconds: s.seconds, memoryBytes: s.memoryBytes, detail: s.detail })),
    },
  };
  const refusal = budgetIssue(estimate, limits);
  return refusal ? { budget, refusal } : { budget };
}

/** Smallest heap a worker gets, whatever --memory-limit says (MB). */
const WORKER_HEAP_FLOOR_MB = 512;

export async function verifyCatalogue(paths: string[], options: VerifyCatalogueOptions = {}): Promise<CatalogueReport> {
  const engine = options.engine ?? engineFingerprint();
  const identity = { version: engine.version, numericsHash: engine.numericsHash };
  const policy = options.policy ?? DEFAULT_POLICY;
  const cache = options.cache === false ? null : options.cache instanceof ResultCache ? options.cache : new ResultCache();
  const loaded = await loadModels(paths);

  const records: ModelRecord[] = [];
  const timings: Record<string, ModelTimings> = {};
  const cacheProblems: string[] = [];
  /** Final touches every record gets from this run (its file, fingerprint and limits), then it is handed over. */
  const emit = (record: ModelRecord, timing: ModelTimings, from?: { model: LoadedModel; budget: BudgetRecord }) => {
    const final = from ? { ...record, file: from.model.file, sourceHash: from.model.sourceHash, budget: from.budget } : record;
    records.push(final);
    timings[final.id] = timing;
    options.onRecord?.(final, timing);
    return final;
  };

  const taken = new Set(loaded.models.map((m) => m.id));
  failureIds(loaded.failures, taken).forEach((id, i) => {
    const failure = loaded.failures[i];
    if (!inShard(id, options.shard)) return;
    emit({ ...invalidRecord(identity, id, failure.file, failure.diagnostics), sourceHash: failure.sourceHash }, { totalMs: 0, stages: {}, cached: false });
  });

  const deferSweeps = options.shard !== undefined && options.shard.count > 1;
  const models = loaded.models.filter((m) => inShard(m.id, options.shard)).sort((a, b) => compareCodePoints(a.id, b.id));
  const total = models.length;
  const pending: { model: LoadedModel; key: string; index: number; budget: BudgetRecord }[] = [];
  models.forEach((model, index) => {
    const { budget, refusal } = budgetRecord(model, options);
    if (refusal) {
      const diagnostic = diagnosticFor(model.file, model.source, refusal);
      emit(failedRecord(identity, model, 'over-budget', `${diagnostic.file}:${diagnostic.line}:${diagnostic.column} ${refusal.message}`, [diagnostic]), { totalMs: 0, stages: {}, cached: false }, { model, budget });
      options.onProgress?.({ id: model.id, index, total, step: 'over-budget', elapsedMs: 0 });
      return;
    }
    const key = modelCacheKey(model, engine, policy, undefined, deferSweeps);
    const hit = cache?.read<ModelOutcome>(key);
    if (hit?.state === 'hit') {
      emit(hit.value.record, { totalMs: 0, stages: hit.value.timings.stages, cached: true }, { model, budget });
      options.onProgress?.({ id: model.id, index, total, step: 'cached', elapsedMs: 0 });
      return;
    }
    if (hit?.state === 'corrupt') cacheProblems.push(hit.reason);
    pending.push({ model, key, index, budget });
  });

  const tasks: VerifyTask[] = pending.map(({ model }) => ({ model, engine: identity, policy, ...(deferSweeps ? { deferSweeps } : {}), ...(cache ? { cacheRoot: cache.root } : {}) }));
  const started = new Map<number, number>();
  await runTasks<VerifyTask, ModelOutcome>(tasks, {
    entry: options.taskModule ?? defaultTaskModule(),
    ...(options.workers !== undefined ? { size: options.workers } : {}),
    // workers: 0 asks for this thread, where nothing can stop a model; an explicit time limit still gets its worker.
    ...(options.workers === 0 && options.timeLimitSeconds === undefined ? {} : { timeLimitMs: (i: number) => 1000 * pending[i].budget.timeLimitSeconds }),
    // The memory limit also caps each worker's JavaScript heap, so a model that outgrows it ends its worker only
    // (never below WORKER_HEAP_FLOOR_MB: the loader and the engine's modules need room of their own).
    ...(pending.length > 0 ? { heapLimitMb: Math.max(WORKER_HEAP_FLOOR_MB, Math.ceil(Math.max(...pending.map((p) => p.budget.memoryLimitBytes)) / 2 ** 20)) } : {}),
    onProgress: (i, step) => {
      if (step === 'started') started.set(i, performance.now());
      const p = pending[i];
      options.onProgress?.({ id: p.model.id, index: p.index, total, step, elapsedMs: performance.now() - (started.get(i) ?? performance.now()) });
    },
    onSettled: (i, settled) => {
      const { model, key, index, budget } = pending[i];
      const outcome = settled as TaskOutcome<ModelOutcome>;
      if (outcome.state === 'done') {
        emit(outcome.result.record, outcome.result.timings, { model, budget });
        if (cache && outcome.result.record.status !== 'failed') cache.write(key, outcome.result);
      } else {
        const kind = outcome.state === 'timed-out' ? 'timed-out' : outcome.state === 'crashed' ? 'crashed' : 'error';
        const message = outcome.state === 'threw' ? `the engine raised an error: ${outcome.message}` : outcome.message;
        emit(failedRecord(identity, model, kind, message), { totalMs: outcome.elapsedMs, stages: {}, cached: false }, { model, budget });
      }
      options.onProgress?.({ id: model.id, index, total, step: outcome.state === 'done' ? 'done' : outcome.state, elapsedMs: outcome.elapsedMs });
    },
  });

  records.sort((a, b) => compareCodePoints(a.id, b.id) || compareCodePoints(a.file, b.file));
  const summary = summarize(records, identity, options.shard ? formatShard(options.shard) : null);
  const sweepParts = deferSweeps ? shardSweepParts(loaded.models, options.shard!, identity, policy, options.engines ?? realEngines, cache) : [];
  return { records, summary, timings, cache: cache ? { ...cache.stats } : null, cacheProblems, sweepParts };
}

/**
 * This shard's points of the declared sweeps of every model (not only the
 * models the shard owns), computed here in order, each point taken from and
 * kept in the cache. A model whose sweeps do not evaluate has none (its
 * owner's record says why).
 */
function shardSweepParts(models: LoadedModel[], shard: ShardSpec, engine: { version: string; numericsHash: string }, policy: VerdictPolicy, engines: EngineSet, cache: ResultCache | null): SweepPart[] {
  const parts: SweepPart[] = [];
  for (const model of [...models].sort((a, b) => compareCodePoints(a.id, b.id))) {
    if ((model.document.sweeps ?? []).length === 0) continue;
    let setup;
    try {
      setup = modelSetup(model);
    } catch {
      continue;
    }
    for (const [position, spec] of setup.sweeps.entries()) {
      const indices = Array.from({ length: sweepSize(spec) }, (_, i) => i).filter((i) => shardOfPoint(i, shard.count) === shard.index);
      const points = runSweepPoints(model, setup.claims, engines, policy, spec, setup.symmetricTimes, indices, undefined, cache ? pointCacheFor(cache, model, engine, policy, spec.quantities) : undefined);
      parts.push(makeSweepPart(engine, { id: model.id, file: model.file, document: model.document }, spec, shard, indices.map((index, k) => ({ index, point: points[k] })), position));
    }
  }
  return parts;
}
