import { describe, expect, it } from 'vitest';
import { mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { verifyCatalogue } from '../../../src/catalogue/verify/catalogue.ts';
import { writeResults } from '../../../src/catalogue/records/write.ts';

// Three cheap fixtures of each kind (chain, sheet) and the invalid file keep this test short.
const paths = ['two-step-chain-correct', 'two-step-chain-wrong-frame', 'qwz-sign-error', 'broken-file'].map((id) => `test/fixtures/verification/${id}.json`);

function writtenFiles(dir: string): Map<string, string> {
  const files = new Map<string, string>();
  for (const name of readdirSync(join(dir, 'models')).sort()) files.set(`models/${name}`, readFileSync(join(dir, 'models', name), 'utf8'));
  files.set('catalogue.json', readFileSync(join(dir, 'catalogue.json'), 'utf8'));
  return files;
}

describe('results do not depend on the number of workers', () => {
  it('writes byte-identical records with 1 and 2 worker threads', async () => {
    const dirs: string[] = [];
    try {
      const outputs = [];
      for (const workers of [1, 2]) {
        const report = await verifyCatalogue(paths, { workers, cache: false });
        const dir = mkdtempSync(join(tmpdir(), `strobe-det-${workers}-`));
        dirs.push(dir);
        writeResults(dir, report.records, report.summary, report.timings);
        outputs.push(writtenFiles(dir));
      }
      expect([...outputs[0].keys()]).toEqual(['models/broken-file.json', 'models/qwz-sign-error.json', 'models/two-step-chain-correct.json', 'models/two-step-chain-wrong-frame.json', 'catalogue.json']);
      for (const [name, text] of outputs[0]) expect(outputs[1].get(name), name).toBe(text);
      // Byte-identical output must still say something: the summary lists the verdicts.
      expect(outputs[0].get('catalogue.json')).toContain('"status": "disputed"');
    } finally {
      for (const d of dirs) rmSync(d, { recursive: true, force: true });
    }
  });
});
