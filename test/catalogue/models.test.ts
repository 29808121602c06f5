/** The demo inventory in models/ must load cleanly: no errors, no warnings. */
import { readdirSync, readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { loadModels } from '../../src/catalogue/load.ts';

describe('models/', async () => {
  const files = readdirSync('models').filter((f) => f.endsWith('.json')).sort();
  const report = await loadModels(['models']);

  it('holds demo models', () => {
    expect(files.length).toBeGreaterThanOrEqual(2);
  });

  it('loads every file with no diagnostics at all', () => {
    expect(report.failures).toEqual([]);
    expect(report.models.map((m) => m.file)).toEqual(files.map((f) => `models/${f}`));
    for (const model of report.models) expect(model.warnings, model.file).toEqual([]);
  });

  it.each(files)('%s points editors at the schema and names itself after the file', (file) => {
    const document = JSON.parse(readFileSync(`models/${file}`, 'utf8'));
    expect(document.$schema).toBe('../schemas/model.schema.json');
    expect(`${document.id}.json`).toBe(file);
  });
});
