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
import type { ChainInvariant, ChainView } from './chain-view.ts';
import { wrapLabel } from './claims.ts';

export function chainOptions(request: AnalysisRequest): ChainAnalysisOptions {
  const hints = request.hints;
  const options: ChainAnalysisOptions = {};
  if (hints?.chainLength !== undefined) options.cells = hints.chainLength;
  // Sweeps map bulk quantities only: no open chain, so no end modes and no bulk–end relations there.
  if (request.skip.has('edges')) options.run = { openChain: false };
  if (hints?.kGrid?.[0] !== undefined) options.gapGrid = hints.kGrid[0];
  if (hints?.tolerances?.propagator !== undefined) options.propagator = { tolerance: Math.PI * hints.tolerances.propagator };
  return options;
}

export function analyseChainView(compiled: CompiledModel, request: AnalysisRequest): ChainView {
  return chainView(analyseChain(compiled.drive, compiled.symmetries, chainOptions(request)));
}

function symmetryEntries(reports: ChainSymmetryReport[], which: ChainSymmetryReport['symmetry'][]) {
  return reports
    .filter((r) => which.includes(r.symmetry))
    .flatMap((r) => [
      { name: `${r.symmetry} symmetry of H(t)${r.frameTime !== undefined ? ` about t₀ = ${Number(r.frameTime.toPrecision(6))}` : ''}`, residual: r.hamiltonianResidual, tolerance: r.tolerance },
      { name: `${r.symmetry} symmetry of the Floquet operator`, residual: r.floquetResidual, tolerance: r.tolerance },
    ]);
}

/** A Z₂ index from a sign with a margin, as an IntegerEstimate (no refinement: the margin is the evidence). */
function z2Estimate(sign: 1 | -1 | null, margin: number, tolerance: number, gridSize: number): IntegerEstimate {
  const value = sign === -1 ? 1 : 0;
  const caveat = sign === null ? `the Pfaffian-sign margin ${margin.toPrecision(3)} is below its tolerance ${tolerance.toPrecision(3)}` : undefined;
  return integerEstimate(sign === null ? NaN : value, 0.01, [gridSize], [{ grid: [gridSize], value: sign === null ? NaN : value }], sign !== null, caveat);
}

export function chainView(p: ChainPortrait): ChainView {
  const gaps = p.gaps.map((g) => ({
    label: g.label,
    lower: wrapLabel(g.lower),
    upper: wrapLabel(g.upper),
    minimalGap: g.minimalGap,
    momentumAtMinimum: [g.momentumAtMinimum],
    open: g.open,
    arcWidth: g.arcWidth,
  }));
  // Band velocity per unit of reduced momentum (2π per radian of k); read by the gap tolerance while a gap is open.
  const open = p.gaps.filter((g) => g.open && g.clearance > 0);
  const velocity = open.length > 0 ? 2 * Math.PI * Math.max(p.velocity, ...open.map((g) => g.clearance)) : undefined;
  const invariants: ChainInvariant[] = [];
  const chiralSymmetry = symmetryEntries(p.symmetries, p.chiral?.source === 'declared' ? ['chiral'] : ['time-reversal', 'particle-hole']);
  if (p.chiral?.status === 'computed') {
    if (p.chiral.zero) invariants.push({ gap: 0, kind: 'winding', estimate: p.chiral.zero, symmetry: chiralSymmetry, fromFrames: true });
    if (p.chiral.pi) invariants.push({ gap: 1, kind: 'winding', estimate: p.chiral.pi, symmetry: chiralSymmetry, fromFrames: true });
  }
  if (p.majorana?.status === 'computed' && invariants.length === 0) {
    const ph = symmetryEntries(p.symmetries, ['particle-hole']);
    const points = p.majorana.momenta.length;
    invariants.push({ gap: 0, kind: 'z2', estimate: z2Estimate(p.majorana.zero, p.majorana.zeroMargin, p.majorana.tolerance, points), symmetry: ph, signDecided: true });
    invariants.push({ gap: 1, kind: 'z2', estimate: z2Estimate(p.majorana.pi, p.majorana.piMargin, p.majorana.tolerance, points), symmetry: ph, signDecided: true });
  }
  const frames = (p.chiral?.status === 'computed' ? p.chiral.frames : []).slice(0, 2).map((f, i) => ({
    time: f.frameTime,
    name: (i === 0 ? 'first' : 'second') as 'first' | 'second',
    estimate: f.winding,
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
  return {
    grid: [p.gapGrid],
    gaps,
    bands: [],
    invariants,
    frames,
    endModes,
    openChain: chain ? { length: chain.cells, quasienergies: chain.quasienergies, lowEdgeWeight: chain.lowEdgeWeight, highEdgeWeight: chain.highEdgeWeight } : null,
    symmetry: symmetryEntries(p.symmetries, ['chiral', 'particle-hole', 'time-reversal']),
    consistency: p.consistency,
    propagatorAccuracy: p.propagatorAccuracy,
    ...(velocity !== undefined ? { velocity } : {}),
    timings: p.timings,
  };
}
