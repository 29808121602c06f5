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
import { countAtTwoSizes, countEvidence, gapReason, judgeEstimate } from './evidence.ts';
import { formatQuasienergy } from './format.ts';
import type { VerdictPolicy } from './policy.ts';
import type { PortraitEntry } from './sheet-verdicts.ts';
import { entry, findGap, gapEvidence, minimalGapVerdict, noGapReason, notApplicable, sameLabel } from './sheet-verdicts.ts';
import type { Alternative, SymmetryResidual, Verdict } from './verdict.ts';
import { integerVerdict, symmetryBrokenVerdict } from './verdict.ts';

export const SIGN_HINT_CHAIN = 'sign differs: check the direction of a₁ and the order of the sublattices in the chiral operator Γ';

/** ν_π flips when the two frames are swapped: a sign-only disagreement at π/T most often means the other frame order. */
export function frameOrderHint(view: ChainView): string {
  const first = view.frames[0];
  const declared = (view.frameNotes ?? []).some((n) => n.startsWith('frames as declared'));
  const where = first ? ` (here t₀ = ${Number(first.time.toPrecision(6))}, ${declared ? 'the first time listed' : 'found by the engine, since none is listed'})` : '';
  return `sign differs: ν_π = (ν′ − ν″)/2 changes sign when the two symmetric frames are swapped, and the first time in claims.symmetries.chiral.symmetricTimes defines ν′${where}; check the order of the frames (or the order of the sublattices in Γ)`;
}

const frameSymbol = (name: 'first' | 'second') => (name === 'first' ? 'ν′' : 'ν″');

/** Which declared symmetry a residual of the view belongs to (names start with the symmetry, chain-view.ts). */
function symmetryOf(name: string): SymmetryName | null {
  const m = /^(chiral|particle-hole|time-reversal) symmetry/.exec(name);
  return m ? (m[1] as SymmetryName) : null;
}

/** The view's residuals, held to the engine's tolerance or the policy floor, whichever is larger. */
function symmetryFor(view: ChainView, policy: VerdictPolicy, which?: readonly SymmetryName[]): SymmetryResidual[] {
  return view.symmetry
    .filter((s) => which === undefined || which.includes(symmetryOf(s.name) as SymmetryName))
    .map((s) => ({ name: s.name, residual: s.residual, tolerance: Math.max(s.tolerance, policy.symmetryTolerance) }));
}

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

const isBroken = (s: SymmetryResidual) => !(s.residual <= s.tolerance);

/** The relation a residual measures, in formulas, and where it was taken (src/numerics/chain/symmetry-residuals.ts). */
function relation(name: string): { formula: string; where: string } {
  const floquet = /Floquet/.test(name);
  const frame = /about t₀ = ([^ ]+)/.exec(name);
  const best = frame ? `, best frame t₀ = ${frame[1]}` : '';
  switch (symmetryOf(name)) {
    case 'chiral':
      return floquet ? { formula: '‖ΓUΓ† − U†‖', where: 'in the symmetric frame' } : { formula: '‖ΓH(t₀+s)Γ† + H(t₀−s)‖', where: `max over k and s${best}` };
    case 'particle-hole':
      return floquet ? { formula: '‖U_C U(k)* U_C† − U(−k)‖', where: 'max over k' } : { formula: '‖U_C H(k, t)* U_C† + H(−k, t)‖', where: 'max over k and t' };
    case 'time-reversal':
      return floquet ? { formula: '‖U_T U(k)* U_T† − U(−k)†‖', where: 'in the symmetric frame' } : { formula: '‖U_T H(k, t₀+s)* U_T† − H(−k, t₀−s)‖', where: `max over k and s${best}` };
    default:
      return { formula: name, where: '' };
  }
}

export function describeResiduals(list: SymmetryResidual[]): string {
  return list
    .map((s) => {
      const r = relation(s.name);
      return `${r.formula} = ${s.residual.toPrecision(3)} ${isBroken(s) ? '>' : '≤'} tolerance ${s.tolerance.toPrecision(3)}${r.where ? ` (${r.where})` : ''}`;
    })
    .join('; ');
}

