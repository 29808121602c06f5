/**
 * Claims of a model file, flattened into one list of checkable statements with
 * every quantity evaluated to a number and a JSON pointer back into the file.
 * One GapClaim holding a winding and two edge counts becomes three claims, so
 * each gets its own verdict.
 */
import type { ModelDocument, Quantity } from '../model-types.generated.ts';
import type { AltlandZirnbauerClass } from '../../numerics/symmetry/altland-zirnbauer.ts';

interface ClaimBase {
  /** Stable identifier within the model, e.g. "gap-1/winding", "band-0/chern". */
  id: string;
  /** JSON pointer of the claimed value in the model file. */
  pointer: string;
}

export type NormalizedClaim =
  | (ClaimBase & { kind: 'winding'; gap: number; value: number })
  | (ClaimBase & { kind: 'edge-modes'; gap: number; finiteAlong: 0 | 1; end: 'low' | 'high'; value: number })
  | (ClaimBase & { kind: 'chern'; cut: number; band: number; value: number })
  | (ClaimBase & { kind: 'gap-invariant'; gap: number; value: number })
  | (ClaimBase & { kind: 'end-modes'; gap: number; value: number })
  | (ClaimBase & { kind: 'minimal-gap'; gap: number; value: number })
  | (ClaimBase & { kind: 'anomalous'; value: boolean })
  /** A declared symmetry operator: the file claims the drive has this symmetry (checked through its residuals). */
  | (ClaimBase & { kind: 'symmetry'; symmetry: SymmetryName; value: true })
  /** The Altland–Zirnbauer class (checked against the declared operators and their squares). */
  | (ClaimBase & { kind: 'symmetry-class'; value: AltlandZirnbauerClass });

export type SymmetryName = 'chiral' | 'particle-hole' | 'time-reversal';

/** Where each declared symmetry operator sits in a model file. */
export const SYMMETRY_POINTERS: Record<SymmetryName, string> = {
  chiral: '/claims/symmetries/chiral/operator',
  'particle-hole': '/claims/symmetries/particleHole/unitary',
  'time-reversal': '/claims/symmetries/timeReversal/unitary',
};

export type ClaimKind = NormalizedClaim['kind'];

/** Evaluates a number-or-expression of the model file (the loader's evaluator). */
export type QuantityEvaluator = (quantity: Quantity, pointer: string) => number;

/** Formats a gap label for claim ids: 0 → "0", 1 → "1", 0.5 → "0.5", −0.25 → "-0.25". */
export function gapKey(label: number): string {
  return `${Number(label.toPrecision(6))}`;
}

/** Maps a quasienergy label into (−1, 1], the convention for gap names. */
export function wrapLabel(x: number): number {
  let y = x - 2 * Math.floor((x + 1) / 2);
  if (y <= -1) y += 2;
  if (Math.abs(y) < 1e-12) return 0;
  return y;
}

export function normalizeClaims(doc: ModelDocument, evaluate: QuantityEvaluator): NormalizedClaim[] {
  const claims: NormalizedClaim[] = [];
  if (doc.claims?.symmetryClass !== undefined) claims.push({ kind: 'symmetry-class', id: 'symmetry-class', pointer: '/claims/symmetryClass', value: doc.claims.symmetryClass });
  const declared = doc.claims?.symmetries;
  const symmetries: [SymmetryName, unknown][] = [['chiral', declared?.chiral], ['particle-hole', declared?.particleHole], ['time-reversal', declared?.timeReversal]];
  for (const [symmetry, spec] of symmetries) {
    if (spec !== undefined) claims.push({ kind: 'symmetry', id: `symmetry/${symmetry}`, pointer: SYMMETRY_POINTERS[symmetry], symmetry, value: true });
  }
  const gaps = doc.claims?.gaps ?? [];
  gaps.forEach((g, i) => {
    const base = `/claims/gaps/${i}`;
    const gap = wrapLabel(evaluate(g.quasienergy, `${base}/quasienergy`));
    const key = `gap-${gapKey(gap)}`;
    if (g.winding !== undefined) claims.push({ kind: 'winding', id: `${key}/winding`, pointer: `${base}/winding`, gap, value: g.winding });
    (g.edgeModes ?? []).forEach((e, j) => {
      claims.push({
        kind: 'edge-modes',
        id: `${key}/edge-${e.finiteAlong}-${e.end}`,
        pointer: `${base}/edgeModes/${j}/count`,
        gap,
        finiteAlong: e.finiteAlong === 0 ? 0 : 1,
        end: e.end,
        value: e.count,
      });
    });
    if (g.invariant !== undefined) claims.push({ kind: 'gap-invariant', id: `${key}/invariant`, pointer: `${base}/invariant`, gap, value: g.invariant });
    if (g.endModes !== undefined) claims.push({ kind: 'end-modes', id: `${key}/end-modes`, pointer: `${base}/endModes`, gap, value: g.endModes });
    if (g.minimalGap !== undefined) claims.push({ kind: 'minimal-gap', id: `${key}/minimal-gap`, pointer: `${base}/minimalGap`, gap, value: g.minimalGap });
  });
  const bands = doc.claims?.bands;
  if (bands) {
    const cut = wrapLabel(evaluate(bands.cut, '/claims/bands/cut'));
    bands.chern.forEach((value, band) => {
      claims.push({ kind: 'chern', id: `band-${band}/chern`, pointer: `/claims/bands/chern/${band}`, cut, band, value });
    });
  }
  if (doc.claims?.anomalous !== undefined) {
    claims.push({ kind: 'anomalous', id: 'anomalous', pointer: '/claims/anomalous', value: doc.claims.anomalous });
  }
  // Two gap entries naming the same gap would give clashing ids; keep both, numbered.
  const seen = new Map<string, number>();
  for (const c of claims) {
    const n = seen.get(c.id) ?? 0;
    seen.set(c.id, n + 1);
    if (n > 0) c.id = `${c.id}#${n + 1}`;
  }
  return claims;
}

/** Gap labels the engines must examine: every claimed gap, plus the band cut. */
export function claimedGapLabels(claims: NormalizedClaim[]): number[] {
  const labels: number[] = [];
  for (const c of claims) {
    const label = c.kind === 'chern' ? c.cut : c.kind === 'anomalous' || c.kind === 'symmetry' || c.kind === 'symmetry-class' ? undefined : c.gap;
    if (label !== undefined && !labels.some((l) => Math.abs(l - label) < 1e-9)) labels.push(label);
  }
  return labels.sort((a, b) => a - b);
}
