// Results are per model and incremental, and a site is built only from records
// that match the inventory as it is now; damaged records are refused with the
// file, the place and what to do.
import { beforeAll, describe, expect, it } from 'vitest';
import { appendFileSync, copyFileSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { selectSiteRecords, selectionReport } from '../../../src/catalogue/records/site-selection.ts';
import { readRecordFile } from '../../../src/catalogue/records/read-records.ts';
import { runStrobe } from '../../support/run-cli.ts';

const strobe = runStrobe;

describe('incremental results and fresh records', () => {
  const root = mkdtempSync(join(tmpdir(), 'strobe-fresh-'));
  const inventory = join(root, 'models');
  const out = join(root, 'results');
  beforeAll(async () => {
    mkdirSync(inventory);
    // Files that do not load make records without computing: the test stays fast.
    for (const name of ['unknown-orbital', 'missing-lattice', 'trailing-comma']) copyFileSync(`test/fixtures/invalid/${name}.json`, join(inventory, `${name}.json`));
    await strobe(['check', '--no-cache', '--out', out, inventory]);
  });

  it('checking one file replaces that record only; the summary keeps every model', async () => {
    const before = readFileSync(join(out, 'models', 'missing-lattice.json'), 'utf8');
    await strobe(['check', '--no-cache', '--out', out, join(inventory, 'unknown-orbital.json')]);
    const summary = JSON.parse(readFileSync(join(out, 'catalogue.json'), 'utf8'));
    expect(summary.models.map((m: { id: string }) => m.id)).toEqual(['missing-lattice', 'trailing-comma', 'unknown-orbital']);
    expect(readFileSync(join(out, 'models', 'missing-lattice.json'), 'utf8')).toBe(before);
    expect(selectSiteRecords(out, [inventory]).records).toHaveLength(3);
  });

  it('leaves out, by name and reason, a file changed since it was checked, a file never checked and a removed one', () => {
    const changed = join(root, 'changed');
    mkdirSync(changed);
    for (const name of ['unknown-orbital', 'missing-lattice']) copyFileSync(join(inventory, `${name}.json`), join(changed, `${name}.json`));
    // Records were made for models/…; the same files under another folder have other inventory paths.
    const other = selectSiteRecords(out, [changed]);
    expect(other.records).toEqual([]);
    expect(other.skipped.map((s) => s.reason)).toEqual([expect.stringMatching(/no results record/), expect.stringMatching(/no results record/)]);

    appendFileSync(join(inventory, 'unknown-orbital.json'), '\n');
    writeFileSync(join(inventory, 'new-model.json'), '{}');
    rmSync(join(inventory, 'trailing-comma.json'));
    const selection = selectSiteRecords(out, [inventory]);
    expect(selection.records.map((r) => r.id)).toEqual(['missing-lattice']);
    expect(selection.skipped).toEqual([
      { file: 'models/new-model.json', id: null, reason: expect.stringMatching(/^no results record in .*: the file has not been checked there/) },
      { file: 'models/unknown-orbital.json', id: 'unknown-orbital', reason: 'the file changed after it was checked; run "strobe check" again' },
    ]);
    expect(selection.leftovers).toEqual(['trailing-comma']);
    expect(selectionReport(selection)).toMatch(/^2 model file\(s\) of the inventory are NOT on the site:\n/);
  });
});

describe('damaged records', () => {
  const folder = mkdtempSync(join(tmpdir(), 'strobe-damaged-'));

  it('a truncated record is refused with its file, line and column', () => {
    mkdirSync(join(folder, 'models'), { recursive: true });
    const file = join(folder, 'models', 'cut.json');
    writeFileSync(file, '{\n  "recordFormat": 1,\n  "id": "cut",\n  "st');
    const read = readRecordFile(file);
    expect('problem' in read && read.problem.message).toMatch(new RegExp(`^${file}:4:\\d+: the record is not valid JSON .*run "strobe check" again`));
  });

  it('a record missing a field is refused with its file, place and the field', async () => {
    const out = mkdtempSync(join(tmpdir(), 'strobe-damaged-'));
    await strobe(['check', '--no-cache', '--out', out, 'test/fixtures/invalid/unknown-orbital.json']);
    const file = join(out, 'models', 'unknown-orbital.json');
    const record = JSON.parse(readFileSync(file, 'utf8'));
    delete record.drive;
    writeFileSync(file, JSON.stringify(record, null, 2));
    const selection = selectSiteRecords(out, ['test/fixtures/invalid/unknown-orbital.json']);
    expect(selection.problems).toHaveLength(1);
    expect(selection.problems[0].message).toBe(`${file}:1:1 (record): must have required property 'drive' (schemas/report.schema.json); run "strobe check" again to rewrite it`);
  });
});
