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
import { existsSync, readFileSync } from 'node:fs';
import { resolve } from 'node:path';
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

/** The conventions document (Markdown) that every verdict on the site refers to. */
export function conventionsMarkdown(): string {
  return readFileSync(resolve('docs', 'conventions.md'), 'utf8');
}

/** The source text of a model file as it was verified (for downloads), or null. */
export function modelSource(record: ModelRecord): string | null {
  const file = loadSiteData().sources.get(record.id);
  return file !== undefined && existsSync(file) ? readFileSync(file, 'utf8') : null;
}

export const STATUS_TEXT: Record<ModelStatus, string> = {
  verified: 'verified',
  disputed: 'disputed',
  unsettled: 'unsettled',
  'portrait-only': 'no claims',
  invalid: 'invalid',
  failed: 'not computed',
};

export const STATUS_EXPLANATION: Record<ModelStatus, string> = {
  verified: 'every claim was confirmed by recomputation',
  disputed: 'at least one claim is contradicted by recomputation',
  unsettled: 'no claim is contradicted, but at least one could not be settled numerically',
  'portrait-only': 'the file makes no claims; the computed invariants are shown',
  invalid: 'the model file did not load or compile',
  failed: 'the computation did not finish',
};

/** Formats a quasienergy in units of π/T as text ("0", "π", "0.5π"). */
export function quasienergyText(value: number | null): string {
  if (value === null) return '—';
  if (Math.abs(value) < 1e-12) return '0';
  if (Math.abs(value - 1) < 1e-12) return 'π/T';
  return `${Number(value.toPrecision(4))}π/T`;
}

export function numberText(value: number | boolean | null | undefined, digits = 4): string {
  if (value === null || value === undefined) return '—';
  if (typeof value === 'boolean') return value ? 'yes' : 'no';
  if (Number.isInteger(value)) return String(value);
  if (Math.abs(value) !== 0 && (Math.abs(value) < 1e-3 || Math.abs(value) >= 1e5)) return value.toExponential(2);
  return String(Number(value.toPrecision(digits)));
}
