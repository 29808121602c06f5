/**
 * How strongly a state of a ribbon or an open chain sits at one edge: the
 * measure the site colours spectra by (docs/conventions.md, "Edge
 * localisation").
 *
 * A state's weight p in the outer L cells of one edge is compared with the
 * weight u = L/W a state spread evenly over the W cells would have there:
 *     m = max(0, (p − u)/(1 − u)),
 * 0 for an even spread and 1 for a state entirely inside the region. The
 * region is the outer few decay lengths, L = min(⌈3ξ⌉, ⌊W/8⌋) (at least one
 * cell), ξ the largest decay length expected for edge states (the bulk
 * estimate of the engine); an edge state with decay length ξ has
 * p ≥ 1 − e^{−2L/ξ} there.
 *
 * Why bulk states cannot pass: an extended state of a finite system is a
 * standing wave, a superposition of the bulk Bloch waves of one energy with
 * amplitudes |ψ_j|² ≤ 2/W per cell on average over any stretch of cells
 * (sin² averages to 1/2, and its peaks to at most twice the mean), so its
 * weight in the region is at most about 2u and m ≤ u/(1 − u) ≤ 1/7 for
 * u ≤ 1/8; with both edges together at most 2/7. The threshold 1/2 lies well
 * above that. States within DEGENERATE_QUASIENERGY of each other at the same
 * momentum (a flat band, the two edges' modes at a symmetric momentum) are
 * returned by any eigensolver as arbitrary mixtures, so each of them gets the
 * mean weight of its group: Tr(P_group P_region)/|group|, which does not
 * depend on the basis. A flat bulk band thus gets the spread of the whole band
 * (≈ u), not the weight of whichever combination the solver returned.
 */

/** A state with m ≥ this on an edge is drawn as a state of that edge. */
export const LOCALISATION_THRESHOLD = 0.5;
/** The measure in one sentence, for legends. */
export const LOCALISATION_MEASURE =
  'weight in the outer few decay lengths of an edge beyond what an evenly spread state has there, m = (p − u)/(1 − u); extended states stay below 1/7';
/** States at one momentum closer than this (units π/T) count as one degenerate group. */
export const DEGENERATE_QUASIENERGY = 1e-9;

export interface LocalisationRegion {
  /** Cells L in each edge region. */
  cells: number;
  /** u = L/W: the weight an evenly spread state has in one region. */
  uniformWeight: number;
}

/** L = min(⌈3ξ⌉, ⌊W/8⌋), at least 1; ξ unknown or not finite: ⌊W/8⌋. */
export function localisationRegion(width: number, decayLength?: number): LocalisationRegion {
  const cap = Math.max(1, Math.floor(width / 8));
  const cells = decayLength !== undefined && Number.isFinite(decayLength) && decayLength > 0 ? Math.max(1, Math.min(Math.ceil(3 * decayLength), cap)) : cap;
  return { cells, uniformWeight: cells / width };
}

/** m = max(0, (p − u)/(1 − u)) for the weight p in a region with uniform weight u. */
export function localisationMeasure(weight: number, uniformWeight: number): number {
  if (uniformWeight >= 1) return 0;
  return Math.max(0, (weight - uniformWeight) / (1 - uniformWeight));
}

/**
 * Measures of every state at one momentum: quasienergies (units π/T, any
 * order) with each state's weight in the low and the high region; groups of
 * degenerate states share their mean weight.
 */
export function stateLocalisation(
  quasienergies: ArrayLike<number>,
  lowWeight: ArrayLike<number>,
  highWeight: ArrayLike<number>,
  region: LocalisationRegion,
): { low: number[]; high: number[] } {
  const n = quasienergies.length;
  const order = Array.from({ length: n }, (_, i) => i).sort((a, b) => quasienergies[a] - quasienergies[b]);
  const low = new Array<number>(n), high = new Array<number>(n);
  let start = 0;
  for (let k = 1; k <= n; k++) {
    if (k < n && quasienergies[order[k]] - quasienergies[order[k - 1]] < DEGENERATE_QUASIENERGY) continue;
    let lo = 0, hi = 0;
    for (let t = start; t < k; t++) {
      lo += lowWeight[order[t]];
      hi += highWeight[order[t]];
    }
    const size = k - start;
    for (let t = start; t < k; t++) {
      low[order[t]] = localisationMeasure(lo / size, region.uniformWeight);
      high[order[t]] = localisationMeasure(hi / size, region.uniformWeight);
    }
    start = k;
  }
  return { low, high };
}

/** Weight of a state in the first and the last `cells` cells, from its per-cell weights. */
export function regionWeights(cellWeights: ArrayLike<number>, cells: number): [number, number] {
  const w = cellWeights.length;
  let lo = 0, hi = 0;
  for (let c = 0; c < Math.min(cells, w); c++) {
    lo += cellWeights[c];
    hi += cellWeights[w - 1 - c];
  }
  return [lo, hi];
}
