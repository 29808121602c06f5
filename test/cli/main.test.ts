/** The strobe command: exit codes and output, in-process, plus one real process start. */
import { execFile } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { promisify } from 'node:util';
import { describe, expect, it } from 'vitest';
import { checkModelSource } from '../../src/catalogue/load.ts';
import { runStrobe } from '../support/run-cli.ts';

const run = runStrobe;

describe('strobe check --validate-only', () => {
  it('exits 0 and prints one ✓ line per model and a total for models/', async () => {
    const { code, stdout } = await run(['check', '--validate-only']);
    expect(code).toBe(0);
    const lines = stdout.trim().split('\n');
    expect(lines.filter((l) => l.startsWith('✓ '))).toContain('✓ qwz-sheet  models/qwz-sheet.json');
    expect(lines[lines.length - 1]).toMatch(/^(\d+) models checked: \1 valid, 0 invalid$/);
  });

  it('exits 1 and prints located problems for an invalid file', async () => {
    const { code, stdout } = await run(['check', '--validate-only', 'test/fixtures/invalid/unknown-orbital.json', 'test/fixtures/valid/minimal-chain.json']);
    expect(code).toBe(1);
    expect(stdout).toContain('✓ minimal-chain  test/fixtures/valid/minimal-chain.json\n');
    expect(stdout).toMatch(/^✗ test\/fixtures\/invalid\/unknown-orbital\.json:\d+:\d+  \/drive\/segments\/1\/hoppings\/0\/to  no orbital "C"; orbitals are A, B  \(did you mean 'A'\?\)$/m);
    expect(stdout).toMatch(/2 models checked: 1 valid, 1 invalid\n$/);
  });

  it('--json gives a machine-readable report', async () => {
    const { code, stdout } = await run(['check', '--validate-only', '--json', 'test/fixtures/invalid/empty.json']);
    expect(code).toBe(1);
    const report = JSON.parse(stdout);
    expect(report.valid).toBe(false);
    expect(report.summary).toEqual({ checked: 1, valid: 0, invalid: 1 });
    expect(report.failures[0].diagnostics[0]).toMatchObject({ file: 'test/fixtures/invalid/empty.json', line: 1, column: 1, message: 'file is empty' });
  });

  it('exits 2 on an unknown option, with a hint', async () => {
    const { code, stderr } = await run(['check', '--validate-only', '--jsno']);
    expect(code).toBe(2);
    expect(stderr).toBe('strobe check: unknown option --jsno\nhint: run "strobe help check" for the options\n');
    const verifying = await run(['check', '--jsno']);
    expect(verifying.code).toBe(2);
    expect(verifying.stderr).toBe('strobe check: unknown option --jsno; see "strobe help check"\n');
  });
});

describe('strobe check (verification)', () => {
  it('reports an invalid file with file:line:column, pointer and message, and exits 1', async () => {
    const out = mkdtempSync(path.join(tmpdir(), 'strobe-check-'));
    const { code, stdout } = await run(['check', '--no-cache', '--workers', '0', '--out', out, 'test/fixtures/invalid/unknown-orbital.json']);
    expect(code).toBe(1);
    expect(stdout).toMatch(/^  test\/fixtures\/invalid\/unknown-orbital\.json:\d+:\d+  \/drive\/segments\/1\/hoppings\/0\/to  no orbital "C"; orbitals are A, B/m);
    const record = JSON.parse(readFileSync(path.join(out, 'models', 'unknown-orbital.json'), 'utf8'));
    expect(record.status).toBe('invalid');
  });

  it('exits 1 for a disputed model and names the likely cause; --junit writes one case per claim', async () => {
    const out = mkdtempSync(path.join(tmpdir(), 'strobe-check-'));
    const junit = path.join(out, 'junit.xml');
    const { code, stdout } = await run(['check', '--no-cache', '--workers', '0', '--out', out, '--junit', junit, 'test/fixtures/verification/qwz-sign-error.json']);
    expect(code).toBe(1);
    expect(stdout).toMatch(/qwz-sign-error\s+disputed/);
    expect(stdout).toContain('hint: sign differs');
    const record = JSON.parse(readFileSync(path.join(out, 'models', 'qwz-sign-error.json'), 'utf8'));
    const xml = readFileSync(junit, 'utf8');
    expect((xml.match(/<testcase /g) ?? []).length).toBe(record.claims.length);
    expect((xml.match(/<failure /g) ?? []).length).toBe(record.claims.filter((c: { outcome: string }) => c.outcome === 'contradicted').length);
  });
});

