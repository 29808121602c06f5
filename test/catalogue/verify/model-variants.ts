/** Copies of a model file with another id and one change, written into a folder for verifyCatalogue. */
import { readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';

/** Writes `source` as `<dir>/<id>.json` with that id, without its $schema and sweeps, after `edit`. */
export function writeVariant(dir: string, source: string, id: string, edit: (doc: Record<string, any>) => void): void {
  const doc = JSON.parse(readFileSync(source, 'utf8'));
  doc.id = id;
  delete doc.$schema;
  delete doc.sweeps;
  edit(doc);
  writeFileSync(path.join(dir, `${id}.json`), `${JSON.stringify(doc, null, 2)}\n`);
}
