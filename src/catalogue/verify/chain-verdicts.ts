/**
 * Verdicts and portrait entries for one-dimensional drives.
 *
 * Chiral chains: the invariants of the gaps at 0 and π/T follow from the
 * windings ν′, ν″ of the two symmetric time frames, ν₀ = (ν′ + ν″)/2 and
 * ν_π = (ν′ − ν″)/2 (Asbóth & Obuse, PRB 88, 121406(R) (2013); Asbóth,
 * Tarasinski, Delplace, PRB 90, 125143 (2014)). A claim equal to ν′ or ν″
 * instead of ν₀ or ν_π is the classic frame mix-up, and is named as such.
 * Class D chains: Z₂ indices at 0 and π (Jiang et al., PRL 106, 220402 (2011)).
 */
import type { ChainView } from './chain-view.ts';
import type { NormalizedClaim } from './claims.ts';
import { gapKey } from './claims.ts';
import { emptyCertificate } from './certificate.ts';
import type { SettledInteger } from './evidence.ts';
import { judgeEstimate } from './evidence.ts';
import { formatQuasienergy } from './format.ts';
import type { VerdictPolicy } from './policy.ts';
import type { PortraitEntry } from './sheet-verdicts.ts';
import { entry, findGap, gapEvidence, minimalGapVerdict, notApplicable, sameLabel } from './sheet-verdicts.ts';
import type { Alternative, Verdict } from './verdict.ts';
import { integerVerdict } from './verdict.ts';

export const SIGN_HINT_CHAIN = 'sign differs: check the direction of a₁ and the order of the sublattices in the chiral operator Γ';

const frameSymbol = (name: 'first' | 'second') => (name === 'first' ? 'ν′' : 'ν″');

function symmetryFor(view: ChainView, policy: VerdictPolicy) {
  return view.symmetry.map((s) => ({ name: s.name, residual: s.residual, tolerance: Math.max(s.tolerance, policy.symmetryTolerance) }));
}

function invariantEvidence(view: ChainView, label: number, policy: VerdictPolicy): SettledInteger {
  const gap = findGap(view.gaps, label);
  const inv = gap ? view.invariants.find((i) => sameLabel(i.gap, gap.label)) : undefined;
  const symmetry = (inv?.symmetry ?? []).map((s) => ({ ...s, tolerance: Math.max(s.tolerance, policy.symmetryTolerance) }));
  const fromFrames = inv?.fromFrames === true && view.frames.length > 0;
  const ev = judgeEstimate(inv?.estimate, [gapEvidence(view, label, policy)], policy, inv?.kind === 'z2' ? 'majorana' : 'invariant', symmetry, inv?.signDecided === true || fromFrames);
  if (fromFrames) {
    // ν₀ = (ν′ + ν″)/2 and ν_π = (ν′ − ν″)/2 are only as stable as the frame windings they come from.
    for (const { frame, ev: fe } of frameEvidence(view, policy)) {
      ev.certificate.refinement.push(...fe.certificate.refinement.map((step) => ({ grid: [...step.grid], value: step.value })));
      if (!fe.settled) {
        const why = `${frameSymbol(frame.name)} (frame t₀ = ${Number(frame.time.toPrecision(6))}) is unsettled`;
        ev.reasons.push(why);
        ev.certificate.notes.push(why);
      }
    }
    ev.certificate.notes.push('computed as (ν′ ± ν″)/2 from the frame windings; the refinement history lists ν′ then ν″');
    if (ev.reasons.length > 0) {
      ev.settled = false;
      ev.value = null;
    }
  }
  return ev;
}

function endModeEvidence(view: ChainView, label: number, policy: VerdictPolicy): SettledInteger {
  const gap = findGap(view.gaps, label);
  const modes = gap ? view.endModes.find((m) => sameLabel(m.gap, gap.label)) : undefined;
  const gaps = [gapEvidence(view, label, policy)];
  const certificate = emptyCertificate('open-chain');
  certificate.gaps = gaps;
  const reasons: string[] = [];
  if (!modes) reasons.push('the open-chain spectrum was not analysed for this gap');
  else {
    certificate.grid = [modes.chainLength];
    certificate.notes.push(`chain length ${modes.chainLength} cells, decay length ≈ ${modes.decayLength.toPrecision(3)} cells`);
    if (!modes.settled || modes.count === null) reasons.push(modes.reason ?? 'the end-mode count is unsettled (chain too short for the decay length)');
  }
  for (const g of gaps) if (!g.open) reasons.push(`the gap at ${formatQuasienergy(g.gap)} is ${g.minimalGap.toPrecision(3)} π/T, not above the tolerance ${g.tolerance.toPrecision(3)} π/T`);
  certificate.notes.push(...reasons);
  const nearest = modes?.count ?? null;
  if (nearest !== null) certificate.raw = nearest;
  const settled = reasons.length === 0 && nearest !== null;
  return { value: settled ? nearest : null, nearest, settled, reasons, certificate };
}

