/**
 * Record ids name files (results/models/<id>.json) and pages (/models/<id>/),
 * so they are held to a safe form: lower-case letters and digits in groups
 * joined by one hyphen, or two before a "duplicate-n" suffix. Model ids are
 * kebab-case (the schema); ids of files that did not load come from
 * inventory.ts (recordIdForFile). Never empty, never "." or "..", no "/".
 * schemas/report.schema.json states the same pattern.
 */
export const RECORD_ID_PATTERN = '^[a-z0-9]+(-{1,2}[a-z0-9]+)*$';
const PATTERN = new RegExp(RECORD_ID_PATTERN);
export const MAX_RECORD_ID_LENGTH = 100;

export function isRecordId(id: string): boolean {
  return id.length <= MAX_RECORD_ID_LENGTH && PATTERN.test(id);
}
