/**
 * The demo inventory in models/ must load cleanly: no errors, and no warnings
 * except the one the collaborator's story is about (a left-handed basis, the
 * source of its sign error; see models/collaborator-honeycomb-drive.json).
 */
import { readdirSync, readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { loadModels } from '../../src/catalogue/load.ts';

describe('models/', async () => {
  const files = readdirSync('models').filter((f) => f.endsWith('.json')).sort();
  const report = await loadModels(['models']);

  it('holds demo models', () => {
    expect(files.length).toBeGreaterThanOrEqual(20);
  });

  it('loads every file with no diagnostics at all', () => {
    expect(report.failures).toEqual([]);
    expect(report.models.map((m) => m.file)).toEqual(files.map((f) => `models/${f}`));
    for (const model of report.models) {
      const expected = model.id === 'collaborator-honeycomb-drive' ? [expect.stringMatching(/^left-handed basis/)] : [];
      expect(model.warnings.map((w) => w.message), model.file).toEqual(expected);
    }
  });

  it.each(files)('%s points editors at the schema and names itself after the file', (file) => {
    const document = JSON.parse(readFileSync(`models/${file}`, 'utf8'));
    expect(document.$schema).toBe('../schemas/model.schema.json');
    expect(`${document.id}.json`).toBe(file);
  });
});

describe('docs/model-format.md', () => {
  it('has a worked example that passes every check', async () => {
    const { checkModelSource } = await import('../../src/catalogue/load.ts');
    const text = readFileSync('docs/model-format.md', 'utf8');
    const example = /## Worked example[\s\S]*?```json\n([\s\S]*?)```/.exec(text)?.[1];
    expect(example).toBeDefined();
    const { model, diagnostics } = checkModelSource('two-step-chain.json', example!);
    expect(diagnostics).toEqual([]);
    expect(model?.parameters.J2).toBeCloseTo(1.7 * Math.PI, 14);
  });
});
