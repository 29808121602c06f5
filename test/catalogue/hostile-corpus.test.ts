// The corpus of hostile and limit-sized model files (test/fixtures/hostile, made by
// scripts/generate-hostile-fixtures.mts) against the outcome written beside it
// (test/fixtures/hostile-expected.json): every file gets a located error, a refusal
// with the estimate, or a finished verdict; none is computed past its budget, and
// none can produce an unsafe record id or a record the schema refuses.
import { readFileSync } from 'node:fs';
import { posix } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { verifyCatalogue, type CatalogueReport } from '../../src/catalogue/verify/catalogue.ts';
import { reportProblems } from '../../src/catalogue/records/report-validation.ts';
import { canonicalJson } from '../../src/catalogue/records/canonical-json.ts';
import { isRecordId } from '../../src/catalogue/records/record-id.ts';
import { renderDescription } from '../../src/catalogue/description/render.ts';

const expected: Record<string, { status: string; incident?: string; pointer?: string; message?: string }> = JSON.parse(readFileSync('test/fixtures/hostile-expected.json', 'utf8'));

describe('hostile and limit-sized model files', () => {
  let report: CatalogueReport;
  beforeAll(async () => {
    report = await verifyCatalogue(['test/fixtures/hostile'], { workers: 1, cache: false });
  });

  it('gives every file the expected outcome, located at the expected field', () => {
    const seen = new Set<string>();
    for (const record of report.records) {
      const name = posix.basename(record.file);
      seen.add(name);
      const want = expected[name];
      expect(want, `${name} has no expected outcome`).toBeDefined();
      expect(record.status, name).toBe(want.status);
      if (want.incident) expect(record.incident?.kind, name).toBe(want.incident);
      const error = record.diagnostics.find((d) => d.severity === 'error');
      if (want.pointer !== undefined) {
        expect(error?.pointer, name).toBe(want.pointer);
        expect(error!.line, name).toBeGreaterThan(0);
      }
      if (want.message) expect(error?.message, name).toContain(want.message);
    }
    expect([...seen].sort()).toEqual(Object.keys(expected).sort());
  });

  it('refuses the limit-sized files with the estimate, before computing anything', () => {
    for (const record of report.records.filter((r) => r.incident?.kind === 'over-budget')) {
      expect(report.timings[record.id].totalMs, record.id).toBe(0);
      expect(record.incident!.message).toMatch(/^test\/fixtures\/hostile\/[a-z-]+\.json:\d+:\d+ not computed: \S+ asks for .*verification would need about [\d.]+ (s|min|h|days|GB|MB)/);
      expect(record.budget!.estimate.seconds > record.budget!.timeLimitSeconds || record.budget!.estimate.memoryBytes > record.budget!.memoryLimitBytes).toBe(true);
      expect(record.diagnostics[0].hint).toMatch(/--time-limit|--memory-limit/);
    }
  });

  it('writes only safe ids and records the schema accepts', () => {
    for (const record of report.records) {
      expect(isRecordId(record.id), record.id).toBe(true);
      expect(reportProblems(JSON.parse(canonicalJson(record))), record.id).toEqual([]);
    }
  });

  it('keeps script in a description inert', () => {
    const doc = JSON.parse(readFileSync('test/fixtures/hostile/description-script.json', 'utf8'));
    const result = renderDescription(doc.description);
    expect(result.ok).toBe(true);
    const html = result.ok ? result.html : '';
    expect(html).not.toMatch(/<script|onerror=|<img|href="javascript:/i);
    // \href and \htmlClass need KaTeX's trust, which is off: they render as error text, not as links.
    expect(html).not.toMatch(/<a [^>]*href="javascript/i);
  });
});
