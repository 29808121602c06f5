/**
 * The site's only data access: reads the results records written by the
 * catalogue (results/catalogue.json and results/models/<id>.json) once per build,
 * and shapes them into the props pages and components render. Pages never read
 * files or compute physics themselves.
 */
import { existsSync, readFileSync } from 'node:fs';
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

/** The conventions document (Markdown) that every verdict on the site refers to. */
export function conventionsMarkdown(): string {
  return readFileSync(resolve('docs', 'conventions.md'), 'utf8');
}

/** The source text of a model file as it was verified (for downloads), or null. */
export function modelSource(record: ModelRecord): string | null {
  const file = resolve(record.file);
  return existsSync(file) ? readFileSync(file, 'utf8') : null;
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
