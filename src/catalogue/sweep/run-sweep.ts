/**
 * Sweeps asked for on the command line (`strobe sweep`): one or two parameters
 * of one model over a grid. Results are cached like verification results,
 * keyed by the model's content, the sweep and the engine.
 */
import { loadModels } from '../load.ts';
import type { LoadedModel } from '../load.ts';
import { cacheKey } from '../cache/cache-key.ts';
import { engineFingerprint, type EngineFingerprint } from '../cache/engine-fingerprint.ts';
import { ResultCache } from '../cache/store.ts';
import type { SweepRecord } from '../records/model-record.ts';
import { normalizeClaims } from '../verify/claims.ts';
import type { EngineSet } from '../verify/engines.ts';
import { DEFAULT_POLICY, type VerdictPolicy } from '../verify/policy.ts';
import { realEngines } from '../verify/real-engines.ts';
import { quantityEvaluator } from '../verify/verify-model.ts';
import { resolveModelPath } from '../verify/inspect.ts';
import { runSweepGrid, SWEEP_QUANTITIES, type SweepAxisValues, type SweepQuantity } from './sweep-grid.ts';

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

export async function runSweep(model: string | LoadedModel, vary: SweepVary[], quantities: SweepQuantity[], options: RunSweepOptions = {}): Promise<SweepRecord> {
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
  const spec = { name: options.name ?? vary.map((v) => v.name).join('-').toLowerCase(), title: null, axes, quantities };
  const engine = options.engine ?? engineFingerprint();
  const cache = options.cache === false ? null : options.cache instanceof ResultCache ? options.cache : new ResultCache();
  const key = cacheKey({ content: loaded.document, engine, options: { policy, sweep: spec } });
  const hit = cache?.read<SweepRecord>(key);
  if (hit?.state === 'hit') return hit.value;
  const claims = normalizeClaims(loaded.document, quantityEvaluator(loaded.parameters));
  const symmetricTimes = (loaded.document.claims?.symmetries?.chiral?.symmetricTimes ?? []).map((q, i) =>
    quantityEvaluator(loaded.parameters)(q, `/claims/symmetries/chiral/symmetricTimes/${i}`),
  );
  const result = runSweepGrid(loaded, claims, options.engines ?? realEngines, policy, spec, symmetricTimes, options.onProgress);
  cache?.write(key, result);
  return result;
}
