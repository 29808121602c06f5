// The command line on awkward input: warnings shown and marked, hints whole,
// a taken port named before any work, damaged results refused before a build,
// and a log that never falls silent while a model runs.
import { describe, expect, it, vi } from 'vitest';
import { mkdirSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { progressReporter } from '../../src/cli/commands/verify-summary.ts';
import { runStrobe } from '../support/run-cli.ts';

const strobe = runStrobe;

describe('warnings', () => {
  it('of a model that loads are printed by strobe check and marked as warnings', async () => {
    const out = mkdtempSync(join(tmpdir(), 'strobe-warn-'));
    const { stdout } = await strobe(['check', '--no-cache', '--out', out, 'test/fixtures/valid/left-handed-basis.json']);
    expect(stdout).toMatch(/^ {2}warning: test\/fixtures\/valid\/left-handed-basis\.json:\d+:\d+ {2}\/lattice\/vectors {2}.*left-handed/m);
  });

  it('are marked apart from errors in the validation list', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'strobe-warn-'));
    const doc = JSON.parse(readFileSync('test/fixtures/valid/left-handed-basis.json', 'utf8'));
    doc.drive.segments[0].duration = -1; // an error besides the handedness warning
    writeFileSync(join(dir, 'left-handed-basis.json'), JSON.stringify(doc, null, 2));
    const { stdout } = await strobe(['check', '--validate-only', join(dir, 'left-handed-basis.json')]);
    const lines = stdout.split('\n');
    expect(lines.filter((l) => l.startsWith('✗ '))).not.toHaveLength(0);
    const warnings = lines.filter((l) => /left-handed basis/.test(l));
    expect(warnings).toHaveLength(1);
    for (const line of warnings) expect(line).toMatch(/^ {2}warning: /);
  });
});

describe('hints', () => {
  it('quote a schema example whole, never cut after an initial', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'strobe-hint-'));
    const doc = JSON.parse(readFileSync('test/fixtures/valid/minimal-chain.json', 'utf8'));
    delete doc.maintainers;
    writeFileSync(join(dir, 'minimal-chain.json'), JSON.stringify(doc, null, 2));
    const { stdout } = await strobe(['check', '--validate-only', join(dir, 'minimal-chain.json')]);
    expect(stdout).toContain('missing property "maintainers"  (maintainers: Who answers for this entry: free text, e.g. "R. Okafor (Lantern Lab)")');
  });
});

describe('strobe site', () => {
  it('names a taken port before verifying or building anything, with a usage exit code, not a bug report', async () => {
    const taken = createServer();
    await new Promise<void>((r) => taken.listen(0, '127.0.0.1', () => r()));
    const port = (taken.address() as { port: number }).port;
    try {
      const { code, stdout, stderr } = await strobe(['site', '--serve', '--port', String(port), '--skip-check']);
      expect(code).toBe(1);
      expect(stderr).toBe(`strobe site: port ${port} on 127.0.0.1 is already in use\nhint: choose another with --port N (0 picks a free one), or stop what is using it\n`);
      expect(stdout).toBe('');
    } finally {
      taken.close();
    }
  });

  it('refuses damaged results before building, naming the file, and leaves dist/ as it was', async () => {
    const cwd = mkdtempSync(join(tmpdir(), 'strobe-site-'));
    mkdirSync(join(cwd, 'results', 'models'), { recursive: true });
    mkdirSync(join(cwd, 'dist'));
    writeFileSync(join(cwd, 'dist', 'index.html'), 'the published site');
    writeFileSync(join(cwd, 'results', 'models', 'cut.json'), '{"recordFormat": 1, "id": "cu');
    const { code, stderr } = await strobe(['site', '--skip-check'], cwd);
    expect(code).toBe(1);
    expect(stderr).toMatch(/^strobe site: the results in results\/ cannot be published:\n {2}\S+\/results\/models\/cut\.json:1:\d+: the record is not valid JSON/);
    expect(readFileSync(join(cwd, 'dist', 'index.html'), 'utf8')).toBe('the published site');
  });
});

describe('progress when output is not a terminal', () => {
  it('prints a line for every running model at least every 10 s', () => {
    vi.useFakeTimers({ toFake: ['setInterval', 'clearInterval', 'performance'] });
    try {
      const out: string[] = [];
      const p = progressReporter({ stdout: { write: (t: string) => out.push(t) }, stderr: { write: () => {} } });
      p.onProgress({ id: 'slow', index: 0, total: 2, step: 'started', elapsedMs: 0 });
      p.onProgress({ id: 'slow', index: 0, total: 2, step: 'sweep angles 3/1681', elapsedMs: 500 });
      vi.advanceTimersByTime(25_000);
      p.onProgress({ id: 'slow', index: 0, total: 2, step: 'over-budget', elapsedMs: 0 });
      vi.advanceTimersByTime(25_000);
      p.finish();
      expect(out).toEqual([
        '[0/2] slow: still running (sweep angles 3/1681), 10.5 s\n',
        '[0/2] slow: still running (sweep angles 3/1681), 20.5 s\n',
        '[1/2] slow: refused: estimated work over its limits\n',
      ]);
    } finally {
      vi.useRealTimers();
    }
  });
});
