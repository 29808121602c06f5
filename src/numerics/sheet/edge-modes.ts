/**
 * Signed counts of chiral edge modes in a bulk gap, from a ribbon spectrum.
 *
 * Method: spectral flow through the gap's label c. Between neighbouring
 * momenta k_j and k_{j+1} (periodically, k_n ≡ k_0 + 1) every ribbon state
 * lying inside the bulk gap arc at k_j is followed to the state at k_{j+1}
 * with the largest overlap |⟨ψ(k_j)|ψ(k_{j+1})⟩|² (the periodic Bloch gauge
 * makes states at k and k + 1 identical). When the quasienergy of the pair
 * passes c along the short arc between them, that is a crossing; its
 * direction is the sign of the circular difference ε(k_{j+1}) − ε(k_j), i.e.
 * of dε/dk_∥, and it is attributed to the edge region holding most of the
 * state's weight. The signed count of an edge is the sum of directions.
 *
 * Trust: a count is only settled when (i) every crossing state is localised
 * (weight ≥ `localisation` in one edge region), (ii) every followed state has
 * a clear partner (overlap ≥ `trackingOverlap`), (iii) the two edges' counts
 * cancel (the whole ribbon has no net spectral flow; see docs/conventions.md)
 * and (iv) the ribbon is at least `widthPerDecayLength` decay lengths wide.
 * The decay length is fitted from the weight profile of the crossing states
 * (|ψ_j|² ∝ e^{−2j/ξ} on the envelope of the cell weights); when no state
 * crosses, the bulk estimate passed by the caller is used (ξ ≈ v/(πΔ) in cells,
 * v = |dε/ds_f| in units π/T, Δ the minimal direct gap: the decay of a
 * massive Dirac edge state, common practice).
 */
import type { EdgeCountReport, EdgeCrossing } from '../portrait.ts';
import type { RibbonSpectrum } from './ribbon.ts';
import { cellWeights } from './ribbon.ts';
import { aboveCut, circularDifference } from '../quasienergy-bands.ts';

export interface EdgeCountOptions {
  /** Smallest weight in one edge region for a crossing state to count as edge-localised (default 0.5). */
  localisation?: number;
  /** Smallest overlap for a state to be followed to its partner at the next momentum (default 0.5). */
  trackingOverlap?: number;
  /** The ribbon must be at least this many decay lengths wide (default 6). */
  widthPerDecayLength?: number;
}

/** The bulk gap an edge count refers to (units π/T): label c and the free arc (lower, upper) around it. */
export interface GapArc {
  label: number;
  lower: number;
  upper: number;
}

/** Decay length (cells) of a state localised at `edge`, fitted on the envelope of its cell weights. */
export function fitDecayLength(weights: Float64Array, edge: 'low' | 'high'): number {
  const n = weights.length;
  const half = Math.max(2, Math.ceil(n / 2));
  const profile = Array.from({ length: half }, (_, j) => weights[edge === 'low' ? j : n - 1 - j]);
  // Envelope: running maximum from the inside towards the edge, so oscillations inside a decay do not bias the fit.
  const envelope = profile.slice();
  for (let j = half - 2; j >= 0; j--) envelope[j] = Math.max(envelope[j], envelope[j + 1]);
  const floor = 1e-12 * envelope[0];
  const xs: number[] = [], ys: number[] = [];
  for (let j = 0; j < half; j++) {
    if (envelope[j] > floor) {
      xs.push(j);
      ys.push(Math.log(envelope[j]));
    }
  }
  if (xs.length < 2) return 2 / Math.log(1e12);
  const mx = xs.reduce((a, b) => a + b, 0) / xs.length;
  const my = ys.reduce((a, b) => a + b, 0) / ys.length;
  let sxy = 0, sxx = 0;
  for (let i = 0; i < xs.length; i++) {
    sxy += (xs[i] - mx) * (ys[i] - my);
    sxx += (xs[i] - mx) * (xs[i] - mx);
  }
  const slope = sxy / sxx;
  return slope < 0 ? -2 / slope : Infinity;
}

function overlapSquared(ribbon: RibbonSpectrum, j: number, a: number, k: number, b: number): number {
  const u = ribbon.samples[j].vectors, v = ribbon.samples[k].vectors;
  let re = 0, im = 0;
  for (let r = 0; r < u.rows; r++) {
    const p = r * u.cols + a, q = r * v.cols + b;
    re += u.re[p] * v.re[q] + u.im[p] * v.im[q];
    im += u.re[p] * v.im[q] - u.im[p] * v.re[q];
  }
  return re * re + im * im;
}

