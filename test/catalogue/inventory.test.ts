// The inventory: relative paths that never leak a user's disk layout, each file
// once however it is named, and record ids that are safe as file and page names.
import { describe, expect, it } from 'vitest';
import { copyFileSync, mkdirSync, mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { basename, join } from 'node:path';
import { inventoryPath, listInventory, recordIdForFile } from '../../src/catalogue/inventory.ts';
import { isRecordId } from '../../src/catalogue/records/record-id.ts';
import { loadModels } from '../../src/catalogue/load.ts';

describe('inventory paths', () => {
  it('are relative to the working directory inside it, else the folder and file name', () => {
    expect(inventoryPath('models/qwz-sheet.json')).toBe('models/qwz-sheet.json');
    const outside = mkdtempSync(join(tmpdir(), 'strobe-inv-'));
    mkdirSync(join(outside, 'lab'));
    expect(inventoryPath(join(outside, 'lab', 'a.json'))).toBe('lab/a.json');
    expect(listInventory([join(outside, 'lab')]).files).toEqual([]);
  });

  it('list a file once when it is named twice, or also through its folder', () => {
    const { files } = listInventory(['test/fixtures/valid', 'test/fixtures/valid/minimal-chain.json', './test/fixtures/valid/minimal-chain.json']);
    expect(files.filter((f) => f.path === 'test/fixtures/valid/minimal-chain.json')).toHaveLength(1);
  });

  it('load a file named twice as one model, not as a duplicate of itself', async () => {
    const report = await loadModels(['test/fixtures/valid/minimal-chain.json', 'test/fixtures/valid/minimal-chain.json']);
    expect(report.models.map((m) => m.id)).toEqual(['minimal-chain']);
    expect(report.failures).toEqual([]);
  });

  it('give models checked outside the working directory no absolute path', async () => {
    const outside = mkdtempSync(join(tmpdir(), 'strobe-inv-'));
    copyFileSync('test/fixtures/valid/left-handed-basis.json', join(outside, 'left-handed-basis.json'));
    const report = await loadModels([outside]);
    const model = report.models[0];
    expect(model.file).toBe(`${basename(outside)}/left-handed-basis.json`);
    expect(JSON.stringify(model.warnings)).not.toContain(outside);
  });
});

describe('record ids of files that did not load', () => {
  it('are safe and distinct for names that are not model ids', () => {
    const ids = ['.json', '..json', '...json', 'Ω.json', 'a b.json', '-.json'].map(recordIdForFile);
    for (const id of ids) expect(isRecordId(id), id).toBe(true);
    expect(new Set(ids).size).toBe(ids.length);
    expect(recordIdForFile('models/good-name.json')).toBe('good-name');
    for (const bad of ['', '.', '..', 'a/b', 'a.b', 'A']) expect(isRecordId(bad), bad).toBe(false);
  });

  it('keep a folder of oddly named files loading', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'strobe-inv-'));
    for (const name of ['.json', '..json']) writeFileSync(join(dir, name), '{');
    const report = await loadModels([dir]);
    expect(report.failures.map((f) => f.file).sort()).toEqual([`${basename(dir)}/..json`, `${basename(dir)}/.json`]);
  });
});
