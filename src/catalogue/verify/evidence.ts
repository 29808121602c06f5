/**
 * Whether a computed integer is settled: strong enough evidence to confirm or
 * contradict a claim. An integer is settled when
 *   1. every gap it depends on is open: the certified lower bound of its
 *      minimal direct gap exceeds the gap tolerance (policy.ts);
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
import { formatGrid, formatNumber, formatQuasienergy } from './format.ts';
import { GAP_TOLERANCE_LIMIT } from './policy.ts';

export interface SettledInteger {
  /** round(raw) when settled, else null. */
  value: number | null;
  /** round(raw) whatever the evidence (for "computed ≈ …" in messages). */
  nearest: number | null;
  settled: boolean;
  reasons: string[];
  certificate: Certificate;
}

/**
 * Why a gap a number depends on does not count as open, and what would settle
 * it: a sample below the tolerance (at a phase transition when the gap is small
 * against the bandwidth, else the tolerance to lower), or a lower bound the
 * evaluation budget could not push above the tolerance.
 */
export function gapReason(g: GapEvidence, what = 'the gap'): string {
  const at = g.at.length > 0 ? ` at s = (${g.at.map((s) => s.toFixed(3)).join(', ')})` : '';
  const name = `${what} at ${formatQuasienergy(g.gap)}`;
  const tol = `the tolerance ${formatNumber(g.tolerance)} π/T`;
  if (g.bound === 'none' && g.minimalGap === 0 && g.at.length === 0) return `${name} was not found`;
  if (g.bound === 'undecided') {
    return (
      `${name} lies between ${formatNumber(g.lowerBound)} and ${formatNumber(g.minimalGap)} π/T (certified lower bound after ${g.evaluations} evaluations), ` +
      `not shown above ${tol}; to settle, lower numerics.tolerances.gap to ${formatNumber(Math.max(g.lowerBound, GAP_TOLERANCE_LIMIT))} π/T or below`
    );
  }
  if (g.bound === 'none' && g.minimalGap > g.tolerance) return `${name} is ${formatNumber(g.minimalGap)} π/T${at} but has no certified lower bound`;
  const measured = `${name} is ${formatNumber(g.minimalGap)} π/T${at}, not above ${tol}`;
  if (g.nearTransition || g.minimalGap <= GAP_TOLERANCE_LIMIT) {
    const transition = `${measured}: it is small against the bandwidth, so the model sits at or near a phase transition; to settle, move the parameter point away from the phase transition`;
    // A small gap can be the point of the model (a near-critical phase): the tolerance may go down towards
    // the measured gap, never below the hard limit the schema enforces; openness then still needs a
    // certified lower bound above the new tolerance.
    const suggested = g.minimalGap / 2;
    return suggested >= GAP_TOLERANCE_LIMIT
      ? `${transition}, or, if a gap this small is the physics meant, lower numerics.tolerances.gap below the measured ${formatNumber(g.minimalGap)} π/T (for instance to ${formatNumber(Number(suggested.toPrecision(1)))}, hard limit ${formatNumber(GAP_TOLERANCE_LIMIT)}), and the engine will try to certify the gap above it`
      : transition;
  }
  return `${measured}; to settle, if it is a genuine gap, lower numerics.tolerances.gap below ${formatNumber(g.minimalGap)} π/T (hard limit ${formatNumber(GAP_TOLERANCE_LIMIT)})`;
}

/** What settles a quantity of each engine stage when its own reason names nothing (docs/model-format.md, Numerics hints). */
export const STAGE_REMEDIES: Record<string, string> = {
  winding: 'raise numerics.windingEvaluations (the budget of the adaptive quadrature)',
  chern: 'raise numerics.kGrid up to 64 (the Chern refinement doubles it up to 128 × 128), or move the parameter point away from a nearly closed gap',
  invariant: 'move the parameter point away from the gap closing the message names; the invariant of a gap that stays open is computed on its own (half-period method)',
  frames: 'move the parameter point away from the gap closing the message names; the frame windings need both gaps open',
  majorana: 'move the parameter point away from the gap closing at the particle–hole symmetric momentum',
  'open-chain': 'raise numerics.chainLength well beyond the decay length',
  ribbon: 'raise numerics.ribbon.width well beyond the decay length (and numerics.ribbon.momenta when a state has no clear partner)',
};

