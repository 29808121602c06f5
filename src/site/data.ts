/**
 * The site's only data access: reads the results records written by the
 * catalogue (results/models/<id>.json) once per build, keeps only those that
 * match the inventory's model files as they are now (a record per file, same
 * content hash: records/site-selection.ts), validates each against
 * schemas/report.schema.json, and shapes them into the props pages and
 * components render. Pages never read files or compute physics themselves.
 *
 * Environment (set by `strobe site`): STROBE_RESULTS, the results folder
 * (default ./results); STROBE_INVENTORY, a JSON list of the model files or
 * folders (default ["models"]).
 */
import { existsSync, readFileSync, statSync } from 'node:fs';
import { join, resolve } from 'node:path';
import type { CatalogueSummary, ModelRecord, ModelStatus } from '../catalogue/records/model-record.ts';
import { selectSiteRecords, selectionReport, type SkippedModel } from '../catalogue/records/site-selection.ts';
import { summarize } from '../catalogue/records/summary.ts';

export type { CatalogueSummary, ModelRecord, ModelStatus, SkippedModel };

/** Folder the records are read from: STROBE_RESULTS, else ./results. */
export function resultsFolder(): string {
  return resolve(process.env.STROBE_RESULTS ?? 'results');
}

/** The inventory the site must match: STROBE_INVENTORY (JSON list of paths), else ["models"]. */
export function inventoryPaths(): string[] {
  const raw = process.env.STROBE_INVENTORY;
  if (raw === undefined || raw === '') return ['models'];
  const parsed: unknown = JSON.parse(raw);
  if (!Array.isArray(parsed) || !parsed.every((p) => typeof p === 'string')) throw new Error(`STROBE_INVENTORY must be a JSON list of paths, got ${raw}`);
  return parsed;
}

/** Results that cannot be published (unreadable or invalid records): the build stops with this message. */
export class SiteDataError extends Error {}

interface SiteData {
  summary: CatalogueSummary;
  records: Map<string, ModelRecord>;
  sources: Map<string, string>;
  skipped: SkippedModel[];
}

let cached: SiteData | null = null;

export function loadSiteData(): SiteData {
  if (cached) return cached;
  const folder = resultsFolder();
  if (!existsSync(folder)) {
    throw new SiteDataError(`No results at ${folder}. Run \`npx strobe check\` first (it writes the records the site is built from).`);
  }
  const selection = selectSiteRecords(folder, inventoryPaths());
  if (selection.problems.length > 0) {
    throw new SiteDataError(`The results in ${folder} cannot be published:\n${selection.problems.map((p) => `  ${p.message}`).join('\n')}`);
  }
  const report = selectionReport(selection);
  if (report) console.warn(`strobe site: ${report}`);
  const engine = selection.records[0]?.engine ?? { version: 'none', numericsHash: '0'.repeat(64) };
  cached = {
    summary: summarize(selection.records, engine, null),
    records: new Map(selection.records.map((r) => [r.id, r])),
    sources: selection.sources,
    skipped: selection.skipped,
  };
  return cached;
}

/** The engine that produced the records the site is built from. */
export function siteEngine(): CatalogueSummary['engine'] {
  return loadSiteData().summary.engine;
}

/** The source text of a model file as it was verified (for downloads and drawings), or null. */
export function modelSourceText(record: Pick<ModelRecord, 'id'>): string | null {
  const file = loadSiteData().sources.get(record.id);
  return file !== undefined && existsSync(file) ? readFileSync(file, 'utf8') : null;
}

/** A project document (docs/<name>.md). */
export function documentMarkdown(name: string): string {
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
