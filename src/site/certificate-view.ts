/**
 * A certificate in words a referee reads: what the grid was, how far the raw
 * value was from an integer against which tolerance, each refinement level on
 * its own line, every gap the number rests on (open or not), symmetry
 * residuals, and the engine's remarks.
 */
import type { Certificate } from '../catalogue/records/model-record.ts';
import { quasienergyText, valueText } from '../catalogue/vocabulary.ts';
import { formatNumber, formatRawValue } from '../catalogue/verify/format.ts';

export interface CertificateLine {
  term: string;
  /** Plain text; a list when there are several items (refinement levels). */
  detail: string | string[];
  /** Whether this line passed its test (residual within tolerance, gap open); null when it is not a test. */
  passed: boolean | null;
}

export interface CertificateView {
  /** One line for the table row: "grid 24 × 24 · |x − n| = 7×10⁻⁸ ≤ 1×10⁻³". */
  summary: string;
  lines: CertificateLine[];
}

/** Grid in the words of the stage that used it. */
function gridText(stage: string, grid: number[]): string {
  if (grid.length === 0) return '—';
  switch (stage) {
    case 'winding':
      return `adaptive quadrature, ${grid[0]} density evaluations`;
    case 'chern':
      return `k grid ${grid.join(' × ')}`;
    case 'ribbon':
      return grid.length >= 2 ? `ribbon ${grid[0]} cells wide, ${grid[1]} momenta` : `ribbon ${grid[0]} cells wide`;
    case 'open-chain':
      return `open chain of ${grid[0]} cells`;
    case 'invariant':
      return `k grid ${grid.join(' × ')}`;
    default:
      return `grid ${grid.join(' × ')}`;
  }
}

const coordinates = (at: number[]) => (at.length === 0 ? '' : ` at s = (${at.map((v) => valueText(v, 3)).join(', ')})`);

export function certificateView(c: Certificate): CertificateView {
  const lines: CertificateLine[] = [];
  const summary: string[] = [];
  if (c.grid.length > 0) {
    lines.push({ term: 'computed on', detail: gridText(c.stage, c.grid), passed: null });
    summary.push(gridText(c.stage, c.grid));
  }
  if (c.raw !== null) lines.push({ term: 'value before rounding', detail: formatRawValue(c.raw), passed: null });
  if (c.residual !== null) {
    const passed = c.residualTolerance === null ? null : c.residual <= c.residualTolerance;
    const text = `${formatNumber(c.residual)}${c.residualTolerance === null ? '' : ` ${passed ? '≤' : '>'} tolerance ${formatNumber(c.residualTolerance)}`}`;
    // An integer estimate's residual is its distance from the integer; otherwise (symmetries, gaps) a plain residual.
    const integer = c.raw !== null;
    const term = integer ? 'distance from the nearest integer' : c.stage === 'gaps' ? 'difference from the claimed value' : 'residual';
    lines.push({ term, detail: text, passed });
    summary.push(`${integer ? '|x − n|' : c.stage === 'gaps' ? '|computed − claimed|' : 'residual'} = ${text.replace(' tolerance', '')}`);
  }
  if (c.refinement.length > 0) {
    lines.push({ term: 'refinement (coarsest first)', detail: c.refinement.map((step) => `${step.label ?? gridText(c.stage, step.grid)} → ${formatRawValue(step.value)}`), passed: null });
  }
  for (const g of c.gaps) {
    lines.push({
      term: `gap at ε = ${quasienergyText(g.gap)}`,
      detail: `smallest ${formatNumber(g.minimalGap)} π/T${coordinates(g.at)}, certified ≥ ${formatNumber(g.lowerBound ?? 0)} π/T over the zone; must exceed ${formatNumber(g.tolerance)} π/T: ${g.open ? 'open' : 'not open'}`,
      passed: g.open,
    });
  }
  for (const s of c.symmetry) {
    const passed = s.residual !== null && s.residual <= s.tolerance;
    lines.push({ term: s.name, detail: `residual ${s.residual === null ? '—' : formatNumber(s.residual)} ${passed ? '≤' : '>'} tolerance ${formatNumber(s.tolerance)}`, passed });
  }
  for (const note of c.notes) lines.push({ term: 'note', detail: note, passed: null });
  lines.push({ term: 'engine stage', detail: c.stage, passed: null });
  const gapsOpen = c.gaps.length > 0 ? `${c.gaps.filter((g) => g.open).length}/${c.gaps.length} gaps open` : '';
  if (gapsOpen) summary.push(gapsOpen);
  return { summary: summary.join(' · ') || 'details', lines };
}
