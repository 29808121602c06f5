/**
 * Verdicts on declared symmetries, for chains and sheets: each operator is a
 * claim that the drive has that symmetry, judged on the residuals of its
 * relations (src/numerics/symmetry/symmetry-residuals.ts); and the file's
 * Altland–Zirnbauer class, judged on the operators it declares and their
 * squares (src/numerics/symmetry/altland-zirnbauer.ts).
 */
import type { SymmetryReport } from '../../numerics/portrait.ts';
import type { AntiunitaryPart, SymmetryClassReport } from '../../numerics/symmetry/altland-zirnbauer.ts';
import { ALTLAND_ZIRNBAUER, type AltlandZirnbauerClass } from '../../numerics/symmetry/altland-zirnbauer.ts';
import { emptyCertificate } from './certificate.ts';
import type { NormalizedClaim, SymmetryName } from './claims.ts';
import { formatNumber } from './format.ts';
import type { VerdictPolicy } from './policy.ts';
import type { SymmetryResidual, Verdict } from './verdict.ts';

/** Two residual entries per declared symmetry: its Hamiltonian relation (with the frame) and its Floquet-operator relation. */
export function residualEntries(reports: SymmetryReport[], which: SymmetryReport['symmetry'][]): SymmetryResidual[] {
  return reports
    .filter((r) => which.includes(r.symmetry))
    .flatMap((r) => [
      { name: `${r.symmetry} symmetry of H(t)${r.frameTime !== undefined ? ` about t₀ = ${Number(r.frameTime.toPrecision(6))}` : ''}`, residual: r.hamiltonianResidual, tolerance: r.tolerance },
      { name: `${r.symmetry} symmetry of the Floquet operator`, residual: r.floquetResidual, tolerance: r.tolerance },
    ]);
}

/** Which declared symmetry a residual belongs to (names start with the symmetry, residualEntries below). */
export function symmetryOf(name: string): SymmetryName | null {
  const m = /^(chiral|particle-hole|time-reversal) symmetry/.exec(name);
  return m ? (m[1] as SymmetryName) : null;
}

/** Residuals held to the engine's tolerance or the policy floor, whichever is larger; only those of `which` when given. */
export function symmetryFor(residuals: SymmetryResidual[], policy: VerdictPolicy, which?: readonly SymmetryName[]): SymmetryResidual[] {
  return residuals
    .filter((s) => which === undefined || which.includes(symmetryOf(s.name) as SymmetryName))
    .map((s) => ({ name: s.name, residual: s.residual, tolerance: Math.max(s.tolerance, policy.symmetryTolerance) }));
}

export const isBroken = (s: SymmetryResidual) => !(s.residual <= s.tolerance);

/** The relation a residual measures, in formulas, and where it was taken (src/numerics/symmetry/symmetry-residuals.ts). */
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
      return `${r.formula} = ${formatNumber(s.residual)} ${isBroken(s) ? '>' : '≤'} tolerance ${formatNumber(s.tolerance)}${r.where ? ` (${r.where})` : ''}`;
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
export function symmetryVerdict(claim: NormalizedClaim & { kind: 'symmetry' }, residuals: SymmetryResidual[]): Verdict {
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


const SQUARE_WORDS = { 1: '+1', [-1]: '−1' } as Record<number, string>;

function describePart(symbol: 'T' | 'C', p: AntiunitaryPart): string {
  switch (p.presence) {
    case 'absent':
      return `no ${symbol}`;
    case 'unitary':
      return `no ${symbol} (the operator is declared without complex conjugation, "antiunitary": false)`;
    default:
      return p.square === null
        ? `${symbol} ${p.presence === 'implied' ? '(implied by S and the other) ' : ''}whose square is not ±1 (distance ${formatNumber(p.defect)})`
        : `${symbol}² = ${SQUARE_WORDS[p.square]}${p.presence === 'implied' ? ' (implied by S and the other)' : ''}`;
  }
}

/** The declared operators in words: "T² = +1, C² = +1 (implied by S and the other), S declared". */
export function describeDeclaredClass(r: SymmetryClassReport): string {
  const s = r.chiral.presence === 'absent' ? 'no S' : r.chiral.presence === 'declared' ? 'S declared' : 'S = T·C implied';
  return `${describePart('T', r.timeReversal)}, ${describePart('C', r.particleHole)}, ${s}`;
}

function requirementWords(name: AltlandZirnbauerClass): string {
  const q = ALTLAND_ZIRNBAUER[name];
  const sq = (v: number, symbol: string) => (v === 0 ? `no ${symbol}` : `${symbol}² = ${SQUARE_WORDS[v]}`);
  return `${sq(q.T, 'T')}, ${sq(q.C, 'C')}, ${q.S ? 'S' : 'no S'}`;
}

/**
 * The claimed Altland–Zirnbauer class: confirmed when the declared operators
 * (T and C with their squares, S declared or implied) are exactly those the
 * class requires and each declared operator holds on the drive; contradicted
 * when they define another class or one of them is broken. The engine checks
 * the declared operators only: it does not search for symmetries the file does
 * not declare, and says so.
 */
export function symmetryClassVerdict(
  claim: NormalizedClaim & { kind: 'symmetry-class' },
  report: SymmetryClassReport,
  residuals: SymmetryResidual[],
  policy: VerdictPolicy,
): Verdict {
  const certificate = emptyCertificate('symmetries');
  certificate.symmetry = symmetryFor(residuals, policy);
  const declared = describeDeclaredClass(report);
  const required = requirementWords(claim.value);
  certificate.notes.push(
    `class ${claim.value} requires ${required}; declared: ${declared}`,
    'the engine checks the operators the file declares; it does not search for symmetries the file does not declare',
  );
  const base = { claim: claim.id, kind: claim.kind, pointer: claim.pointer, gap: null, claimed: claim.value, certificate };
  const broken = certificate.symmetry.filter(isBroken);
  if (report.class !== claim.value) {
    const computed = report.class;
    const what = computed === null ? 'define no Altland–Zirnbauer class' : `define class ${computed}`;
    return {
      ...base,
      outcome: 'contradicted',
      computed,
      estimate: computed,
      message: `The declared operators (${declared}) ${what}, but the file claims class ${claim.value} (${required}).`,
      hint: `declare exactly the operators class ${claim.value} requires in claims.symmetries (time reversal and particle–hole with "antiunitary": true), or correct claims.symmetryClass`,
    };
  }
  if (broken.length > 0) {
    const why = `symmetry broken: ${describeResiduals(broken)}`;
    certificate.notes.push(why);
    return {
      ...base,
      outcome: 'contradicted',
      computed: null,
      estimate: claim.value,
      message: `The declared operators have the form class ${claim.value} requires, but the drive breaks one of them, ${why}.`,
      hint: 'see the verdict on the broken symmetry: fix its operator or the terms that break it',
    };
  }
  return {
    ...base,
    outcome: 'confirmed',
    computed: claim.value,
    estimate: claim.value,
    message: `The declared operators (${declared}) are those of class ${claim.value}, and each holds on the drive.`,
    hint: null,
  };
}
