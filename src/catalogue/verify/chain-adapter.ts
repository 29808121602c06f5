/**
 * Runs the chain engine (analyseChain) and turns its ChainPortrait into the
 * ChainView that chain verdicts read: gaps at 0 and π/T with their minimal
 * direct gap (the closest approach of the two eigenphases bounding the label)
 * and the arc free of bulk states around the label, chiral
 * invariants ν₀ = (ν′ + ν″)/2 and ν_π = (ν′ − ν″)/2 with their frame windings
 * (Asbóth & Obuse, PRB 88, 121406(R) (2013)), class D Z₂ indices from
 * Pfaffian signs (Jiang et al., PRL 106, 220402 (2011)), end-mode counts and
 * the open-chain spectrum for plots.
 */
import type { CompiledModel } from '../compile.ts';
import type { IntegerEstimate } from '../../numerics/certificates.ts';
import { integerEstimate } from '../../numerics/certificates.ts';
import type { ChainPortrait, ChainSymmetryReport } from '../../numerics/portrait.ts';
import { analyseChain, type ChainAnalysisOptions } from '../../numerics/chain/chain-analysis.ts';
import type { AnalysisRequest } from './engines.ts';
import { propagatorHints } from './engines.ts';
import type { ChainInvariant, ChainView } from './chain-view.ts';
import { wrapLabel } from './claims.ts';
import { residualEntries } from './symmetry-verdicts.ts';
import { verdictPropagatorTolerance } from '../../numerics/evolution/propagator.ts';
import { DEFAULT_GAP_TOLERANCE } from '../../numerics/sheet/gaps.ts';
import { DEFAULT_POLICY } from './policy.ts';
import { formatNumber } from './format.ts';


/**
 * Chains hold the Floquet-operator symmetry residuals (‖ΓUΓ† − U†‖ and the
 * like) to the policy's symmetry tolerance, 10⁻⁸: the time integration, whose
 * error enters those residuals directly, is held to a tenth of that on top of
 * the rule for gaps and integers.
 */
export const CHAIN_SYMMETRY_PROPAGATOR_TOLERANCE = DEFAULT_POLICY.symmetryTolerance / 10;

export function chainOptions(request: AnalysisRequest): ChainAnalysisOptions {
  const hints = request.hints;
  const options: ChainAnalysisOptions = {};
  if (hints?.chainLength !== undefined) options.cells = hints.chainLength;
  // Sweeps map bulk quantities only: no open chain, so no end modes and no bulk–end relations there.
  if (request.skip.has('edges')) options.run = { openChain: false };
  if (hints?.kGrid?.[0] !== undefined) options.gapGrid = hints.kGrid[0];
  if (hints?.tolerances?.gap !== undefined) options.gapTolerance = hints.tolerances.gap;
  if (hints?.gapEvaluations !== undefined) options.gapEvaluations = hints.gapEvaluations;
  const derived = Math.min(
    verdictPropagatorTolerance(hints?.tolerances?.gap ?? DEFAULT_GAP_TOLERANCE, hints?.tolerances?.integer ?? DEFAULT_CHAIN_INTEGER_TOLERANCE),
    CHAIN_SYMMETRY_PROPAGATOR_TOLERANCE,
  );
  options.propagator = { tolerance: derived, ...propagatorHints(hints) };
  return options;
}

/** Default accepted |ν − round ν| of the frame windings (phase-winding.ts). */
export const DEFAULT_CHAIN_INTEGER_TOLERANCE = 1e-6;

export function analyseChainView(compiled: CompiledModel, request: AnalysisRequest): ChainView {
  const hints = request.hints;
  const view = chainView(analyseChain(compiled.drive, compiled.symmetries, chainOptions(request)), hints?.tolerances?.integer);
  if (hints?.tolerances?.gap !== undefined) view.gapTolerance = hints.tolerances.gap;
  return view;
}

/** The estimate held to another integer tolerance; `stable` as the engine judged it (refinement and caveats stay). */
function withTolerance(e: IntegerEstimate, tolerance: number, stable: boolean): IntegerEstimate {
  return integerEstimate(e.raw, tolerance, e.grid, e.history, stable, e.caveat);
}

/** Accepted residual of a Z₂ index when the model sets none (the value is exactly 0 or 1; the margin is the evidence). */
const DEFAULT_Z2_TOLERANCE = 0.01;

/** A Z₂ index from a sign with a margin, as an IntegerEstimate (no refinement: the margin is the evidence). */
function z2Estimate(sign: 1 | -1 | null, margin: number, tolerance: number, gridSize: number, integerTolerance = DEFAULT_Z2_TOLERANCE): IntegerEstimate {
  const value = sign === -1 ? 1 : 0;
  const caveat = sign === null ? `the Pfaffian-sign margin ${formatNumber(margin)} is below its tolerance ${formatNumber(tolerance)}` : undefined;
  return integerEstimate(sign === null ? NaN : value, integerTolerance, [gridSize], [{ grid: [gridSize], value: sign === null ? NaN : value }], sign !== null, caveat);
}

/**
 * The ChainView of a portrait. With `integerTolerance` (numerics.tolerances.integer)
 * every frame winding, ν₀, ν_π and Z₂ index is held to it instead of the engine's default.
 */
