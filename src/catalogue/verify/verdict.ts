/**
 * Verdicts: what the recomputation says about one claim.
 *
 *   confirmed    — the computed value is settled (see evidence.ts) and equals the claim;
 *   contradicted — the computed value is settled and differs from the claim,
 *                  or the quantity rests on a declared symmetry that the drive
 *                  breaks (residual above tolerance: "symmetry broken"), or a
 *                  declared symmetry operator is not a symmetry of the drive;
 *   unsettled    — the evidence is too weak either way (gap closed or below
 *                  tolerance, refinement not converged, ribbon too narrow,
 *                  quantity ill-defined). A claim is never contradicted on
 *                  unsettled evidence, nor confirmed by luck.
 */
import type { Certificate } from './certificate.ts';
import type { NormalizedClaim } from './claims.ts';
import type { SettledInteger } from './evidence.ts';
import { formatNumber } from './format.ts';

/** An integer as in every message (typographic minus); anything else in the common number format. */
const integerText = (x: number): string => (Number.isInteger(x) ? String(x).replace(/^-/, '−') : formatNumber(x));

export type VerdictOutcome = 'confirmed' | 'contradicted' | 'unsettled';

export interface Verdict {
  /** Claim id within the model, e.g. "gap-1/winding". */
  claim: string;
  kind: NormalizedClaim['kind'];
  /** JSON pointer of the claimed value in the model file. */
  pointer: string;
  /** Gap label (units π/T) the claim is about, when it is about a gap. */
  gap: number | null;
  outcome: VerdictOutcome;
  claimed: number | boolean | string;
  /** Settled computed value; null when unsettled. */
  computed: number | boolean | string | null;
  /** The nearest integer or value computed even when unsettled (for display), else null. */
  estimate: number | boolean | string | null;
  /** One plain sentence: what was found. */
  message: string;
  /** A likely cause or next step, when one is recognisable. */
  hint: string | null;
  certificate: Certificate;
}

/** One symmetry relation checked: its residual and the tolerance it was held to. */
export interface SymmetryResidual {
  name: string;
  residual: number;
  tolerance: number;
}

/**
 * A claimed invariant that rests on a symmetry the drive breaks: the invariant
 * is not defined, so the claim is contradicted whatever its value (not merely
 * unsettled: refining grids cannot restore a broken symmetry).
 */
export function symmetryBrokenVerdict(claim: NormalizedClaim & { value: number }, gap: number | null, what: string, evidence: SettledInteger, residuals: string): Verdict {
  return {
    claim: claim.id,
    kind: claim.kind,
    pointer: claim.pointer,
    gap,
    claimed: claim.value,
    certificate: evidence.certificate,
    outcome: 'contradicted',
    computed: null,
    estimate: evidence.nearest,
    message: `${what} is not defined, symmetry broken: ${residuals}.`,
    hint: 'the invariant exists only for a drive with the declared symmetry: fix the operator in claims.symmetries or the terms that break it (see the verdict on the symmetry)',
  };
}

/** A value the claim may have been meant as, with the words that explain it. */
export interface Alternative {
  value: number;
  /** Full hint sentence, e.g. "this value belongs to the gap at ε = 0". */
  hint: string;
}

export function integerVerdict(
  claim: NormalizedClaim & { value: number },
  gap: number | null,
  what: string,
  evidence: SettledInteger,
  alternatives: Alternative[],
): Verdict {
  const base = { claim: claim.id, kind: claim.kind, pointer: claim.pointer, gap, claimed: claim.value, certificate: evidence.certificate };
  if (!evidence.settled || evidence.value === null) {
    const estimate = evidence.nearest;
    const seen = estimate === null ? '' : ` (nearest integer on the last grid: ${estimate})`;
    return {
      ...base,
      outcome: 'unsettled',
      computed: null,
      estimate,
      message: `${what} could not be settled${seen}: ${evidence.reasons.join('; ')}.`,
      hint: unsettledHint(evidence.reasons),
    };
  }
  const computed = evidence.value;
  if (computed === claim.value) {
    return { ...base, outcome: 'confirmed', computed, estimate: computed, message: `${what} is ${integerText(computed)}, as claimed.`, hint: null };
  }
  const match = alternatives.find((a) => a.value === claim.value);
  return {
    ...base,
    outcome: 'contradicted',
    computed,
    estimate: computed,
    message: `${what} is ${integerText(computed)}, but the file claims ${integerText(claim.value)}.`,
    hint: match ? match.hint : null,
  };
}

/** The remedy a reason names after "to settle, " (up to the next clause), or null. */
export function settlingRemedy(reason: string): string | null {
  const m = /to settle, ([^;]+)/.exec(reason);
  return m ? m[1].replace(/\.$/, '') : null;
}

/** The first remedy a reason names ("to settle, …"), else a recognised cause. */
function unsettledHint(reasons: string[]): string | null {
  for (const r of reasons) {
    const remedy = settlingRemedy(r);
    if (remedy) return remedy;
  }
  const text = reasons.join(' ');
  if (/no open gap contains/.test(text)) return 'name a gap by a quasienergy inside it (units π/T): pick one of the open gaps listed';
  if (/no chiral or particle–hole symmetry is declared/.test(text)) return 'declare the symmetry the invariant rests on in claims.symmetries (chiral operator with symmetricTimes, or particleHole)';
  return null;
}