/** The reason with "; to settle, …" appended unless it already says what settles it. */
export function withRemedy(reason: string, remedy: string | undefined): string {
  return remedy === undefined || /to settle,/.test(reason) ? reason : `${reason}; to settle, ${remedy}`;
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
    // A quantity of a closed gap is not computed at all: the gap is the reason.
    const closed = gaps.filter((g) => !g.open).map((g) => gapReason(g));
    const reasons = closed.length > 0 ? closed : ['not computed by the engine'];
    const certificate: Certificate = {
      grid: [],
      raw: null,
      residual: null,
      residualTolerance: null,
      refinement: [],
      gaps,
      symmetry,
      stage,
      notes: closed.length > 0 ? [...closed] : ['the engine did not compute this quantity'],
    };
    return { value: null, nearest: null, settled: false, reasons, certificate };
  }
  const certificate = certificateFromEstimate(estimate, stage);
  certificate.gaps = gaps;
  certificate.symmetry = symmetry;
  const reasons: string[] = [];
  for (const gap of gaps) if (!gap.open) reasons.push(gapReason(gap));
  const tolerance = Number.isFinite(estimate.tolerance) && estimate.tolerance > 0 ? estimate.tolerance : policy.defaultResidualTolerance;
  const remedy = STAGE_REMEDIES[stage];
  const own: string[] = [];
  if (!Number.isFinite(estimate.raw)) own.push('the computed value is not a finite number');
  else if (estimate.residual > tolerance) own.push(`|x − round x| = ${formatNumber(estimate.residual)} exceeds the tolerance ${formatNumber(tolerance)}`);
  if (estimate.caveat) own.push(estimate.caveat);
  if (!estimate.converged && reasons.length === 0 && own.length === 0) own.push('refinement did not converge');
  if (policy.requireStableRefinement && !signDecided) {
    const h = estimate.history;
    if (h.length < 2) own.push('computed on a single grid: stability under refinement not shown');
    else if (Math.round(h[h.length - 1].value) !== Math.round(h[h.length - 2].value)) {
      const level = (step: (typeof h)[number]) => step.label ?? formatGrid(step.grid);
      own.push(`the integer changed under the last refinement (${Math.round(h[h.length - 2].value)} on ${level(h[h.length - 2])}, ${Math.round(h[h.length - 1].value)} on ${level(h[h.length - 1])})`);
    }
  }
  reasons.push(...own.map((r) => withRemedy(r, remedy)));
  for (const s of symmetry) {
    if (!(s.residual <= s.tolerance)) {
      reasons.push(`${s.name} holds only to ${formatNumber(s.residual)} (tolerance ${formatNumber(s.tolerance)}); to settle, fix the declared operator or the terms that break it`);
    }
  }
  certificate.notes = [...new Set([...certificate.notes, ...reasons])];
  const nearest = Number.isFinite(estimate.raw) ? Math.round(estimate.raw) + 0 : null; // + 0 turns −0 into 0
  const settled = reasons.length === 0;
  return { value: settled ? nearest : null, nearest, settled, reasons, certificate };
}

/**
 * One count of boundary-localised states taken by the engine at one system
 * size: the signed edge count of a ribbon (sheets) or the end-mode count of an
 * open chain (chains). A count is not refined on grids; what stands in for
 * refinement is a second size (see `countAtTwoSizes`).
 */
export interface CountObservation {
  /** System size of the count: [width, momenta] for a ribbon, [length] for a chain. */
  grid: number[];
  count: number | null;
  /** The engine's own verdict on the count (decay length against the size, clean tracking, ends that agree). */
  settled: boolean;
  reason?: string;
  /** Remark on the size and decay length, for the certificate. */
  note: string;
}

/**
 * Evidence for a count: settled when the engine settled it and every bulk gap
 * it depends on is open. `observation` is a string when no count exists (why).
 */
export function countEvidence(stage: string, observation: CountObservation | string, gaps: GapEvidence[], unsettledReason: string): SettledInteger {
  const certificate: Certificate = { grid: [], raw: null, residual: null, residualTolerance: null, refinement: [], gaps, symmetry: [], stage, notes: [] };
  const reasons: string[] = [];
  if (typeof observation === 'string') reasons.push(withRemedy(observation, STAGE_REMEDIES[stage]));
  else {
    certificate.grid = [...observation.grid];
    certificate.notes.push(observation.note);
    if (!observation.settled || observation.count === null) reasons.push(withRemedy(observation.reason ?? unsettledReason, STAGE_REMEDIES[stage]));
  }
  for (const g of gaps) if (!g.open) reasons.push(gapReason(g, 'the bulk gap'));
  certificate.notes.push(...reasons);
  const nearest = typeof observation === 'string' ? null : observation.count;
  if (nearest !== null) certificate.raw = nearest;
  const settled = reasons.length === 0 && nearest !== null;
  return { value: settled ? nearest : null, nearest, settled, reasons, certificate };
}

/**
 * A count is settled only if the same count comes out at a second, larger
 * size: a count that depends on the width of the ribbon or the length of the
 * chain is a finite-size artefact (hybridised end states, a bulk state leaking
 * into the edge region), not a property of the phase. The refinement history
 * lists both sizes. `second` is undefined when no second size was computed.
 */
export function countAtTwoSizes(first: SettledInteger, second: SettledInteger | undefined, size: 'ribbon width' | 'chain length'): SettledInteger {
  if (!first.settled) return first;
  const out: SettledInteger = { ...first, reasons: [...first.reasons], certificate: { ...first.certificate, notes: [...first.certificate.notes], refinement: [] } };
  const n1 = first.certificate.grid[0];
  out.certificate.refinement.push({ grid: [...first.certificate.grid], value: first.value as number });
  let why: string | null = null;
  if (!second) why = `computed at a single ${size} (${n1}): stability under a change of size not shown; to settle, recompute with the second ${size} that verification adds`;
  else {
    const n2 = second.certificate.grid[0];
    if (second.nearest !== null) out.certificate.refinement.push({ grid: [...second.certificate.grid], value: second.nearest });
    const remedy = size === 'ribbon width' ? 'raise numerics.ribbon.width' : 'raise numerics.chainLength';
    if (!second.settled) why = withRemedy(`at ${size} ${n2} the count is unsettled (${second.reasons.join('; ')})`, remedy);
    else if (second.value !== first.value) why = `the count changed with the ${size}: ${first.value} at ${n1}, ${second.value} at ${n2}; to settle, ${remedy} well beyond the decay length`;
    else out.certificate.notes.push(`the same count (${first.value}) at ${size} ${n1} and ${n2}`);
  }
  if (why !== null) {
    out.reasons.push(why);
    out.certificate.notes.push(why);
    out.settled = false;
    out.value = null;
  }
  return out;
}
