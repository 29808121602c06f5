/**
 * JUnit XML for CI systems: one <testsuite> per model, one <testcase> per claim.
 *
 * Mapping (common practice for CI test reports):
 *   confirmed   → a passing test case;
 *   contradicted → <failure> with what differs and the likely cause;
 *   unsettled   → <skipped> with the reason, or <failure> under --strict;
 *   invalid / failed model → a single test case with <error> carrying the diagnostics.
 * Times are seconds; the file is not part of the deterministic results.
 */

export interface JunitCase {
  name: string;
  classname: string;
  timeSeconds: number;
  outcome: 'pass' | 'failure' | 'skipped' | 'error';
  message?: string;
  detail?: string;
}

export interface JunitSuite {
  name: string;
  timeSeconds: number;
  cases: JunitCase[];
}

/** Escapes text for XML attribute values and character data; drops characters XML 1.0 cannot carry. */
export function escapeXml(text: string): string {
  return text
    .replace(/[^\x09\x0A\x0D\x20-\uD7FF\uE000-\uFFFD\u{10000}-\u{10FFFF}]/gu, '\uFFFD')
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;')
    .replace(/'/g, '&apos;');
}

function seconds(t: number): string {
  return (Number.isFinite(t) && t > 0 ? t : 0).toFixed(3);
}

export function junitXml(suiteName: string, suites: JunitSuite[]): string {
  const count = (o: JunitCase['outcome']) => suites.reduce((n, s) => n + s.cases.filter((c) => c.outcome === o).length, 0);
  const tests = suites.reduce((n, s) => n + s.cases.length, 0);
  const total = suites.reduce((t, s) => t + s.timeSeconds, 0);
  const lines: string[] = ['<?xml version="1.0" encoding="UTF-8"?>'];
  lines.push(
    `<testsuites name="${escapeXml(suiteName)}" tests="${tests}" failures="${count('failure')}" errors="${count('error')}" skipped="${count('skipped')}" time="${seconds(total)}">`,
  );
  for (const suite of suites) {
    const n = (o: JunitCase['outcome']) => suite.cases.filter((c) => c.outcome === o).length;
    lines.push(
      `  <testsuite name="${escapeXml(suite.name)}" tests="${suite.cases.length}" failures="${n('failure')}" errors="${n('error')}" skipped="${n('skipped')}" time="${seconds(suite.timeSeconds)}">`,
    );
    for (const c of suite.cases) {
      const open = `    <testcase name="${escapeXml(c.name)}" classname="${escapeXml(c.classname)}" time="${seconds(c.timeSeconds)}"`;
      if (c.outcome === 'pass') {
        lines.push(`${open}/>`);
        continue;
      }
      const tag = c.outcome === 'skipped' ? 'skipped' : c.outcome;
      const message = escapeXml(c.message ?? tag);
      lines.push(`${open}>`);
      if (c.detail) lines.push(`      <${tag} message="${message}">${escapeXml(c.detail)}</${tag}>`);
      else lines.push(`      <${tag} message="${message}"/>`);
      lines.push('    </testcase>');
    }
    lines.push('  </testsuite>');
  }
  lines.push('</testsuites>');
  return `${lines.join('\n')}\n`;
}
