import { describe, expect, it } from 'vitest';
import { createRequire } from 'node:module';
import { junitXml } from '../../../src/catalogue/junit.ts';
import { junitSuites } from '../../../src/cli/commands/verify-summary.ts';
import { invalidRecord } from '../../../src/catalogue/records/record-builder.ts';
import { judgeSheet } from '../../../src/catalogue/verify/sheet-verdicts.ts';
import { DEFAULT_POLICY } from '../../../src/catalogue/verify/policy.ts';
import { twoBandSheet } from '../verify/hand-portraits.ts';

// sax (a strict XML 1.0 parser, installed with the site toolchain) is the outside reference for well-formedness.
interface SaxParser {
  onerror: (e: Error) => void;
  onopentag: (node: { name: string; attributes: Record<string, string> }) => void;
  ontext: (t: string) => void;
  write(s: string): SaxParser;
  close(): void;
}
const sax = createRequire(import.meta.url)('sax') as { parser(strict: boolean): SaxParser };

function parse(xml: string) {
  const parser = sax.parser(true);
  const tags: { name: string; attributes: Record<string, string> }[] = [];
  let text = '';
  parser.onerror = (e) => {
    throw e;
  };
  parser.onopentag = (node) => tags.push(node);
  parser.ontext = (t) => (text += t);
  parser.write(xml).close();
  return { tags, text };
}

describe('JUnit XML', () => {
  const xml = junitXml('strobe check', [
    {
      name: 'two-step-chain',
      timeSeconds: 1.25,
      cases: [
        { name: 'gap-0/invariant', classname: 'two-step-chain', timeSeconds: 0.5, outcome: 'pass' },
        { name: 'gap-1/invariant', classname: 'two-step-chain', timeSeconds: 0.5, outcome: 'failure', message: 'ν_π is 0 but the file claims 1 <&"\'>', detail: 'matches ν″ of the other symmetric frame\u0001' },
        { name: 'gap-1/end-modes', classname: 'two-step-chain', timeSeconds: 0, outcome: 'skipped', message: 'gap below tolerance' },
      ],
    },
    { name: 'broken-file', timeSeconds: 0, cases: [{ name: 'load', classname: 'broken-file', timeSeconds: 0, outcome: 'error', message: 'models/broken-file.json:3:5 unknown property' }] },
  ]);

  it('is well-formed XML with escaped text (parsed back by a strict parser)', () => {
    const { tags, text } = parse(xml);
    const failure = tags.find((t) => t.name === 'failure')!;
    expect(failure.attributes.message).toBe('ν_π is 0 but the file claims 1 <&"\'>');
    expect(text).toContain('matches ν″ of the other symmetric frame\uFFFD');
  });

  it('counts tests, failures, errors and skips per suite and in total', () => {
    const { tags } = parse(xml);
    const root = tags.find((t) => t.name === 'testsuites')!;
    expect(root.attributes).toMatchObject({ tests: '4', failures: '1', errors: '1', skipped: '1', time: '1.250' });
    const suites = tags.filter((t) => t.name === 'testsuite');
    expect(suites.map((s) => [s.attributes.name, s.attributes.tests, s.attributes.failures])).toEqual([
      ['two-step-chain', '3', '1'],
      ['broken-file', '1', '0'],
    ]);
    expect(tags.filter((t) => t.name === 'testcase')).toHaveLength(4);
  });
});

describe('JUnit cases from verification records', () => {
  const engine = { version: 'test', numericsHash: '0'.repeat(64) };
  const invalid = invalidRecord(engine, 'broken', 'models/broken.json', [{ file: 'models/broken.json', line: 3, column: 7, pointer: '/drive', message: 'missing period', hint: 'add "period"', severity: 'error' }]);
  // Gap at 0 below tolerance (unsettled), π gap settled: one confirmed, one contradicted, one unsettled claim.
  const { verdicts } = judgeSheet(twoBandSheet({ gap0: 0.0005 }), [
    { kind: 'winding', id: 'gap-1/winding', pointer: '/a', gap: 1, value: 1 },
    { kind: 'winding', id: 'gap-1/winding#2', pointer: '/b', gap: 1, value: 2 },
    { kind: 'winding', id: 'gap-0/winding', pointer: '/c', gap: 0, value: 1 },
  ], DEFAULT_POLICY);
  const sheet = { ...invalid, id: 'sheet', status: 'disputed' as const, claims: verdicts, diagnostics: [] };
  const report = { records: [invalid, sheet], timings: { broken: { totalMs: 0, stages: {}, cached: false }, sheet: { totalMs: 3000, stages: {}, cached: false } } };

  it('maps confirmed → pass, contradicted → failure, unsettled → skipped (failure under --strict), invalid → error', () => {
    const loose = junitSuites(report, false);
    expect(loose[0].cases.map((c) => c.outcome)).toEqual(['error']);
    expect(loose[0].cases[0].detail).toBe('models/broken.json:3:7 /drive missing period (add "period")');
    expect(loose[1].cases.map((c) => c.outcome)).toEqual(['pass', 'failure', 'skipped']);
    expect(junitSuites(report, true)[1].cases.map((c) => c.outcome)).toEqual(['pass', 'failure', 'failure']);
    // Compute time is measured per model: the suite carries it (3 s), cases report none.
    expect(loose[1].timeSeconds).toBe(3);
    expect(loose[1].cases.map((c) => c.timeSeconds)).toEqual([0, 0, 0]);
    const { tags } = parse(junitXml('strobe check', loose));
    expect(tags.find((t) => t.name === 'testsuites')!.attributes).toMatchObject({ tests: '4', failures: '1', errors: '1', skipped: '1' });
  });
});
