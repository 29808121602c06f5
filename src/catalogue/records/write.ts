/**
 * Writes results records to disk: results/models/<id>.json per model,
 * results/catalogue.json, and results/timings.json (machine-dependent, kept
 * apart so that the records themselves are byte-identical between runs).
 * Files are written via a temporary file and a rename so a reader (the site
 * build) never sees half a record.
 */
import { mkdirSync, readdirSync, renameSync, rmSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import type { CatalogueSummary, ModelRecord, ModelTimings } from './model-record.ts';
import { canonicalJson } from './canonical-json.ts';

export function writeTextAtomic(file: string, text: string): void {
  mkdirSync(dirname(file), { recursive: true });
  const temp = `${file}.${process.pid}.tmp`;
  writeFileSync(temp, text);
  renameSync(temp, file);
}

export interface WriteOptions {
  /** Remove records of models no longer in the catalogue (only for whole-catalogue runs). */
  prune?: boolean;
}

export function writeResults(
  outDir: string,
  records: ModelRecord[],
  summary: CatalogueSummary,
  timings: Record<string, ModelTimings>,
  options: WriteOptions = {},
): string[] {
  const written: string[] = [];
  const modelsDir = join(outDir, 'models');
  mkdirSync(modelsDir, { recursive: true });
  for (const record of records) {
    const file = join(modelsDir, `${record.id}.json`);
    writeTextAtomic(file, canonicalJson(record));
    written.push(file);
  }
  if (options.prune) {
    const keep = new Set(records.map((r) => `${r.id}.json`));
    for (const name of readdirSync(modelsDir)) if (name.endsWith('.json') && !keep.has(name)) rmSync(join(modelsDir, name));
  }
  const summaryName = summary.shard === null ? 'catalogue.json' : `catalogue.shard-${summary.shard.replace('/', '-of-')}.json`;
  writeTextAtomic(join(outDir, summaryName), canonicalJson(summary));
  written.push(join(outDir, summaryName));
  const timingName = summary.shard === null ? 'timings.json' : `timings.shard-${summary.shard.replace('/', '-of-')}.json`;
  const timingText = canonicalJson({
    note: 'Machine-dependent compute times in milliseconds. Not deterministic; not part of the results records.',
    models: timings,
  });
  writeTextAtomic(join(outDir, timingName), timingText);
  written.push(join(outDir, timingName));
  return written;
}