describe('strobe new', () => {
  it('writes a model that passes check, and refuses to overwrite it', async () => {
    const dir = mkdtempSync(path.join(tmpdir(), 'strobe-new-'));
    const first = await run(['new', 'driven-ladder'], dir);
    expect(first.code).toBe(0);
    const file = path.join(dir, 'models', 'driven-ladder.json');
    const { model, diagnostics } = checkModelSource('models/driven-ladder.json', readFileSync(file, 'utf8'));
    expect(diagnostics).toEqual([]);
    expect(model?.id).toBe('driven-ladder');
    // A new file is a draft: verified like any model, left out of the site until the author publishes it.
    expect(model?.document.draft).toBe(true);
    expect(first.stdout).toMatch(/a draft: not published on the site until you remove "draft": true/);
    writeFileSync(file, '{"edited": true}');
    const second = await run(['new', 'driven-ladder'], dir);
    expect(second.code).toBe(1);
    expect(second.stderr).toMatch(/already exists; not overwriting/);
    expect(readFileSync(file, 'utf8')).toBe('{"edited": true}');
  });

  it('rejects ids that are not kebab-case, suggesting one', async () => {
    const dir = mkdtempSync(path.join(tmpdir(), 'strobe-new-'));
    const { code, stderr } = await run(['new', 'Driven_Ladder'], dir);
    expect(code).toBe(2);
    expect(stderr).toContain('e.g. driven-ladder');
    expect((await run(['new', '../escape'], dir)).code).toBe(2);
    expect((await run(['new'], dir)).code).toBe(2);
  });
});

describe('help and dispatch', () => {
  it('lists every command in --help and documents each with help <command>', async () => {
    const overview = await run(['--help']);
    expect(overview.code).toBe(0);
    for (const name of ['check', 'new', 'help']) {
      expect(overview.stdout).toMatch(new RegExp(`^  ${name}\\s+\\S`, 'm'));
      const detail = await run(['help', name]);
      expect(detail.code).toBe(0);
      expect(detail.stdout).toMatch(new RegExp(`^usage: strobe ${name}`));
    }
    expect((await run(['check', '--help'])).stdout).toMatch(/Exit codes \(with --validate-only\): 0 all models valid, 1 at least one invalid, 2 usage error/);
    for (const name of ['inspect', 'sweep', 'merge', 'site']) {
      expect(overview.stdout).toMatch(new RegExp(`^  ${name}\\s+\\S`, 'm'));
      expect((await run(['help', name])).stdout).toMatch(new RegExp(`^usage: strobe ${name}`));
    }
  });

  it('exits 2 for an unknown command and suggests the closest one', async () => {
    const { code, stderr } = await run(['chekc']);
    expect(code).toBe(2);
    expect(stderr).toBe('strobe: unknown command "chekc"\nhint: did you mean "strobe check"?\n');
    expect((await run(['help', 'nonsense'])).code).toBe(2);
  });

  it('runs as a real process through bin/strobe.mjs', async () => {
    const { stdout } = await promisify(execFile)(process.execPath, ['bin/strobe.mjs', 'check', '--validate-only', 'models/qwz-sheet.json']);
    expect(stdout).toBe('✓ qwz-sheet  models/qwz-sheet.json\n1 model checked: 1 valid, 0 invalid\n');
    const failed = await promisify(execFile)(process.execPath, ['bin/strobe.mjs', 'check', '--validate-only', 'test/fixtures/invalid/empty.json']).catch((e) => e);
    expect(failed.code).toBe(1);
  });
});
