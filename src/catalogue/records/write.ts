/**
 * Writes results records to disk: results/models/<id>.json per model,
 * results/catalogue.json, and results/timings.json (machine-dependent, kept
 * apart so that the records themselves are byte-identical between runs).
 *
 * Records are per model and incremental: `strobe check` writes each record the
 * moment its model finishes (writeRecordFile), so a run that is killed keeps
 * every model it reported, and checking one file replaces that model's record
 * only. At the end of a run (finishResults) the summary is rebuilt from every
 * record in the folder, not just this run's. Every file is written to a
 * temporary name and renamed, which is atomic on one file system: a reader
 * (the site build, a concurrent run) sees the old file or the new one, never
 * half a file.
 */
import { mkdirSync, readdirSync, readFileSync, renameSync, rmSync, writeFileSync } from 'node:fs';
import { randomBytes } from 'node:crypto';
import { dirname, join } from 'node:path';
import type { CatalogueSummary, ModelRecord, ModelTimings } from './model-record.ts';
import { canonicalJson } from './canonical-json.ts';
import { readRecordFolder } from './read-records.ts';
import { isRecordId } from './record-id.ts';
import { summarize } from './summary.ts';

const TEMPORARY = /\.(\d+)\.[0-9a-f]{12}\.tmp$/;

export function writeTextAtomic(file: string, text: string): void {
  mkdirSync(dirname(file), { recursive: true });
  const temp = `${file}.${process.pid}.${randomBytes(6).toString('hex')}.tmp`;
  try {
    writeFileSync(temp, text);
    renameSync(temp, file);
  } catch (error) {
    rmSync(temp, { force: true });
    throw error;
  }
}

/** Whether a process with this id is running (a leftover of a dead one may be removed). */
export function processAlive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (error) {
    return (error as NodeJS.ErrnoException).code === 'EPERM';
  }
}

/** Removes temporary files left by runs that were killed mid-write (their process is gone). */
export function removeStaleTemporaries(folder: string): void {
  let names: string[];
  try {
    names = readdirSync(folder);
  } catch {
    return;
  }
  for (const name of names) {
    const m = TEMPORARY.exec(name);
    if (m && !processAlive(Number(m[1]))) rmSync(join(folder, name), { force: true });
  }
}

/** Path of a model's record; refuses ids that could leave the folder or collide with its own files. */
export function recordFile(outDir: string, id: string): string {
  if (!isRecordId(id)) throw new RangeError(`unsafe record id ${JSON.stringify(id)}`);
  return join(outDir, 'models', `${id}.json`);
}

/** Writes one model's record, atomically. */
export function writeRecordFile(outDir: string, record: ModelRecord): string {
  const file = recordFile(outDir, record.id);
  writeTextAtomic(file, canonicalJson(record));
  return file;
}

export interface FinishOptions {
  /** Remove records of models not among these ids (only for runs over the whole inventory). */
  keep?: ReadonlySet<string>;
}

/**
 * The end of a run: prunes when asked, writes the summary (for a shard: of this
 * run's records, to catalogue.shard-i-of-n.json; else of every record in the
 * folder) and merges this run's timings into the timings file.
 */
export function finishResults(
  outDir: string,
  runSummary: CatalogueSummary,
  timings: Record<string, ModelTimings>,
  options: FinishOptions = {},
): { files: string[]; problems: string[] } {
  const modelsDir = join(outDir, 'models');
  mkdirSync(modelsDir, { recursive: true });
  if (options.keep) {
    for (const name of readdirSync(modelsDir)) if (name.endsWith('.json') && !options.keep.has(name.slice(0, -5))) rmSync(join(modelsDir, name));
  }
  const files: string[] = [];
  let problems: string[] = [];
  let summary = runSummary;
  const suffix = runSummary.shard === null ? '' : `.shard-${runSummary.shard.replace('/', '-of-')}`;
  if (runSummary.shard === null) {
    const folder = readRecordFolder(outDir);
    problems = folder.problems.map((p) => p.message);
    summary = summarize(folder.records, runSummary.engine, null);
  }
  const summaryFile = join(outDir, `catalogue${suffix}.json`);
  writeTextAtomic(summaryFile, canonicalJson(summary));
  files.push(summaryFile);

  const timingFile = join(outDir, `timings${suffix}.json`);
  let previous: Record<string, ModelTimings> = {};
  try {
    const old = JSON.parse(readFileSync(timingFile, 'utf8')) as { models?: Record<string, ModelTimings> };
    if (old && typeof old.models === 'object' && old.models !== null) previous = old.models;
  } catch {
    // no timings yet, or unreadable: start afresh (they are informative only)
  }
  const merged = Object.fromEntries(
    Object.entries({ ...previous, ...timings }).filter(([id]) => summary.models.some((m) => m.id === id)),
  );
  writeTextAtomic(
    timingFile,
    canonicalJson({ note: 'Machine-dependent compute times in milliseconds. Not deterministic; not part of the results records.', models: merged }),
  );
  files.push(timingFile);
  return { files, problems };
}

export interface WriteOptions {
  /** Remove records of models no longer in the catalogue (only for whole-catalogue runs). */
  prune?: boolean;
}

/** Writes a whole run at once: every record, then the summary and timings (finishResults). */
export function writeResults(
  outDir: string,
  records: ModelRecord[],
  summary: CatalogueSummary,
  timings: Record<string, ModelTimings>,
  options: WriteOptions = {},
): string[] {
  removeStaleTemporaries(join(outDir, 'models'));
  const written = records.map((record) => writeRecordFile(outDir, record));
  const keep = options.prune ? new Set(records.map((r) => r.id)) : undefined;
  return [...written, ...finishResults(outDir, summary, timings, keep ? { keep } : {}).files];
}
