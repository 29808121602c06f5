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
import type { ChainView, EndModeCount } from './chain-view.ts';
import type { NormalizedClaim, SymmetryName } from './claims.ts';
import { gapKey } from './claims.ts';
import { emptyCertificate } from './certificate.ts';
import type { Certificate } from './certificate.ts';
import type { CountObservation, SettledInteger } from './evidence.ts';
import { countAtTwoSizes, countEvidence, gapReason, judgeEstimate, STAGE_REMEDIES, withRemedy } from './evidence.ts';
import { formatGrid, formatQuasienergy } from './format.ts';
import type { VerdictPolicy } from './policy.ts';
import type { PortraitEntry } from './sheet-verdicts.ts';
import { entry, findGap, gapEvidence, minimalGapVerdict, noGapReason, notApplicable, sameLabel } from './sheet-verdicts.ts';
import type { Alternative, SymmetryResidual, Verdict } from './verdict.ts';
import { integerVerdict, symmetryBrokenVerdict } from './verdict.ts';
import { describeResiduals, isBroken, symmetryClassVerdict, symmetryFor, symmetryOf, symmetryVerdict } from './symmetry-verdicts.ts';

export const SIGN_HINT_CHAIN = 'sign differs: check the direction of a₁ and the order of the sublattices in the chiral operator Γ';

/** ν_π flips when the two frames are swapped: a sign-only disagreement at π/T most often means the other frame order. */
export function frameOrderHint(view: ChainView): string {
  const first = view.frames[0];
  const declared = (view.frameNotes ?? []).some((n) => n.startsWith('frames as declared'));
  const where = first ? ` (here t₀ = ${Number(first.time.toPrecision(6))}, ${declared ? 'the first time listed' : 'found by the engine, since none is listed'})` : '';
  return `sign differs: ν_π = (ν′ − ν″)/2 changes sign when the two symmetric frames are swapped, and the first time in claims.symmetries.chiral.symmetricTimes defines ν′${where}; check the order of the frames (or the order of the sublattices in Γ)`;
}

const frameSymbol = (name: 'first' | 'second') => (name === 'first' ? 'ν′' : 'ν″');

/**
 * The symmetries the invariants at 0 and π/T rest on, as the engine uses them:
 * the declared chiral operator Γ; else Γ = U_T U_C* from time reversal and
 * particle–hole; else particle–hole alone (class D, Z₂ indices).
 */
export function invariantSymmetries(view: ChainView): SymmetryName[] {
  const declared = new Set(view.symmetry.map((s) => symmetryOf(s.name)));
  if (declared.has('chiral')) return ['chiral'];
  if (declared.has('particle-hole') && declared.has('time-reversal')) return ['time-reversal', 'particle-hole'];
  if (declared.has('particle-hole')) return ['particle-hole'];
  return [];
}

interface InvariantEvidence extends SettledInteger {
  /** Residuals above tolerance of the symmetries the invariant rests on. */
  broken: SymmetryResidual[];
}

