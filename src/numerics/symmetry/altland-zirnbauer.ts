/**
 * The Altland–Zirnbauer classes (Altland & Zirnbauer, PRB 55, 1142 (1997); the
 * periodic table of Schnyder, Ryu, Furusaki, Ludwig, PRB 78, 195125 (2008) and
 * Kitaev, AIP Conf. Proc. 1134, 22 (2009)): each class is fixed by whether an
 * antiunitary time reversal T and an antiunitary particle–hole symmetry C
 * exist, with their squares ±1, and whether the chiral symmetry S = T·C exists.
 *
 * An antiunitary operator U K squares to U U* (K U K = U*), which must be ±1
 * for a symmetry of an irreducible system; the value is independent of the
 * phase of U. When two of T, C, S are given, the third is their product up to a
 * phase: C = S·T has unitary part U_S U_T, so C² = U_S U_T U_S* U_T*, and
 * T = S·C has T² = U_S U_C U_S* U_C*.
 */
import type { ComplexMatrix } from '../linalg/complex-matrix.ts';
import { multiply } from '../linalg/complex-matrix.ts';

export type AltlandZirnbauerClass = 'A' | 'AIII' | 'AI' | 'BDI' | 'D' | 'DIII' | 'AII' | 'CII' | 'C' | 'CI';

/** 0: absent; ±1: present with that square (T, C); 1: present (S). */
export interface ClassRequirement {
  T: 0 | 1 | -1;
  C: 0 | 1 | -1;
  S: 0 | 1;
}

export const ALTLAND_ZIRNBAUER: Record<AltlandZirnbauerClass, ClassRequirement> = {
  A: { T: 0, C: 0, S: 0 },
  AIII: { T: 0, C: 0, S: 1 },
  AI: { T: 1, C: 0, S: 0 },
  BDI: { T: 1, C: 1, S: 1 },
  D: { T: 0, C: 1, S: 0 },
  DIII: { T: -1, C: 1, S: 1 },
  AII: { T: -1, C: 0, S: 0 },
  CII: { T: -1, C: -1, S: 1 },
  C: { T: 0, C: -1, S: 0 },
  CI: { T: 1, C: -1, S: 1 },
};

/** The class with these symmetries, or null when none has them (a square that is not ±1). */
export function classOf(r: ClassRequirement): AltlandZirnbauerClass | null {
  for (const [name, q] of Object.entries(ALTLAND_ZIRNBAUER) as [AltlandZirnbauerClass, ClassRequirement][]) {
    if (q.T === r.T && q.C === r.C && q.S === r.S) return name;
  }
  return null;
}

/** Largest |(M − σ1)_ij| for σ = ±1 picked as the closer one: the square's sign and how far M is from ±1. */
function nearestSign(m: ComplexMatrix): { sign: 1 | -1; defect: number } {
  const n = m.rows;
  let plus = 0, minus = 0;
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      const re = m.re[i * n + j], im = m.im[i * n + j], d = i === j ? 1 : 0;
      plus = Math.max(plus, Math.hypot(re - d, im));
      minus = Math.max(minus, Math.hypot(re + d, im));
    }
  }
  return plus <= minus ? { sign: 1, defect: plus } : { sign: -1, defect: minus };
}

const conj = (m: ComplexMatrix): ComplexMatrix => ({ rows: m.rows, cols: m.cols, re: m.re, im: m.im.map((x) => -x) });

/** (U K)² = U U*: its sign and the distance of U U* from that sign times the identity (max entry). */
export function antiunitarySquare(u: ComplexMatrix): { sign: 1 | -1; defect: number } {
  return nearestSign(multiply(u, conj(u)));
}

/** The square of the antiunitary product S·(U K) = (S U) K. */
export function productSquare(s: ComplexMatrix, u: ComplexMatrix): { sign: 1 | -1; defect: number } {
  return antiunitarySquare(multiply(s, u));
}

/** Largest distance of a square from ±1 accepted (the loader holds declared matrices unitary to 1e-9). */
export const SQUARE_TOLERANCE = 1e-6;

export interface AntiunitaryPart {
  /** declared in the file, implied as the product of the other two, absent, or declared without complex conjugation (not an Altland–Zirnbauer symmetry). */
  presence: 'declared' | 'implied' | 'absent' | 'unitary';
  /** ±1 when present and U U* = ±1 to SQUARE_TOLERANCE; null otherwise. */
  square: 1 | -1 | null;
  /** Max-entry distance of U U* from square·1 (Infinity when absent). */
  defect: number;
}

/** What the declared operators say about the Altland–Zirnbauer class. */
export interface SymmetryClassReport {
  timeReversal: AntiunitaryPart;
  particleHole: AntiunitaryPart;
  chiral: { presence: 'declared' | 'implied' | 'absent' };
  /** The class of these symmetries; null when a square is not ±1. */
  class: AltlandZirnbauerClass | null;
}

export interface DeclaredOperators {
  chiral?: ComplexMatrix;
  particleHole?: { unitary: ComplexMatrix; antiunitary?: boolean };
  timeReversal?: { unitary: ComplexMatrix; antiunitary?: boolean };
}

function part(op: { unitary: ComplexMatrix; antiunitary?: boolean } | undefined): AntiunitaryPart {
  if (op === undefined) return { presence: 'absent', square: null, defect: Infinity };
  if (op.antiunitary === false) return { presence: 'unitary', square: null, defect: Infinity };
  const sq = antiunitarySquare(op.unitary);
  return { presence: 'declared', square: sq.defect <= SQUARE_TOLERANCE ? sq.sign : null, defect: sq.defect };
}

function implied(s: ComplexMatrix, u: ComplexMatrix): AntiunitaryPart {
  const sq = productSquare(s, u);
  return { presence: 'implied', square: sq.defect <= SQUARE_TOLERANCE ? sq.sign : null, defect: sq.defect };
}

/**
 * The class the declared operators define: T and C with their squares, S
 * declared or implied by T and C; a missing T or C is implied by S and the other.
 */
export function declaredSymmetryClass(ops: DeclaredOperators): SymmetryClassReport {
  let timeReversal = part(ops.timeReversal);
  let particleHole = part(ops.particleHole);
  const antiT = timeReversal.presence === 'declared', antiC = particleHole.presence === 'declared';
  let chiral: SymmetryClassReport['chiral'] = { presence: ops.chiral ? 'declared' : antiT && antiC ? 'implied' : 'absent' };
  if (ops.chiral && antiT && !antiC && particleHole.presence === 'absent') particleHole = implied(ops.chiral, ops.timeReversal!.unitary);
  if (ops.chiral && antiC && !antiT && timeReversal.presence === 'absent') timeReversal = implied(ops.chiral, ops.particleHole!.unitary);
  if (!ops.chiral && !(antiT && antiC)) chiral = { presence: 'absent' };
  const sign = (p: AntiunitaryPart): 0 | 1 | -1 | null => (p.presence === 'absent' || p.presence === 'unitary' ? 0 : p.square);
  const t = sign(timeReversal), c = sign(particleHole);
  const cls = t === null || c === null ? null : classOf({ T: t, C: c, S: chiral.presence === 'absent' ? 0 : 1 });
  return { timeReversal, particleHole, chiral, class: cls };
}
