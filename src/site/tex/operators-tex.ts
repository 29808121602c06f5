/**
 * Declared symmetry operators as TeX matrices, in the basis of the model file
 * (orbital order; for Nambu models all particle components, then all hole
 * components): Γ for chiral symmetry, P = U_P K and Θ = U_T K for the
 * antiunitary ones (K complex conjugation).
 */
import type { MatrixEntry, ModelDocument, OperatorMatrix } from '../../catalogue/model-types.generated.ts';
import { quantityTex } from './expression-tex.ts';

/** Largest matrix typeset; bigger ones are described by their size. */
const MAX_MATRIX = 8;

export interface OperatorFormula {
  /** chiral | particle-hole | time-reversal */
  symmetry: string;
  tex: string;
  /** Extra words: symmetric times, antiunitarity. */
  note: string | null;
}

function entryTex(entry: MatrixEntry): string {
  if (Array.isArray(entry)) {
    const [re, im] = entry;
    const reTex = quantityTex(re), imTex = quantityTex(im);
    if (re === 0) return im === 0 ? '0' : im === 1 ? 'i' : im === -1 ? '-i' : `${imTex} i`;
    if (im === 0) return reTex;
    return `${reTex} + ${imTex} i`.replace('+ -', '- ');
  }
  return quantityTex(entry);
}

export function matrixTex(matrix: OperatorMatrix): string {
  if (matrix.length > MAX_MATRIX) return `\\text{(${matrix.length} \\times ${matrix.length} matrix, see the model file)}`;
  return `\\begin{pmatrix} ${matrix.map((row) => row.map(entryTex).join(' & ')).join(' \\\\ ')} \\end{pmatrix}`;
}

export function operatorFormulas(doc: ModelDocument, timeText: (q: string | number) => string): OperatorFormula[] {
  const s = doc.claims?.symmetries;
  const out: OperatorFormula[] = [];
  if (s?.chiral) {
    const times = s.chiral.symmetricTimes?.map(timeText) ?? [];
    out.push({ symmetry: 'chiral', tex: `\\Gamma = ${matrixTex(s.chiral.operator)}`, note: times.length > 0 ? `symmetric time frames t₀ = ${times.join(', ')}` : null });
  }
  if (s?.particleHole) {
    const anti = s.particleHole.antiunitary !== false;
    out.push({ symmetry: 'particle-hole', tex: `P = ${matrixTex(s.particleHole.unitary)}${anti ? '\\,K' : ''}`, note: anti ? 'antiunitary (K: complex conjugation)' : 'unitary' });
  }
  if (s?.timeReversal) {
    const anti = s.timeReversal.antiunitary !== false;
    out.push({ symmetry: 'time-reversal', tex: `\\Theta = ${matrixTex(s.timeReversal.unitary)}${anti ? '\\,K' : ''}`, note: anti ? 'antiunitary (K: complex conjugation)' : 'unitary' });
  }
  return out;
}
