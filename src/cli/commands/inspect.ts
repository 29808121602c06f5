/**
 * strobe inspect <id|file>: verifies one model (using the cache) and prints its
 * gaps, bands, invariants and the certificate behind each verdict.
 */
import type { ModelRecord, ModelTimings } from '../../catalogue/records/model-record.ts';
import { inspectModel, ModelNotFoundError } from '../../catalogue/verify/inspect.ts';
import type { Certificate } from '../../catalogue/verify/certificate.ts';
import type { CliIO } from './verify-summary.ts';
import { canonicalJson } from '../../catalogue/records/canonical-json.ts';
import { ANOMALOUS_LABEL, STATUS_LABEL, quantityName } from '../../catalogue/vocabulary.ts';
import { formatGrid, formatNumber, formatRefinementStep } from '../../catalogue/verify/format.ts';

export const describe = `strobe inspect <id | file> [--no-cache] [--json]
  Verifies one model and shows its quasienergy gaps, bands, invariants and the
  certificate (grid, residual, tolerance, refinement, gaps) behind every verdict.
  <id> is looked up as models/<id>.json. --json prints the results record.`;

const q = (x: number) => (Math.abs(x) < 5e-13 ? '0' : Math.abs(Math.abs(x) - 1) < 5e-13 ? (x > 0 ? 'π/T' : '−π/T') : `${Number(x.toPrecision(4))} π/T`);
const num = (x: number | null) => (x === null ? '—' : Number.isInteger(x) ? String(x) : x.toPrecision(3));

function table(rows: string[][]): string[] {
  const widths = rows[0].map((_, c) => Math.max(...rows.map((r) => r[c].length)));
  return rows.map((r) => '  ' + r.map((cell, c) => cell.padEnd(widths[c])).join('  ').trimEnd());
}

/** The evidence of one certificate: one line of grid, residual, gaps and symmetries, then the refinement history one level per line. */
export function certificateLines(c: Certificate): string[] {
  const parts: string[] = [];
  const n = (x: number | null) => (x === null ? '—' : formatNumber(x));
  if (c.grid.length > 0) parts.push(c.stage === 'winding' ? `adaptive quadrature, ${c.grid[0]} evaluations` : `grid ${formatGrid(c.grid)}`);
  if (c.residual !== null) parts.push(`|x − round x| ${n(c.residual)} (tol ${n(c.residualTolerance)})`);
  for (const g of c.gaps) parts.push(`gap at ${q(g.gap)} ${n(g.minimalGap)} (certified ≥ ${n(g.lowerBound ?? 0)}, tol ${n(g.tolerance)}${g.open ? '' : ', not open'})`);
  for (const s of c.symmetry) parts.push(`${s.name} ${n(s.residual)} (tol ${n(s.tolerance)})`);
  const lines = parts.length > 0 ? [`evidence: ${parts.join('; ')}`] : [];
  if (c.refinement.length > 0) lines.push('refinement:', ...c.refinement.map((step) => `  ${formatRefinementStep(step)}`));
  return lines;
}

export function formatInspection(record: ModelRecord, timings: ModelTimings): string {
  const lines: string[] = [];
  lines.push(`${record.id} — ${record.model?.title ?? '(did not load)'}`);
  lines.push(`file ${record.file}; status ${STATUS_LABEL[record.status]}: ${record.statusReason}`);
  if (record.drive) {
    const d = record.drive;
    lines.push(`drive: period ${num(d.period)}, ${d.segments.length} segment(s), states ${d.states.join(', ')}${d.nambu ? ' (Nambu)' : ''}${d.handedness === 'n/a' ? '' : `, basis ${d.handedness}-handed`}`);
  }
  const a = record.analysis;
  if (a) {
    lines.push(`${a.kind} engine, k grid ${a.grid.join('×')}, propagator accuracy ${a.propagatorAccuracy === null ? '—' : formatNumber(a.propagatorAccuracy)}`);
    lines.push('', 'Gaps (quasienergies in units of π/T)');
    lines.push(...table([['gap', 'arc', 'minimal gap', 'certified ≥', 'at', 'tolerance', 'open'], ...a.gaps.map((g) => [q(g.label), `${g.lower.toFixed(3)} … ${g.upper.toFixed(3)}`, g.minimalGap.toPrecision(4), formatNumber(g.lowerBound ?? 0), `(${g.at.map((s) => s.toFixed(3)).join(', ')})`, formatNumber(g.tolerance), g.open ? 'yes' : 'no'])]));
    if (a.bands.length > 0) {
      lines.push('', 'Band groups');
      lines.push(...table([['#', 'range', 'branches', 'between gaps'], ...a.bands.map((b) => [String(b.index), `${b.range[0].toFixed(3)} … ${b.range[1].toFixed(3)}`, String(b.branches), `${q(b.gapBelow)} and ${q(b.gapAbove)}`])]));
    }
  }
  if (record.claims.length > 0) {
    lines.push('', 'Claims');
    for (const v of record.claims) {
      const name = quantityName(v.claim, { symmetryClass: record.model?.symmetryClass, cut: v.kind === 'chern' ? v.gap : null }).words;
      lines.push(`  ${name} [${v.claim}]: ${v.outcome} (claimed ${String(v.claimed)}, computed ${v.computed === null ? '—' : String(v.computed)})`);
      lines.push(`    ${v.message}`);
      if (v.hint) lines.push(`    hint: ${v.hint}`);
      lines.push(...certificateLines(v.certificate).map((line) => `    ${line}`));
    }
  }
  const unclaimed = record.portrait.filter((e) => !e.claimed);
  if (unclaimed.length > 0) {
    lines.push('', 'Computed but not claimed');
    for (const e of unclaimed) lines.push(`  ${e.label}: ${e.settled ? String(e.value) : `unsettled (nearest ${num(e.estimate)})`}`);
  }
  lines.push('', `anomalous phase: ${ANOMALOUS_LABEL[record.anomalous.classification]} — ${record.anomalous.reason}`);
  for (const s of record.sweeps) lines.push(`sweep ${s.name}: ${s.points.length} point(s) over ${s.axes.map((x) => x.parameter).join(' × ')}`);
  for (const d of record.diagnostics) lines.push(`${d.severity}: ${d.file}:${d.line}:${d.column} ${d.pointer} ${d.message}${d.hint ? ` (${d.hint})` : ''}`);
  lines.push('', timings.cached ? 'taken from the cache (unchanged since the last run)' : `computed in ${(timings.totalMs / 1000).toFixed(2)} s`);
  return lines.join('\n') + '\n';
}

export async function run(argv: string[], io: CliIO): Promise<number> {
  const positional = argv.filter((a) => !a.startsWith('--'));
  const unknown = argv.find((a) => a.startsWith('--') && a !== '--no-cache' && a !== '--json');
  if (unknown) {
    io.stderr.write(`strobe inspect: unknown option ${unknown}\n${describe}\n`);
    return 2;
  }
  if (positional.length !== 1) {
    io.stderr.write(`strobe inspect: give exactly one model id or file\n${describe}\n`);
    return 2;
  }
  try {
    const { record, timings } = await inspectModel(positional[0], { cache: !argv.includes('--no-cache') });
    if (argv.includes('--json')) io.stdout.write(canonicalJson(record));
    else io.stdout.write(formatInspection(record, timings));
    return record.status === 'verified' || record.status === 'portrait-only' || record.status === 'unsettled' ? 0 : 1;
  } catch (e) {
    if (e instanceof ModelNotFoundError) {
      io.stderr.write(`strobe inspect: ${e.message} (model files live in models/; give a path for others)\n`);
      return 2;
    }
    throw e;
  }
}
