import { afterEach, describe, expect, it } from 'vitest';
import { copyFileSync, mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { verifyCatalogue } from '../../../src/catalogue/verify/catalogue.ts';

const dirs: string[] = [];
afterEach(() => {
  for (const d of dirs.splice(0)) rmSync(d, { recursive: true, force: true });
});

describe('two files with the same id', () => {
  it('keep the first model and report the second as invalid under its own record id', async () => {
    const root = mkdtempSync(join(tmpdir(), 'strobe-dup-'));
    dirs.push(root);
    for (const sub of ['a', 'b']) {
      mkdirSync(join(root, sub));
      copyFileSync('test/fixtures/verification/two-step-chain-correct.json', join(root, sub, 'two-step-chain-correct.json'));
    }
    const report = await verifyCatalogue([join(root, 'a'), join(root, 'b')], { workers: 0, cache: false });
    expect(report.records.map((r) => [r.id, r.status])).toEqual([
      ['two-step-chain-correct', 'verified'],
      ['two-step-chain-correct--duplicate-2', 'invalid'],
    ]);
    expect(report.records[1].diagnostics[0].message).toMatch(/id "two-step-chain-correct" is already used by/);
  });
});