export function chainView(p: ChainPortrait, integerTolerance?: number): ChainView {
  // Frame windings are sums of phase steps: their only stability test is the residual (phase-winding.ts).
  const frameEstimates = (p.chiral?.status === 'computed' ? p.chiral.frames : []).map((f) =>
    integerTolerance === undefined ? f.winding : withTolerance(f.winding, integerTolerance, true),
  );
  const framesConverged = frameEstimates.length > 0 && frameEstimates.every((e) => e.converged);
  const combined = (e: IntegerEstimate): IntegerEstimate => (integerTolerance === undefined ? e : withTolerance(e, integerTolerance, framesConverged));
  const gaps = p.gaps.map((g) => ({
    label: g.label,
    lower: wrapLabel(g.lower),
    upper: wrapLabel(g.upper),
    minimalGap: g.minimalGap,
    momentumAtMinimum: [g.momentumAtMinimum],
    open: g.open,
    arcWidth: g.arcWidth,
    ...(g.certified ? { certified: g.certified } : {}),
  }));
  // Width of each of the bands between the two gaps (two bands share what the gap arcs leave of the circle).
  const bandwidth = Math.max(0, (2 - p.gaps.reduce((a, g) => a + g.arcWidth, 0)) / 2);
  const invariants: ChainInvariant[] = [];
  const chiralSymmetry = residualEntries(p.symmetries, p.chiral?.source === 'declared' ? ['chiral'] : ['time-reversal', 'particle-hole']);
  if (p.chiral?.status === 'computed') {
    const half = p.chiral.halfPeriod;
    const t0 = half ? Number(half.frameTime.toPrecision(6)) : NaN;
    for (const label of [0, 1] as const) {
      const heff = label === 0 ? p.chiral.zero : p.chiral.pi;
      const byHalf = label === 0 ? half?.zero : half?.pi;
      if (heff === undefined) continue;
      const symbol = label === 0 ? 'ν₀' : 'ν_π';
      // H_eff needs both gaps open; the half-period method only the gap it belongs to (chain/half-period-winding.ts).
      if (!heff.converged && byHalf?.converged) {
        const block = label === 0 ? 'det c, c = ⟨Γ = −1|F|Γ = +1⟩' : 'det a, a = ⟨Γ = +1|F|Γ = +1⟩';
        invariants.push({
          gap: label,
          kind: 'winding',
          estimate: integerTolerance === undefined ? byHalf : withTolerance(byHalf, integerTolerance, true),
          symmetry: chiralSymmetry,
          method: `${symbol} from the half-period evolution F = U(t₀ + T/2, t₀), t₀ = ${t0} (Asbóth, Tarasinski, Delplace, PRB 90, 125143 (2014)): winding of ${block}; the H_eff windings are unsettled (they need both gaps open)`,
        });
        continue;
      }
      const agrees = byHalf?.converged && heff.converged ? `; the half-period method in t₀ = ${t0} gives ${byHalf.nearest}` : '';
      invariants.push({ gap: label, kind: 'winding', estimate: combined(heff), symmetry: chiralSymmetry, fromFrames: true, method: `${symbol} = (ν′ ${label === 0 ? '+' : '−'} ν″)/2 from the H_eff windings of both frames${agrees}` });
    }
  }
  if (p.majorana?.status === 'computed' && invariants.length === 0) {
    const ph = residualEntries(p.symmetries, ['particle-hole']);
    const points = p.majorana.momenta.length;
    const z2 = (sign: 1 | -1 | null, margin: number) => z2Estimate(sign, margin, p.majorana!.tolerance, points, integerTolerance);
    invariants.push({ gap: 0, kind: 'z2', estimate: z2(p.majorana.zero, p.majorana.zeroMargin), symmetry: ph, signDecided: true });
    invariants.push({ gap: 1, kind: 'z2', estimate: z2(p.majorana.pi, p.majorana.piMargin), symmetry: ph, signDecided: true });
  }
  const frames = (p.chiral?.status === 'computed' ? p.chiral.frames : []).slice(0, 2).map((f, i) => ({
    time: f.frameTime,
    name: (i === 0 ? 'first' : 'second') as 'first' | 'second',
    estimate: frameEstimates[i],
  }));
  const chain = p.openChain;
  const endModes = (chain?.modes ?? []).map((m) => {
    const gap = p.gaps.find((g) => g.label === m.label);
    const decay = Math.max(m.lowDecayLength ?? 0, m.highDecayLength ?? 0) || (gap?.decayLengthEstimate ?? Infinity);
    let reason = m.reason;
    let settled = m.settled;
    if (settled && m.low !== m.high) {
      settled = false;
      reason = `the two ends disagree (low ${m.low}, high ${m.high})`;
    }
    if (settled && !chain!.lengthSufficient) {
      settled = false;
      reason = `the open chain (${chain!.cells} cells) is shorter than 10 decay lengths (≈ ${decay.toPrecision(3)} cells)`;
    }
    return { gap: m.label, count: settled ? m.low : null, settled, ...(reason !== undefined ? { reason } : {}), chainLength: chain!.cells, decayLength: decay };
  });
  // Why no invariant was computed, when none was: the engine's own words.
  const invariantNote = invariants.length === 0 ? (p.chiral?.reason ?? p.majorana?.reason) : undefined;
  return {
    grid: [p.gapGrid],
    gaps,
    bands: [],
    invariants,
    ...(invariantNote !== undefined ? { invariantNote } : {}),
    frames,
    frameNotes: p.chiral?.frameNotes ?? [],
    endModes,
    openChain: chain ? { length: chain.cells, quasienergies: chain.quasienergies, lowEdgeWeight: chain.lowEdgeWeight, highEdgeWeight: chain.highEdgeWeight } : null,
    symmetry: residualEntries(p.symmetries, ['chiral', 'particle-hole', 'time-reversal']),
    symmetryClass: p.symmetryClass,
    consistency: p.consistency,
    propagatorAccuracy: p.propagatorAccuracy,
    bandwidth,
    timings: p.timings,
  };
}
