/**
 * Anomalous Floquet phases, computed from the portrait rather than taken from
 * the claims.
 *
 * Definition (two dimensions). A drive is *anomalous* when every quasienergy
 * gap carries a nonzero Rudner–Lindner–Berg–Levin winding number W: each gap
 * then hosts chiral edge modes, and no static Hamiltonian has this edge
 * spectrum, because a static band structure is bounded and the gap "above its
 * top" (the π gap when the bandwidth is below 2π/T) always has W = 0
 * (Rudner, Lindner, Berg, Levin, PRX 3, 031005 (2013)). It is *Chern-trivial
 * anomalous* when, in addition, every band has Chern number 0; then W is the
 * same in every gap (W differs between two gaps by the sum of the Chern
 * numbers of the bands between them) and the Chern numbers alone would
 * predict no edge modes at all.
 *
 * Definition (one dimension). A chain is anomalous when the invariant of the
 * gap at quasienergy π/T is nonzero: it has end modes at π, which no static
 * chain can have (Kitagawa, Berg, Rudner, Demler, PRB 82, 235114 (2010);
 * Jiang et al., PRL 106, 220402 (2011)).
 *
 * The flag is only given on settled evidence: "undetermined" when a gap or an
 * invariant it needs is unsettled and no settled value already decides it.
 */
import type { PortraitEntry } from './sheet-verdicts.ts';
import { formatNumber } from './format.ts';
import { gapSubscript, quasienergyText } from '../vocabulary.ts';

export type AnomalousClass = 'chern-trivial-anomalous' | 'anomalous' | 'not-anomalous' | 'undetermined';

export interface AnomalousFlag {
  classification: AnomalousClass;
  /** Why, in one sentence. */
  reason: string;
}

export const ANOMALOUS_DEFINITION =
  'Two dimensions: anomalous when every quasienergy gap carries a nonzero winding number W (no static Hamiltonian has this edge spectrum); Chern-trivial anomalous when in addition every band has Chern number 0. One dimension: anomalous when the invariant of the gap at π/T is nonzero (end modes at quasienergy π/T).';

/**
 * Per gap, the winding number W decides; when W is unsettled (or not computed)
 * a settled signed edge count stands in for it, since the count on each edge
 * of a wide ribbon equals ±W (bulk–edge correspondence, Rudner et al. 2013).
 */
export function classifySheet(entries: PortraitEntry[]): AnomalousFlag {
  const gaps = [...new Set(entries.filter((e) => (e.quantity === 'winding' || e.quantity === 'edge-modes') && e.gap !== null).map((e) => e.gap as number))];
  const cherns = entries.filter((e) => e.quantity === 'chern');
  if (gaps.length === 0) return { classification: 'undetermined', reason: 'no open quasienergy gap was found, so no winding number is defined' };
  const perGap = gaps.map((gap) => {
    const w = entries.find((e) => e.quantity === 'winding' && e.gap === gap);
    if (w?.settled) return { gap, value: w.value as number, label: w.label, source: 'W' };
    const edge = entries.find((e) => e.quantity === 'edge-modes' && e.gap === gap && e.settled);
    if (edge) return { gap, value: Math.abs(edge.value as number), label: edge.label, source: 'edge' };
    return { gap, value: null, label: w?.label ?? `the gap at ${gap}`, source: 'none' };
  });
  const zero = perGap.find((g) => g.value === 0);
  if (zero) return { classification: 'not-anomalous', reason: `${zero.label} is 0` };
  const unsettled = perGap.find((g) => g.value === null);
  if (unsettled) return { classification: 'undetermined', reason: `${unsettled.label} is unsettled` };
  // Each value names its gap (W_0 = 1, W_π = 1), so two gaps with the same W do not read as one repeated.
  const values = perGap.map((g) => (g.source === 'W' ? `W_${gapSubscript(g.gap)} = ${g.value}` : `|edge count| at ε = ${quasienergyText(g.gap)} = ${g.value}`)).join(', ');
  if (cherns.length > 0 && cherns.every((c) => c.settled && c.value === 0)) {
    return { classification: 'chern-trivial-anomalous', reason: `every gap carries chiral modes (${values}) and every band has C = 0` };
  }
  const unsettledChern = cherns.find((c) => !c.settled);
  if (unsettledChern || cherns.length === 0) {
    return { classification: 'anomalous', reason: `every gap carries chiral modes (${values}); ${unsettledChern ? `${unsettledChern.label} is unsettled` : 'no band Chern number was computed'}, so Chern-triviality is not decided` };
  }
  return { classification: 'anomalous', reason: `every gap carries chiral modes (${values}), with nonzero band Chern numbers (${cherns.map((c) => c.value).join(', ')})` };
}

/**
 * One dimension: `piInvariant` is the portrait entry of the gap at π/T, if any
 * (chain-verdicts.ts lists it whenever a symmetry it rests on is declared).
 * Its certificate lists the residuals of those symmetries: when one is broken,
 * no invariant protects end modes at π/T and the chain is not anomalous.
 */
export function classifyChain(piInvariant: PortraitEntry | undefined): AnomalousFlag {
  if (!piInvariant) return { classification: 'undetermined', reason: 'no invariant of the gap at π/T was computed: the file declares no chiral or particle–hole symmetry' };
  const broken = piInvariant.certificate.symmetry.filter((s) => !(s.residual <= s.tolerance));
  if (broken.length > 0) {
    const residuals = broken.map((s) => `${s.name} holds only to ${formatNumber(s.residual)} (tolerance ${formatNumber(s.tolerance)})`).join('; ');
    return { classification: 'not-anomalous', reason: `symmetry broken: ${residuals}, so no invariant protects end modes at π/T` };
  }
  if (!piInvariant.settled) {
    const why = piInvariant.certificate.notes.filter((n) => !/^(computed as|frames as declared|no symmetricTimes declared|the refinement history)/.test(n));
    return { classification: 'undetermined', reason: `${piInvariant.label} is unsettled${why.length > 0 ? ` (${why.join('; ')})` : ''}` };
  }
  if (piInvariant.value !== 0) return { classification: 'anomalous', reason: `${piInvariant.label} is ${piInvariant.value}: end modes at π/T` };
  return { classification: 'not-anomalous', reason: `${piInvariant.label} is 0` };
}

/** Whether the file's `anomalous` claim (schema: edge modes although every band is Chern-trivial; 1D: π modes) holds. */
export function anomalousClaimHolds(flag: AnomalousFlag, dimension: number): boolean | null {
  if (flag.classification === 'undetermined') return null;
  if (dimension === 1) return flag.classification === 'anomalous';
  // A flag 'anomalous' with a Chern number still unsettled cannot decide the claim.
  if (flag.classification === 'anomalous' && /not decided/.test(flag.reason)) return null;
  return flag.classification === 'chern-trivial-anomalous';
}