const SYMMETRY_WORDS: Record<SymmetryName, { what: string; hint: string }> = {
  chiral: {
    what: 'The chiral symmetry Γ',
    hint: 'Γ must satisfy Γ H(t₀ + s) Γ† = −H(t₀ − s) for some frame t₀: check the operator (its signs follow the order of lattice.orbitals) and terms that break it, such as onsite energies',
  },
  'particle-hole': {
    what: 'The particle–hole symmetry U_C K',
    hint: 'U_C must satisfy U_C H(k, t)* U_C† = −H(−k, t): check the unitary (particle block first, then hole block, for Nambu models) and terms that break it',
  },
  'time-reversal': {
    what: 'The time-reversal symmetry U_T K',
    hint: 'U_T must satisfy U_T H(k, t₀ + s)* U_T† = H(−k, t₀ − s) for some frame t₀: check the unitary and complex hoppings or drive phases that break it',
  },
};

/** A declared symmetry operator: confirmed when every residual is within tolerance, contradicted otherwise. */
function symmetryVerdict(claim: NormalizedClaim & { kind: 'symmetry' }, residuals: SymmetryResidual[]): Verdict {
  const certificate = emptyCertificate('symmetries');
  certificate.symmetry = residuals;
  const words = SYMMETRY_WORDS[claim.symmetry];
  const base = { claim: claim.id, kind: claim.kind, pointer: claim.pointer, gap: null, claimed: claim.value, certificate };
  if (residuals.length === 0) {
    certificate.notes.push('the engine reported no residual for this symmetry');
    return { ...base, outcome: 'unsettled', computed: null, estimate: null, message: `${words.what} could not be checked: the engine reported no residual for it.`, hint: null };
  }
  const worst = residuals.reduce((a, b) => (b.residual / b.tolerance > a.residual / a.tolerance || Number.isNaN(b.residual) ? b : a));
  certificate.raw = worst.residual;
  certificate.residual = worst.residual;
  certificate.residualTolerance = worst.tolerance;
  certificate.notes.push('residuals are maxima over the engine\'s check momenta and times; Hamiltonian residuals are relative to max(1, ‖H‖_F)');
  const broken = residuals.filter(isBroken);
  if (broken.length === 0) {
    return { ...base, outcome: 'confirmed', computed: true, estimate: true, message: `${words.what} holds: ${describeResiduals(residuals)}.`, hint: null };
  }
  const why = `symmetry broken: ${describeResiduals(broken)}`;
  certificate.notes.push(why);
  return { ...base, outcome: 'contradicted', computed: false, estimate: false, message: `${words.what} does not hold, ${why}.`, hint: words.hint };
}

interface InvariantEvidence extends SettledInteger {
  /** Residuals above tolerance of the symmetries the invariant rests on. */
  broken: SymmetryResidual[];
}

function invariantEvidence(view: ChainView, label: number, policy: VerdictPolicy): InvariantEvidence {
  const gap = findGap(view.gaps, label);
  const inv = gap ? view.invariants.find((i) => sameLabel(i.gap, gap.label)) : undefined;
  const basis = invariantSymmetries(view);
  const symmetry = inv ? inv.symmetry.map((s) => ({ ...s, tolerance: Math.max(s.tolerance, policy.symmetryTolerance) })) : symmetryFor(view, policy, basis);
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
      if (basis.length === 0) reasons.push('no chiral or particle–hole symmetry is declared (claims.symmetries), and without one a chain has no invariant');
      else if (g.open) reasons.push(`the engine computed no invariant${view.invariantNote ? `: ${view.invariantNote}` : ''}`);
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
      ev.certificate.refinement.push(...fe.certificate.refinement.map((step) => ({ grid: [...step.grid], value: step.value })));
      if (!fe.settled) {
        const why = `${frameSymbol(frame.name)} (frame t₀ = ${Number(frame.time.toPrecision(6))}) is unsettled`;
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
  const symmetry = symmetryFor(view, policy, invariantSymmetries(view));
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
        verdicts.push(symmetryVerdict(claim, symmetryFor(view, policy, [claim.symmetry])));
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
  const all = symmetryFor(view, policy);
  for (const c of [...verdicts.map((v) => v.certificate), ...entries.filter((e) => e.quantity !== 'gap-invariant').map((e) => e.certificate)]) {
    if (c.symmetry.length === 0) c.symmetry = all.map((s) => ({ ...s }));
  }
  return { verdicts, entries };
}

export { findGap };