function frameEvidence(view: ChainView, policy: VerdictPolicy) {
  return view.frames.map((f) => ({ frame: f, ev: judgeEstimate(f.estimate, view.gaps.map((g) => gapEvidence(view, g.label, policy)), policy, 'frames', symmetryFor(view, policy)) }));
}

export function judgeChain(view: ChainView, claims: NormalizedClaim[], policy: VerdictPolicy): { verdicts: Verdict[]; entries: PortraitEntry[] } {
  const verdicts: Verdict[] = [];
  const labels = view.gaps.map((g) => g.label);
  const frames = frameEvidence(view, policy);
  for (const claim of claims) {
    switch (claim.kind) {
      case 'gap-invariant': {
        const ev = invariantEvidence(view, claim.gap, policy);
        const alternatives: Alternative[] = [];
        if (ev.value) alternatives.push({ value: -ev.value, hint: SIGN_HINT_CHAIN });
        for (const l of labels) {
          if (sameLabel(l, claim.gap)) continue;
          const v = invariantEvidence(view, l, policy).value;
          if (v !== null) alternatives.push({ value: v, hint: `this value belongs to the gap at ${formatQuasienergy(l)}` });
        }
        for (const { frame, ev: fe } of frames) {
          if (fe.value === null) continue;
          const other = frames.length > 1 ? (frame.name === 'second' ? 'other ' : 'first ') : '';
          alternatives.push({
            value: fe.value,
            hint: `matches ${frameSymbol(frame.name)} of the ${other}symmetric frame (t₀ = ${Number(frame.time.toPrecision(6))}); the gap invariants are ν₀ = (ν′ + ν″)/2 and ν_π = (ν′ − ν″)/2`,
          });
        }
        verdicts.push(integerVerdict(claim, claim.gap, `The invariant of the gap at ${formatQuasienergy(claim.gap)}`, ev, alternatives));
        break;
      }
      case 'end-modes': {
        const ev = endModeEvidence(view, claim.gap, policy);
        const alternatives: Alternative[] = [];
        for (const l of labels) {
          if (sameLabel(l, claim.gap)) continue;
          const v = endModeEvidence(view, l, policy).value;
          if (v !== null) alternatives.push({ value: v, hint: `this value belongs to the gap at ${formatQuasienergy(l)}` });
        }
        verdicts.push(integerVerdict(claim, claim.gap, `The number of end modes per end at ${formatQuasienergy(claim.gap)}`, ev, alternatives));
        break;
      }
      case 'minimal-gap':
        verdicts.push(minimalGapVerdict(claim, gapEvidence(view, claim.gap, policy)));
        break;
      case 'anomalous':
        break; // judged from the whole portrait (analyse-point.ts)
      default:
        verdicts.push(notApplicable(claim, 'a one-dimensional model'));
    }
  }
  const claimed = new Set(claims.map((c) => c.id));
  const entries: PortraitEntry[] = [];
  for (const l of labels) {
    const inv = view.invariants.find((i) => sameLabel(i.gap, l));
    if (inv) {
      const id = `gap-${gapKey(l)}/invariant`;
      const name = sameLabel(l, 0) ? 'ν₀' : sameLabel(l, 1) ? 'ν_π' : 'invariant';
      entries.push(entry(id, 'gap-invariant', l, `${inv.kind === 'z2' ? 'Z₂ index' : 'winding'} ${name} of the gap at ${formatQuasienergy(l)}`, invariantEvidence(view, l, policy), claimed.has(id)));
    }
    if (view.endModes.some((m) => sameLabel(m.gap, l))) {
      const id = `gap-${gapKey(l)}/end-modes`;
      entries.push(entry(id, 'end-modes', l, `end modes per end at ${formatQuasienergy(l)}`, endModeEvidence(view, l, policy), claimed.has(id)));
    }
  }
  for (const { frame, ev } of frames) {
    entries.push(entry(`frame-${frame.name}/winding`, 'frame-winding', null, `winding ${frameSymbol(frame.name)} of the ${frame.name} symmetric frame (t₀ = ${Number(frame.time.toPrecision(6))})`, ev, false));
  }
  return { verdicts, entries };
}

export { findGap };