function invariantEvidence(view: ChainView, label: number, policy: VerdictPolicy): InvariantEvidence {
  const gap = findGap(view.gaps, label);
  const inv = gap ? view.invariants.find((i) => sameLabel(i.gap, gap.label)) : undefined;
  const basis = invariantSymmetries(view);
  const symmetry = inv ? inv.symmetry.map((s) => ({ ...s, tolerance: Math.max(s.tolerance, policy.symmetryTolerance) })) : symmetryFor(view.symmetry, policy, basis);
  const broken = symmetry.filter(isBroken);
  const stage = inv?.kind === 'z2' || (!inv && basis.length === 1 && basis[0] === 'particle-hole') ? 'majorana' : 'invariant';
  if (broken.length > 0) {
    const certificate: Certificate = inv ? judgeEstimate(inv.estimate, [gapEvidence(view, label, policy)], policy, stage, symmetry).certificate : emptyCertificate(stage);
    certificate.symmetry = symmetry;
    if (gap) certificate.gaps = [gapEvidence(view, label, policy)];
    const why = `symmetry broken: ${describeResiduals(broken)}`;
    certificate.notes = [why];
    const nearest = inv && Number.isFinite(inv.estimate.raw) ? Math.round(inv.estimate.raw) + 0 : null;
    return { value: null, nearest, settled: false, reasons: [why], certificate, broken };
  }
  if (!inv) {
    const certificate = emptyCertificate(stage);
    certificate.symmetry = symmetry;
    const reasons: string[] = [];
    if (!gap) reasons.push(noGapReason(view, label));
    else {
      const g = gapEvidence(view, label, policy);
      certificate.gaps = [g];
      if (!g.open) reasons.push(gapReason(g));
      if (basis.length === 0) {
        reasons.push('no chiral or particle–hole symmetry is declared (claims.symmetries), and without one a chain has no invariant; to settle, declare the chiral operator (with symmetricTimes) or the particle–hole operator in claims.symmetries');
      } else if (g.open) {
        reasons.push(withRemedy(`the engine computed no invariant${view.invariantNote ? `: ${view.invariantNote}` : ''}`, 'check the declared operator against the drive (see the verdict on the symmetry)'));
      }
    }
    certificate.notes.push(...reasons);
    return { value: null, nearest: null, settled: false, reasons, certificate, broken };
  }
  const fromFrames = inv.fromFrames === true && view.frames.length > 0;
  const ev = judgeEstimate(inv.estimate, [gapEvidence(view, label, policy)], policy, stage, symmetry, inv.signDecided === true || fromFrames);
  if (inv.method) ev.certificate.notes.push(`computed as ${inv.method}`);
  if (inv.kind === 'winding') ev.certificate.notes.push(...(view.frameNotes ?? []));
  if (fromFrames) {
    // ν₀ = (ν′ + ν″)/2 and ν_π = (ν′ − ν″)/2 are only as stable as the frame windings they come from.
    for (const { frame, ev: fe } of frameEvidence(view, policy)) {
      const symbol = frameSymbol(frame.name);
      ev.certificate.refinement.push(...fe.certificate.refinement.map((step) => ({ grid: [...step.grid], value: step.value, label: `${symbol}: ${step.label ?? formatGrid(step.grid)}` })));
      if (!fe.settled) {
        const why = withRemedy(`${frameSymbol(frame.name)} (frame t₀ = ${Number(frame.time.toPrecision(6))}) is unsettled`, STAGE_REMEDIES.frames);
        ev.reasons.push(why);
        ev.certificate.notes.push(why);
      }
    }
    ev.certificate.notes.push('the refinement history lists ν′ then ν″');
    if (ev.reasons.length > 0) {
      ev.settled = false;
      ev.value = null;
    }
  }
  return { ...ev, broken };
}

function endObservation(modes: EndModeCount[], gapLabel: number): CountObservation | string {
  const m = modes.find((x) => sameLabel(x.gap, gapLabel));
  if (!m) return 'the open-chain spectrum was not analysed for this gap';
  return {
    grid: [m.chainLength],
    count: m.count,
    settled: m.settled,
    ...(m.reason !== undefined ? { reason: m.reason } : {}),
    note: `chain length ${m.chainLength} cells, decay length ≈ ${m.decayLength.toPrecision(3)} cells`,
  };
}

/** End modes per end, settled only when a chain 1.5× as long (checkEndModes) gives the same count. */
function endModeEvidence(view: ChainView, label: number, policy: VerdictPolicy): SettledInteger {
  const gap = findGap(view.gaps, label);
  const gaps = [gapEvidence(view, label, policy)];
  const unsettled = 'the end-mode count is unsettled (chain too short for the decay length)';
  if (!gap) return countEvidence('open-chain', noGapReason(view, label), gaps, unsettled);
  const first = countEvidence('open-chain', endObservation(view.endModes, gap.label), gaps, unsettled);
  const check = view.checkEndModes ? countEvidence('open-chain', endObservation(view.checkEndModes, gap.label), gaps, unsettled) : undefined;
  return countAtTwoSizes(first, check, 'chain length');
}

