/** Verification of a single model named by id or path, for `strobe inspect` and the site's detail pages. */
import { existsSync, statSync } from 'node:fs';
import { join } from 'node:path';
import type { ModelRecord, ModelTimings } from '../records/model-record.ts';
import type { VerifyCatalogueOptions } from './catalogue.ts';
import { verifyCatalogue } from './catalogue.ts';

export class ModelNotFoundError extends Error {}

/** A model file path for an id or path: the path itself if it is a file, else <modelsDir>/<id>.json. */
export function resolveModelPath(idOrPath: string, modelsDir = 'models'): string {
  if (existsSync(idOrPath) && statSync(idOrPath).isFile()) return idOrPath;
  const candidate = join(modelsDir, `${idOrPath.replace(/\.json$/, '')}.json`);
  if (existsSync(candidate)) return candidate;
  throw new ModelNotFoundError(`no model "${idOrPath}": neither a file nor ${candidate}`);
}

export interface InspectResult {
  record: ModelRecord;
  timings: ModelTimings;
}

export async function inspectModel(idOrPath: string, options: VerifyCatalogueOptions & { modelsDir?: string } = {}): Promise<InspectResult> {
  const path = resolveModelPath(idOrPath, options.modelsDir);
  const report = await verifyCatalogue([path], { workers: 0, ...options, shard: undefined });
  const record = report.records[0];
  if (!record) throw new ModelNotFoundError(`${path} holds no model`);
  return { record, timings: report.timings[record.id] ?? { totalMs: 0, stages: {}, cached: false } };
}