/** Counts chiral modes crossing the gap `gap` on the low and high edge of `ribbon`. */
export function countEdgeModes(
  ribbon: RibbonSpectrum,
  gap: GapArc,
  bulkDecayLength?: number,
  options: EdgeCountOptions = {},
): [EdgeCountReport, EdgeCountReport] {
  const localisation = options.localisation ?? 0.5;
  const trackingOverlap = options.trackingOverlap ?? 0.5;
  const widthRatio = options.widthPerDecayLength ?? 6;
  const c = gap.label;
  const arcBelow = aboveCut(c, gap.lower); // extent of the free arc below c
  const arcAbove = aboveCut(gap.upper, c); // and above c
  const inArc = (x: number): boolean => {
    const d = circularDifference(x, c);
    return d >= 0 ? d < arcAbove : -d < arcBelow;
  };
  const crossings: Record<'low' | 'high', EdgeCrossing[]> = { low: [], high: [] };
  const problems: string[] = [];
  let decay = 0;
  const n = ribbon.momenta.length;
  for (let j = 0; j < n; j++) {
    const k = (j + 1) % n;
    const here = ribbon.samples[j], next = ribbon.samples[k];
    for (let a = 0; a < here.quasienergies.length; a++) {
      const ea = here.quasienergies[a];
      if (!inArc(ea)) continue;
      let best = -1, bestOverlap = -1;
      for (let b = 0; b < next.quasienergies.length; b++) {
        const o = overlapSquared(ribbon, j, a, k, b);
        if (o > bestOverlap) {
          bestOverlap = o;
          best = b;
        }
      }
      const eb = next.quasienergies[best];
      const step = circularDifference(eb, ea);
      const startAbove = circularDifference(ea, c) > 0;
      const endAbove = circularDifference(ea + step, c) > 0;
      if (startAbove === endAbove || Math.abs(step) >= 1) continue;
      if (bestOverlap < trackingOverlap) {
        problems.push(`state at k∥ = ${ribbon.momenta[j].toFixed(4)} has no clear partner at the next momentum (overlap ${bestOverlap.toFixed(2)}); use more momenta`);
      }
      const low = 0.5 * (ribbon.lowEdgeWeight[j][a] + ribbon.lowEdgeWeight[k][best]);
      const high = 0.5 * (ribbon.highEdgeWeight[j][a] + ribbon.highEdgeWeight[k][best]);
      const edge = low >= high ? 'low' : 'high';
      const weight = Math.max(low, high);
      const momentum = ribbon.momenta[j] + (k === 0 ? 1 : ribbon.momenta[k] - ribbon.momenta[j]) * 0.5;
      if (weight < localisation) {
        problems.push(
          `a state crossing ${c.toFixed(4)} near k∥ = ${momentum.toFixed(4)} is not localised on either edge ` +
            `(weights ${low.toFixed(2)} low, ${high.toFixed(2)} high in ${ribbon.edgeCells} cells)`,
        );
      }
      crossings[edge].push({ momentum: momentum - Math.floor(momentum), direction: step > 0 ? 1 : -1, weight });
      decay = Math.max(
        decay,
        fitDecayLength(cellWeights(here, a, ribbon.orbitalsPerCell), edge),
        fitDecayLength(cellWeights(next, best, ribbon.orbitalsPerCell), edge),
      );
    }
  }
  return judgeEdgeCounts({ gap: c, width: ribbon.width, crossings, problems, fittedDecay: decay, bulkDecayLength, widthPerDecayLength: widthRatio });
}

/** What a count rests on, from either route (dense spectra here, shift-invert in banded-edge-counts.ts). */
export interface EdgeCountEvidence {
  gap: number;
  width: number;
  crossings: Record<'low' | 'high', EdgeCrossing[]>;
  /** Tracking and localisation problems found while following the states. */
  problems: string[];
  /** Largest decay length fitted on the crossing states (cells; 0 when none crossed). */
  fittedDecay: number;
  bulkDecayLength: number | undefined;
  widthPerDecayLength: number;
}

/**
 * The counts of both edges and whether they are settled: the crossing states'
 * decay length (or, without crossings, the bulk estimate) must fit
 * widthPerDecayLength times into the ribbon, the two edges must cancel, and
 * no tracking or localisation problem may have been found.
 */
export function judgeEdgeCounts(e: EdgeCountEvidence): [EdgeCountReport, EdgeCountReport] {
  const { crossings, width, gap } = e;
  const problems = [...e.problems];
  const anyCrossing = crossings.low.length + crossings.high.length > 0;
  const decayLength = anyCrossing ? e.fittedDecay : (e.bulkDecayLength ?? NaN);
  const lowCount = crossings.low.reduce((s, x) => s + x.direction, 0);
  const highCount = crossings.high.reduce((s, x) => s + x.direction, 0);
  if (!Number.isFinite(decayLength)) {
    problems.push(anyCrossing ? 'the crossing states are not localised (no exponential decay)' : 'no state crosses the gap and no bulk estimate of the decay length was given');
  } else if (width < e.widthPerDecayLength * decayLength) {
    problems.push(
      `ribbon of ${width} cells is narrower than ${e.widthPerDecayLength} decay lengths (${decayLength.toFixed(2)} cells${anyCrossing ? '' : ', bulk estimate'}); use a wider ribbon`,
    );
  }
  if (lowCount + highCount !== 0) {
    problems.push(`the counts on the two edges do not cancel (low ${lowCount}, high ${highCount}): tracking failed or the ribbon is too narrow`);
  }
  const settled = problems.length === 0;
  const report = (edge: 'low' | 'high', count: number): EdgeCountReport => {
    const r: EdgeCountReport = {
      gap,
      edge,
      count: settled ? count : null,
      crossings: crossings[edge],
      decayLength,
      width,
      settled,
    };
    if (!settled) r.reason = problems.slice(0, 3).join('; ') + (problems.length > 3 ? ` (and ${problems.length - 3} more)` : '');
    return r;
  };
  return [report('low', lowCount), report('high', highCount)];
}
