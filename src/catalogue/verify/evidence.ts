/**
 * Whether a computed integer is settled: strong enough evidence to confirm or
 * contradict a claim. An integer is settled when
 *   1. every gap it depends on is open by more than the gap tolerance
 *      (policy.ts: max(floor, safety · band velocity · grid spacing));
 *   2. its residual |x − round x| is within tolerance and the engine marked it converged;
 *   3. the last two refinement steps round to the same integer (when required;
 *      a Z₂ index decided by a sign with a margin has no refinement and the
 *      margin test in its estimate stands in for it);
 *   4. every symmetry it relies on holds to the symmetry tolerance.
 * Otherwise it is unsettled and the reasons say which test failed, in words.
 */
import type { IntegerEstimate } from '../../numerics/certificates.ts';
import type { Certificate, GapEvidence } from './certificate.ts';
import { certificateFromEstimate } from './certificate.ts';
import type { VerdictPolicy } from './policy.ts';
import { formatQuasienergy } from './format.ts';

export interface SettledInteger {
  /** round(raw) when settled, else null. */
  value: number | null;
  /** round(raw) whatever the evidence (for "computed ≈ …" in messages). */
  nearest: number | null;
  settled: boolean;
  reasons: string[];
  certificate: Certificate;
}

export function judgeEstimate(
  estimate: IntegerEstimate | undefined,
  gaps: GapEvidence[],
  policy: VerdictPolicy,
  stage: string,
  symmetry: { name: string; residual: number; tolerance: number }[] = [],
  signDecided = false,
): SettledInteger {
  if (!estimate) {
    const certificate: Certificate = {
      grid: [],
      raw: null,
      residual: null,
      residualTolerance: null,
      refinement: [],
      gaps,
      symmetry,
      stage,
      notes: ['the engine did not compute this quantity'],
    };
    return { value: null, nearest: null, settled: false, reasons: ['not computed by the engine'], certificate };
  }
  const certificate = certificateFromEstimate(estimate, stage);
  certificate.gaps = gaps;
  certificate.symmetry = symmetry;
  const reasons: string[] = [];
  for (const gap of gaps) {
    if (!gap.open) {
      reasons.push(
        `the gap at ${formatQuasienergy(gap.gap)} is ${gap.minimalGap.toPrecision(3)} π/T at s = (${gap.at.map((s) => s.toFixed(3)).join(', ')}), not above the tolerance ${gap.tolerance.toPrecision(3)} π/T`,
      );
    }
  }
  const tolerance = Number.isFinite(estimate.tolerance) && estimate.tolerance > 0 ? estimate.tolerance : policy.defaultResidualTolerance;
  if (!Number.isFinite(estimate.raw)) reasons.push('the computed value is not a finite number');
  else if (estimate.residual > tolerance) {
    reasons.push(`|x − round x| = ${estimate.residual.toPrecision(3)} exceeds the tolerance ${tolerance.toPrecision(3)}`);
  }
  if (estimate.caveat) reasons.push(estimate.caveat);
  if (!estimate.converged && reasons.length === 0) reasons.push('refinement did not converge');
  if (policy.requireStableRefinement && !signDecided) {
    const h = estimate.history;
    if (h.length < 2) reasons.push('computed on a single grid: stability under refinement not shown');
    else if (Math.round(h[h.length - 1].value) !== Math.round(h[h.length - 2].value)) {
      reasons.push(
        `the integer changed under the last refinement (${Math.round(h[h.length - 2].value)} on ${h[h.length - 2].grid.join('×')}, ${Math.round(h[h.length - 1].value)} on ${h[h.length - 1].grid.join('×')})`,
      );
    }
  }
  for (const s of symmetry) {
    if (!(s.residual <= s.tolerance)) reasons.push(`${s.name} holds only to ${s.residual.toPrecision(3)} (tolerance ${s.tolerance.toPrecision(3)})`);
  }
  certificate.notes = [...new Set([...certificate.notes, ...reasons])];
  const nearest = Number.isFinite(estimate.raw) ? Math.round(estimate.raw) + 0 : null; // + 0 turns −0 into 0
  const settled = reasons.length === 0;
  return { value: settled ? nearest : null, nearest, settled, reasons, certificate };
}
