import { afterEach, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, rmSync, readdirSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { createRequire } from 'node:module';
import { verifyCatalogue } from '../../../src/catalogue/verify/catalogue.ts';
import { mergeSummaries, MergeError } from '../../../src/catalogue/records/summary.ts';
import { canonicalJson } from '../../../src/catalogue/records/canonical-json.ts';
import { runMerge, runVerifiedCheck } from '../../../src/cli/commands/verify-summary.ts';

const fixtures = ['two-step-chain-correct', 'two-step-chain-wrong-frame', 'qwz-sign-error', 'broken-file'].map((id) => `test/fixtures/verification/${id}.json`);
const dirs: string[] = [];
afterEach(() => {
  for (const d of dirs.splice(0)) rmSync(d, { recursive: true, force: true });
});
function scratch(): string {
  const d = mkdtempSync(join(tmpdir(), 'strobe-shard-'));
  dirs.push(d);
  return d;
}
function capture() {
  const out: string[] = [];
  const err: string[] = [];
  return { io: { stdout: { write: (t: string) => out.push(t) }, stderr: { write: (t: string) => err.push(t) } }, out, err };
}

describe('sharded runs and merging', () => {
  it('two shards merged give the summary of one whole run', async () => {
    const whole = await verifyCatalogue(fixtures, { workers: 0, cache: false });
    const parts = [];
    for (const index of [1, 2]) {
      const part = await verifyCatalogue(fixtures, { workers: 0, cache: false, shard: { index, count: 2 } });
      expect(part.summary.shard).toBe(`${index}/2`);
      parts.push({ source: `shard ${index}`, summary: part.summary });
    }
    expect(parts[0].summary.models.length + parts[1].summary.models.length).toBe(4);
    expect(canonicalJson(mergeSummaries(parts))).toBe(canonicalJson(whole.summary));
  });

  it('refuses to merge overlapping shards or different engines', async () => {
    const part = (await verifyCatalogue(fixtures.slice(3), { workers: 0, cache: false })).summary;
    expect(() => mergeSummaries([{ source: 'a.json', summary: part }, { source: 'b.json', summary: part }])).toThrow(
      'model broken-file appears in both a.json and b.json; were the shards made with the same --shard i/n count?',
    );
    const other = { ...part, engine: { ...part.engine, numericsHash: 'f'.repeat(64) } };
    expect(() => mergeSummaries([{ source: 'a.json', summary: part }, { source: 'c.json', summary: other }])).toThrow(MergeError);
  });

  it('check writes records, JUnit and a shard summary; merge joins the shard summaries; exit codes follow the statuses', async () => {
    const out = scratch();
    const junit = join(out, 'junit.xml');
    for (const shard of ['1/2', '2/2']) {
      const { io } = capture();
      const code = await runVerifiedCheck([...fixtures, '--workers', '0', '--no-cache', '--shard', shard, '--out', out, '--junit', junit], io);
      expect([0, 1]).toContain(code);
    }
    expect(readdirSync(out).filter((f) => f.startsWith('catalogue.shard-')).sort()).toEqual(['catalogue.shard-1-of-2.json', 'catalogue.shard-2-of-2.json']);
    expect(readdirSync(join(out, 'models')).sort()).toEqual(['broken-file.json', 'qwz-sign-error.json', 'two-step-chain-correct.json', 'two-step-chain-wrong-frame.json']);
    const merged = capture();
    const code = await runMerge([join(out, 'catalogue.shard-1-of-2.json'), join(out, 'catalogue.shard-2-of-2.json'), '--out', join(out, 'catalogue.json')], merged.io);
    expect(code).toBe(1); // disputed and invalid models are in the catalogue
    const summary = JSON.parse(readFileSync(join(out, 'catalogue.json'), 'utf8'));
    expect(summary.counts).toMatchObject({ verified: 1, disputed: 2, invalid: 1 });
    // The JUnit file of the last shard is well-formed XML (sax, a strict XML parser installed with the site toolchain).
    const sax = createRequire(import.meta.url)('sax') as { parser(strict: boolean): { onerror: (e: Error) => void; write(s: string): { close(): void } } };
    const parser = sax.parser(true);
    parser.onerror = (e) => {
      throw e;
    };
    parser.write(readFileSync(junit, 'utf8')).close();
  });

  it('exit status: 0 for verified only, 1 when disputed, --strict fails on unsettled, 2 on a usage error', async () => {
    const out = scratch();
    const run = async (args: string[]) => runVerifiedCheck([...args, '--workers', '0', '--no-cache', '--out', out], capture().io);
    expect(await run(['test/fixtures/verification/two-step-chain-correct.json'])).toBe(0);
    expect(await run(['test/fixtures/verification/two-step-chain-wrong-frame.json'])).toBe(1);
    expect(await run(['test/fixtures/verification/qwz-closed-gap.json'])).toBe(0);
    expect(await run(['test/fixtures/verification/qwz-closed-gap.json', '--strict'])).toBe(1);
    const bad = capture();
    expect(await runVerifiedCheck(['--shard', '3/2'], bad.io)).toBe(2);
    expect(bad.err.join('')).toBe('strobe check: --shard 3/2: the shard index must lie between 1 and 2 (shards are numbered from 1)\n');
  });
});
