/**
 * Reads results records back (for the summary of a folder and for the site
 * build) and refuses any that is not what `strobe check` writes: every record
 * is parsed with positions and validated against schemas/report.schema.json,
 * and a problem is reported with the file, the line and column or JSON
 * pointer, and what to do.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { nodeAt, parseWithPositions, positionOf } from '../json-positions.ts';
import type { ModelRecord } from './model-record.ts';
import { reportValidator } from './report-validation.ts';

export interface RecordProblem {
  file: string;
  /** file:line:column (or file pointer) and the message, ready to print. */
  message: string;
}

const RERUN = 'run "strobe check" again to rewrite it';

export function readRecordFile(file: string): { record: ModelRecord } | { problem: RecordProblem } {
  let text: string;
  try {
    text = readFileSync(file, 'utf8');
  } catch (error) {
    return { problem: { file, message: `${file}: cannot read the record: ${(error as NodeJS.ErrnoException).code ?? (error as Error).message}` } };
  }
  const { document, problems } = parseWithPositions(text);
  if (problems.length > 0 || text.trim() === '') {
    const offset = problems[0]?.offset ?? 0;
    const { line, column } = positionOf(document, offset);
    const what = problems[0]?.message ?? 'empty file';
    return { problem: { file, message: `${file}:${line}:${column}: the record is not valid JSON (${what}; a partial or edited file?); ${RERUN}` } };
  }
  const value: unknown = JSON.parse(text);
  const validate = reportValidator();
  const isModelRecord = value !== null && typeof value === 'object' && 'status' in value;
  if (!isModelRecord || !validate(value)) {
    const errors = (validate.errors ?? []).filter((e) => e.keyword !== 'oneOf');
    // The schema is a oneOf of the two record kinds; the model-record branch's errors say what is wrong.
    const first = errors.find((e) => !e.schemaPath.includes('catalogueSummary')) ?? errors[0];
    const where = first ? first.instancePath || '(record)' : '(record)';
    const what = !isModelRecord ? 'not a model record' : (first?.message ?? 'does not match report.schema.json');
    const located = positionOf(document, nodeAt(document, where === '(record)' ? '' : where)?.offset ?? 0);
    return { problem: { file, message: `${file}:${located.line}:${located.column} ${where}: ${what} (schemas/report.schema.json); ${RERUN}` } };
  }
  return { record: value as ModelRecord };
}

/** Every record in <outDir>/models, each checked; a record whose file name is not its id is a problem too. */
export function readRecordFolder(outDir: string): { records: ModelRecord[]; problems: RecordProblem[] } {
  const folder = join(outDir, 'models');
  let names: string[];
  try {
    names = readdirSync(folder).filter((n) => n.endsWith('.json')).sort();
  } catch {
    return { records: [], problems: [] };
  }
  const records: ModelRecord[] = [];
  const problems: RecordProblem[] = [];
  for (const name of names) {
    const file = join(folder, name);
    const read = readRecordFile(file);
    if ('problem' in read) problems.push(read.problem);
    else if (`${read.record.id}.json` !== name) problems.push({ file, message: `${file}: holds the record of "${read.record.id}", not of "${name.slice(0, -5)}"; ${RERUN}` });
    else records.push(read.record);
  }
  return { records, problems };
}
