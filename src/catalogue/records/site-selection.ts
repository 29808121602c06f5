/**
 * Which records a site may be built from: only those that describe the model
 * files in the inventory as they are now. Each inventory file is fingerprinted
 * (inventory.ts) and matched with the record written for that file; a record
 * whose fingerprint differs (the file changed after it was checked), a file
 * without a record (never checked, or checked into another results folder)
 * and a missing path are skipped, each with the reason, so that the build can
 * say loudly what it left out. Records of files no longer in the inventory are
 * left out too. A record that cannot be read or does not match
 * report.schema.json is a problem: the results are damaged and nothing should
 * be published from them until `strobe check` rewrites them.
 */
import type { ModelRecord } from './model-record.ts';
import { readRecordFolder, type RecordProblem } from './read-records.ts';
import { compareCodePoints } from './canonical-json.ts';
import { fingerprintFile, listInventory } from '../inventory.ts';

export interface SkippedModel {
  /** Inventory path of the model file. */
  file: string;
  /** Id of the record that was found but not used, if any. */
  id: string | null;
  reason: string;
}

export interface SiteSelection {
  /** Fresh records, sorted by id. */
  records: ModelRecord[];
  /** Absolute path of the model file behind each selected record, by record id (for source downloads). */
  sources: Map<string, string>;
  skipped: SkippedModel[];
  /** Ids of records for files that are not in the inventory. */
  leftovers: string[];
  problems: RecordProblem[];
}

export function selectSiteRecords(resultsDir: string, inventory: readonly string[]): SiteSelection {
  const folder = readRecordFolder(resultsDir);
  const { files, missing } = listInventory(inventory);
  const byFile = new Map<string, ModelRecord[]>();
  for (const record of folder.records) byFile.set(record.file, [...(byFile.get(record.file) ?? []), record]);
  const records: ModelRecord[] = [];
  const sources = new Map<string, string>();
  const used = new Set<string>();
  const skipped: SkippedModel[] = missing.map((m) => ({ file: m.path, id: null, reason: m.message }));
  for (const file of files) {
    const candidates = (byFile.get(file.path) ?? []).sort((a, b) => compareCodePoints(a.id, b.id));
    const hash = fingerprintFile(file.absolute);
    const fresh = candidates.find((r) => r.sourceHash === hash);
    if (fresh) {
      records.push(fresh);
      sources.set(fresh.id, file.absolute);
      used.add(fresh.id);
    } else if (candidates.length > 0) {
      skipped.push({ file: file.path, id: candidates[0].id, reason: 'the file changed after it was checked; run "strobe check" again' });
    } else {
      skipped.push({ file: file.path, id: null, reason: `no results record in ${resultsDir}: the file has not been checked there; run "strobe check"` });
    }
  }
  records.sort((a, b) => compareCodePoints(a.id, b.id));
  const inInventory = new Set(files.map((f) => f.path));
  const leftovers = folder.records.filter((r) => !used.has(r.id) && !inInventory.has(r.file)).map((r) => r.id);
  return { records, sources, skipped, leftovers, problems: folder.problems };
}

/** The report a build prints about what it left out (empty when nothing was). */
export function selectionReport(selection: SiteSelection): string {
  const lines: string[] = [];
  if (selection.skipped.length > 0) {
    lines.push(`${selection.skipped.length} model file(s) of the inventory are NOT on the site:`);
    for (const s of selection.skipped) lines.push(`  ${s.file}${s.id ? ` (record ${s.id})` : ''}: ${s.reason}`);
  }
  if (selection.leftovers.length > 0) {
    lines.push(`${selection.leftovers.length} record(s) left out because their model files are not in the inventory: ${selection.leftovers.join(', ')}`);
  }
  return lines.length > 0 ? lines.join('\n') + '\n' : '';
}
