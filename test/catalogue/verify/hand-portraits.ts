/**
 * Hand-made engine results for testing the verdict logic without running the
 * engines. Values follow published results (cited where used), not our code.
 */
import type { IntegerEstimate } from '../../../src/numerics/certificates.ts';
import type { ChernEstimate, GapCertificate, RibbonReport } from '../../../src/numerics/portrait.ts';
import type { CheckedSheetPortrait } from '../../../src/catalogue/verify/sheet-verdicts.ts';
import { declaredSymmetryClass } from '../../../src/numerics/symmetry/altland-zirnbauer.ts';

/** An integer estimate refined over two grids, converging to `value` with residual `residual`. */
export function estimate(value: number, options: { residual?: number; coarse?: number; tolerance?: number; converged?: boolean; caveat?: string } = {}): IntegerEstimate {
  const residual = options.residual ?? 1e-9;
  const raw = value + residual;
  const coarse = options.coarse ?? value + 10 * residual;
  const tolerance = options.tolerance ?? 0.01;
  const e: IntegerEstimate = {
    raw,
    nearest: Math.round(raw),
    residual: Math.abs(raw - Math.round(raw)),
    tolerance,
    converged: options.converged ?? Math.abs(raw - Math.round(raw)) <= tolerance,
    grid: [48, 48],
    history: [
      { grid: [24, 24], value: coarse },
      { grid: [48, 48], value: raw },
    ],
  };
  if (options.caveat) e.caveat = options.caveat;
  return e;
}

/**
 * A certified lower bound as the engine reports it (certified-minimum.ts): `fraction` of the
 * refined minimum, decided against the default tolerance 1e-3.
 */
export function certified(minimalGap: number, fraction = 0.8, status?: GapCertificate['status']): GapCertificate {
  const lower = fraction * minimalGap;
  return { lower, status: status ?? (lower > 1e-3 ? 'above' : minimalGap <= 1e-3 ? 'below' : 'undecided'), evaluations: 100, cells: 676, lipschitz: [4, 4], margin: 1e-9, decisionLevel: 1e-3 };
}

export function chernEstimate(value: number): ChernEstimate {
  return { ...estimate(value), maxPlaquetteFlux: 0.2, fluxThreshold: Math.PI / 3, minimalLinkModulus: 0.9 };
}

/** A ribbon finite along a₂ of `width` cells with the given signed counts per gap and edge. */
export function ribbon(width: number, counts: { gap: number; edge: 'low' | 'high'; count: number }[]): RibbonReport {
  return {
    finiteDirection: 1, width, edgeCells: 4, momenta: [0, 0.25, 0.5, 0.75], quasienergies: [[-0.5, 0.5], [-0.5, 0.5], [-0.5, 0.5], [-0.5, 0.5]],
    lowEdgeWeight: [[0, 0], [0, 0], [0, 0], [0, 0]], highEdgeWeight: [[0, 0], [0, 0], [0, 0], [0, 0]],
    counts: counts.map(({ gap, edge, count }) => ({
      gap, edge, count, crossings: [{ momentum: 0.5, direction: (count >= 0 ? 1 : -1) as 1 | -1, weight: 0.9 }],
      decayLength: 1.5, width, settled: true,
    })),
  };
}

/**
 * Two bands separated by gaps at 0 and π/T, as for the five-step checkerboard drive of
 * Rudner, Lindner, Berg, Levin, PRX 3, 031005 (2013) (from memory): at full transfer both
 * bands have C = 0 and both gaps W = 1, with one chiral mode per gap on each edge.
 * The ribbon is given at width 40 and, as verification recomputes it, at width 60.
 */
export function twoBandSheet(o: { c?: [number, number]; w?: [number, number]; gap0?: number; gapPi?: number; width?: number; grid?: number } = {}): CheckedSheetPortrait {
  const c = o.c ?? [0, 0];
  const w = o.w ?? [1, 1];
  const gap0 = o.gap0 ?? 0.6;
  const gapPi = o.gapPi ?? 0.6;
  const half = (o.width ?? 0.2) / 2;
  const grid = o.grid ?? 48;
  const counts = [
    { gap: 0, edge: 'low' as const, count: w[0] }, { gap: 0, edge: 'high' as const, count: -w[0] },
    { gap: 1, edge: 'low' as const, count: w[1] }, { gap: 1, edge: 'high' as const, count: -w[1] },
  ];
  return {
    kind: 'sheet',
    grid: [grid, grid],
    gaps: [
      { label: 0, lower: -gap0 / 2, upper: gap0 / 2, minimalGap: gap0, momentumAtMinimum: [0, 0], open: 0.8 * gap0 > 1e-3, arcWidth: gap0, certified: certified(gap0) },
      { label: 1, lower: 1 - gapPi / 2, upper: -1 + gapPi / 2, minimalGap: gapPi, momentumAtMinimum: [0.5, 0.5], open: 0.8 * gapPi > 1e-3, arcWidth: gapPi, certified: certified(gapPi) },
    ],
    bands: [
      { index: 0, branches: 1, gapBelow: 0, gapAbove: 1, range: [0.5 - half, 0.5 + half], minimalInternalGap: Infinity, touching: false, chern: chernEstimate(c[0]) },
      { index: 1, branches: 1, gapBelow: 1, gapAbove: 0, range: [-0.5 - half, -0.5 + half], minimalInternalGap: Infinity, touching: false, chern: chernEstimate(c[1]) },
    ],
    windings: [
      { gap: 0, winding: estimate(w[0]) },
      { gap: 1, winding: estimate(w[1]) },
    ],
    ribbons: [ribbon(40, counts)],
    checkRibbons: [ribbon(60, counts)],
    consistency: [],
    propagatorAccuracy: 1e-10,
    gapTolerance: 1e-3,
    cut: 0,
    eigenResidual: 1e-14,
    floquetEvaluations: 2304,
    symmetries: [],
    symmetryClass: declaredSymmetryClass({}),
    timings: { bands: 1, winding: 2, ribbon: 3 },
  };
}
