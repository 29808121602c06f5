/**
 * The site's only data access: reads the results records written by the
 * catalogue (results/catalogue.json and results/models/<id>.json) once per build,
 * and shapes them into the props pages and components render. Pages never read
 * files or compute physics themselves.
 */
import { existsSync, readFileSync, statSync } from 'node:fs';
import { join, resolve } from 'node:path';
import type { CatalogueSummary, ModelRecord, ModelStatus } from '../catalogue/records/model-record.ts';

export type { CatalogueSummary, ModelRecord, ModelStatus };

/** Folder the records are read from: STROBE_RESULTS, else ./results. */
export function resultsFolder(): string {
  return resolve(process.env.STROBE_RESULTS ?? 'results');
}

let cached: { summary: CatalogueSummary; records: Map<string, ModelRecord> } | null = null;

export function loadSiteData(): { summary: CatalogueSummary; records: Map<string, ModelRecord> } {
  if (cached) return cached;
  const folder = resultsFolder();
  const summaryFile = join(folder, 'catalogue.json');
  if (!existsSync(summaryFile)) {
    throw new Error(`No results at ${summaryFile}. Run \`npx strobe check\` first (it writes the records the site is built from).`);
  }
  const summary = JSON.parse(readFileSync(summaryFile, 'utf8')) as CatalogueSummary;
  const records = new Map<string, ModelRecord>();
  for (const entry of summary.models) {
    const file = join(folder, 'models', `${entry.id}.json`);
    if (existsSync(file)) records.set(entry.id, JSON.parse(readFileSync(file, 'utf8')) as ModelRecord);
  }
  cached = { summary, records };
  return cached;
}

/** The engine that produced the records the site is built from. */
export function siteEngine(): CatalogueSummary['engine'] {
  return loadSiteData().summary.engine;
}

/** A project document (docs/<name>.md). */
export function documentMarkdown(name: 'conventions' | 'model-format'): string {
  return readFileSync(resolve('docs', `${name}.md`), 'utf8');
}

/**
 * The records the site publishes, sorted by title: every record except drafts
 * (files marked "draft": true are verified but not published).
 */
export function publishedRecords(): ModelRecord[] {
  const { records } = loadSiteData();
  return [...records.values()].filter((r) => !r.model?.draft).sort((a, b) => (a.model?.title ?? a.id).localeCompare(b.model?.title ?? b.id) || a.id.localeCompare(b.id));
}

/**
 * The day a record was written (YYYY-MM-DD, UTC), from the file's modification
 * time; SOURCE_DATE_EPOCH (seconds), when set, replaces it so that builds can
 * be reproduced byte for byte. Records themselves carry no time on purpose.
 */
export function recordDate(record: Pick<ModelRecord, 'id'>): string | null {
  return fileDate(join(resultsFolder(), 'models', `${record.id}.json`));
}

/** The day the catalogue summary was written (same rules as recordDate). */
export function resultsDate(): string | null {
  return fileDate(join(resultsFolder(), 'catalogue.json'));
}

function fileDate(file: string): string | null {
  const epoch = process.env.SOURCE_DATE_EPOCH;
  if (epoch && /^\d+$/.test(epoch)) return new Date(Number(epoch) * 1000).toISOString().slice(0, 10);
  try {
    return statSync(file).mtime.toISOString().slice(0, 10);
  } catch {
    return null;
  }
}