function frameEvidence(view: ChainView, policy: VerdictPolicy) {
  const symmetry = symmetryFor(view.symmetry, policy, invariantSymmetries(view));
  return view.frames.map((f) => ({ frame: f, ev: judgeEstimate(f.estimate, view.gaps.map((g) => gapEvidence(view, g.label, policy)), policy, 'frames', symmetry) }));
}

export function judgeChain(view: ChainView, claims: NormalizedClaim[], policy: VerdictPolicy): { verdicts: Verdict[]; entries: PortraitEntry[] } {
  const verdicts: Verdict[] = [];
  const labels = view.gaps.map((g) => g.label);
  const frames = frameEvidence(view, policy);
  for (const claim of claims) {
    switch (claim.kind) {
      case 'gap-invariant': {
        const ev = invariantEvidence(view, claim.gap, policy);
        const what = `The invariant of the gap at ${formatQuasienergy(claim.gap)}`;
        if (ev.broken.length > 0) {
          verdicts.push(symmetryBrokenVerdict(claim, claim.gap, what, ev, describeResiduals(ev.broken)));
          break;
        }
        const alternatives: Alternative[] = [];
        const chiralPi = sameLabel(claim.gap, 1) && view.invariants.some((i) => i.kind === 'winding' && sameLabel(i.gap, 1));
        if (ev.value) alternatives.push({ value: -ev.value, hint: chiralPi ? frameOrderHint(view) : SIGN_HINT_CHAIN });
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
        verdicts.push(integerVerdict(claim, claim.gap, what, ev, alternatives));
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
      case 'symmetry':
        verdicts.push(symmetryVerdict(claim, symmetryFor(view.symmetry, policy, [claim.symmetry])));
        break;
      case 'symmetry-class':
        verdicts.push(view.symmetryClass ? symmetryClassVerdict(claim, view.symmetryClass, view.symmetry, policy) : notApplicable(claim, 'a view without the declared operators'));
        break;
      default:
        verdicts.push(notApplicable(claim, 'a one-dimensional model'));
    }
  }
  const claimed = new Set(claims.map((c) => c.id));
  const entries: PortraitEntry[] = [];
  const basis = invariantSymmetries(view);
  for (const l of labels) {
    const inv = view.invariants.find((i) => sameLabel(i.gap, l));
    // With a declared symmetry the invariant is listed even when it could not be computed, with the reason.
    if (inv || basis.length > 0) {
      const id = `gap-${gapKey(l)}/invariant`;
      const name = sameLabel(l, 0) ? 'ν₀' : sameLabel(l, 1) ? 'ν_π' : 'invariant';
      const z2 = inv ? inv.kind === 'z2' : basis.length === 1 && basis[0] === 'particle-hole';
      entries.push(entry(id, 'gap-invariant', l, `${z2 ? 'Z₂ index' : 'winding'} ${name} of the gap at ${formatQuasienergy(l)}`, invariantEvidence(view, l, policy), claimed.has(id)));
    }
    if (view.endModes.some((m) => sameLabel(m.gap, l))) {
      const id = `gap-${gapKey(l)}/end-modes`;
      entries.push(entry(id, 'end-modes', l, `end modes per end at ${formatQuasienergy(l)}`, endModeEvidence(view, l, policy), claimed.has(id)));
    }
  }
  for (const { frame, ev } of frames) {
    entries.push(entry(`frame-${frame.name}/winding`, 'frame-winding', null, `winding ${frameSymbol(frame.name)} of the ${frame.name} symmetric frame (t₀ = ${Number(frame.time.toPrecision(6))})`, ev, false));
  }
  // Every chain certificate shows the declared symmetries' residuals; invariants list the ones they rest on.
  const all = symmetryFor(view.symmetry, policy);
  for (const c of [...verdicts.map((v) => v.certificate), ...entries.filter((e) => e.quantity !== 'gap-invariant').map((e) => e.certificate)]) {
    if (c.symmetry.length === 0) c.symmetry = all.map((s) => ({ ...s }));
  }
  return { verdicts, entries };
}

export { findGap };
