/**
 * The portrait of a driven chain: gaps at 0 and π, declared symmetries with
 * residuals, chiral invariants (ν₀, ν_π) in symmetric time frames, class D
 * Z₂ parities, the det-winding check, open-chain end modes, and the bulk–end
 * relations between them. Every number carries the grid and tolerance it
 * rests on (src/numerics/portrait.ts documents each field).
 *
 * The gap scan and the det-winding check read U(k, T) from one cache
 * (bulk-gaps.ts), so momenta they share are propagated once.
 */
import type { ComplexMatrix } from '../linalg/complex-matrix.ts';
import type { LatticeDrive } from '../evolution/drive.ts';
import type { PropagatorOptions } from '../evolution/propagator.ts';
import type { ChainChiralReport, ChainEndModes, ChainMajoranaReport, ChainPortrait, ConsistencyCheck } from '../portrait.ts';
import type { IntegerEstimate } from '../certificates.ts';
import { LuDecomposition } from '../linalg/lu.ts';
import { bulkGaps, FloquetCache } from './bulk-gaps.ts';
import { chiralInvariants } from './chiral-winding.ts';
import { majoranaInvariants } from './majorana-z2.ts';
import { phaseWinding } from './phase-winding.ts';
import { defaultChainLength, openChainSpectrum } from './open-chain.ts';
import { chiralFromTimeReversalAndParticleHole } from '../symmetry/symmetry-residuals.ts';
import { declaredSymmetryReports } from '../symmetry/declared-symmetries.ts';
import { declaredSymmetryClass } from '../symmetry/altland-zirnbauer.ts';
import { formatRawValue } from '../number-format.ts';

export interface ChainSymmetries {
  chiral?: ComplexMatrix;
  /** The model's symmetric frame times, in its order (the first defines ν′). */
  chiralTimes?: number[];
  particleHole?: { unitary: ComplexMatrix; antiunitary?: boolean };
  timeReversal?: { unitary: ComplexMatrix; antiunitary?: boolean };
}

export interface ChainAnalysisOptions {
  /** Open chain length in cells (default from the bulk decay length, see open-chain.ts). */
  cells?: number;
  /** Cap on the default length (default 160). */
  maxCells?: number;
  /** Symmetry residual tolerance (default 1e-10). */
  symmetryTolerance?: number;
  /** Uniform k grid of the gap scan (default 128). */
  gapGrid?: number;
  /** Gap tolerance (units π/T): a gap is open when the certified lower bound of its minimal direct gap exceeds it (default 1e-3). */
  gapTolerance?: number;
  /** Most Floquet operators the certified bound of each gap may evaluate (default 20000). */
  gapEvaluations?: number;
  propagator?: PropagatorOptions;
  /** Stages to run (default all): without the open chain, no end modes and no bulk–end relations are reported. */
  run?: { openChain?: boolean };
}

export function analyseChain(drive: LatticeDrive, symmetries: ChainSymmetries, options: ChainAnalysisOptions = {}): ChainPortrait {
  if (drive.dimension !== 1) throw new RangeError(`analyseChain: expected a chain (dimension 1), got dimension ${drive.dimension}`);
  const timings: Record<string, number> = {};
  const timed = <T>(name: string, f: () => T): T => {
    const t = performance.now();
    const r = f();
    timings[name] = performance.now() - t;
    return r;
  };
  const tol = options.symmetryTolerance ?? 1e-10;
  const propagator = options.propagator;
  const cache = new FloquetCache(drive, propagator);
  const bulk = timed('gaps', () => bulkGaps(drive, { points: options.gapGrid, propagator, cache, certifyAbove: options.gapTolerance, certificationBudget: options.gapEvaluations }));

  const symmetryReports = timed('symmetries', () => declaredSymmetryReports(drive, symmetries, tol, propagator));

  let gamma: ComplexMatrix | undefined = symmetries.chiral;
  let source: ChainChiralReport['source'] = 'declared';
  if (!gamma && symmetries.particleHole && symmetries.timeReversal) {
    gamma = chiralFromTimeReversalAndParticleHole(symmetries.timeReversal.unitary, symmetries.particleHole.unitary);
    source = 'time-reversal × particle-hole';
  }
  const chiral = gamma ? timed('chiral', () => chiralReport(drive, gamma!, source, tol, propagator, symmetries.chiralTimes)) : undefined;
  const majorana = symmetries.particleHole ? timed('majorana', () => majoranaReport(drive, symmetries.particleHole!.unitary, propagator)) : undefined;
  // Winding of det U(k, T) (quasienergy-winding.ts), on the operators the gap scan already computed.
  const det = timed('determinant-winding', () => phaseWinding((s) => new LuDecomposition(cache.operator(s).operator).determinant));

  const length = defaultChainLength(bulk, 10, options.maxCells ?? 160);
  const cells = options.cells ?? length.cells;
  const open = options.run?.openChain === false ? undefined : timed('open-chain', () => openChainSpectrum(drive, cells, { bulk, propagator }));
  const modes: ChainEndModes[] = (open?.modes ?? []).map((m) => ({
    label: m.label,
    low: m.low,
    high: m.high,
    lowWeight: m.lowWeight,
    highWeight: m.highWeight,
    lowDecayLength: m.lowFit ? m.lowFit.length : null,
    highDecayLength: m.highFit ? m.highFit.length : null,
    fitResidual: Math.max(m.lowFit?.rmsResidual ?? 0, m.highFit?.rmsResidual ?? 0),
    quasienergies: m.quasienergies,
    window: m.window,
    settled: m.settled,
    ...(m.reason !== undefined ? { reason: m.reason } : {}),
  }));

  const consistency: ConsistencyCheck[] = [];
  consistency.push({
    name: 'det-winding vanishes',
    holds: det.winding.converged && det.winding.nearest === 0,
    detail: `winding of det U(k, T) = ${formatRawValue(det.winding.raw)} on ${det.points} momenta (0 for any Hamiltonian drive)`,
  });
  if (chiral?.status === 'computed' && chiral.halfPeriod) {
    // Two methods for the same invariant where both apply: a disagreement is reported, never smoothed over.
    for (const [label, heff, half] of [['0', chiral.zero, chiral.halfPeriod.zero], ['π', chiral.pi, chiral.halfPeriod.pi]] as const) {
      if (!heff?.converged || !half.converged) continue;
      consistency.push({
        name: `half-period vs H_eff at ${label}`,
        holds: heff.nearest === half.nearest,
        detail: `ν_${label} = ${heff.nearest} from the H_eff windings of both frames, ${half.nearest} from the half-period evolution of the first frame`,
      });
    }
  }
  for (const m of modes) {
    const name = m.label === 0 ? '0' : 'π';
    const inv = chiral?.status === 'computed' ? settledChiral(chiral, m.label) : undefined;
    if (inv && inv.converged && m.settled) {
      const expected = Math.abs(inv.nearest);
      consistency.push({
        name: `bulk–end at ${name} (chiral)`,
        holds: m.low === expected && m.high === expected,
        detail: `|ν_${name}| = ${expected}; end modes low ${m.low}, high ${m.high} on ${cells} cells`,
      });
    }
    const parity = majorana?.status === 'computed' ? (m.label === 0 ? majorana.zero : majorana.pi) : null;
    if (parity !== null && parity !== undefined && m.settled) {
      const odd = parity === -1;
      consistency.push({
        name: `bulk–end at ${name} (Z₂)`,
        holds: (m.low ?? 0) % 2 === (odd ? 1 : 0) && (m.high ?? 0) % 2 === (odd ? 1 : 0),
        detail: `M_${name} = ${parity}; end modes low ${m.low}, high ${m.high} on ${cells} cells`,
      });
    }
  }

  return {
    kind: 'chain',
    gaps: bulk.gaps.map((g) => ({ ...g })),
    gapGrid: bulk.grid,
    velocity: bulk.velocity,
    symmetries: symmetryReports,
    symmetryClass: declaredSymmetryClass(symmetries),
    ...(chiral ? { chiral } : {}),
    ...(majorana ? { majorana } : {}),
    determinantWinding: det.winding,
    ...(open
      ? {
          openChain: {
            cells,
            edgeCells: open.edgeCells,
            lengthSufficient: options.cells !== undefined || length.sufficient,
            modes,
            eigenResidual: open.eigenResidual,
            quasienergies: open.quasienergies,
            lowEdgeWeight: open.lowEdgeWeight,
            highEdgeWeight: open.highEdgeWeight,
          },
        }
      : {}),
    consistency,
    propagatorAccuracy: Math.max(bulk.propagatorAccuracy, open?.propagatorAccuracy ?? 0),
    timings,
  };
}

/** The chiral invariant of a gap: from the H_eff windings when they converged, else from the half-period evolution. */
export function settledChiral(chiral: ChainChiralReport, label: 0 | 1): IntegerEstimate | undefined {
  const heff = label === 0 ? chiral.zero : chiral.pi;
  if (heff?.converged) return heff;
  const half = label === 0 ? chiral.halfPeriod?.zero : chiral.halfPeriod?.pi;
  return half ?? heff;
}

function chiralReport(
  drive: LatticeDrive,
  gamma: ComplexMatrix,
  source: ChainChiralReport['source'],
  tol: number,
  propagator?: PropagatorOptions,
  declaredFrames?: number[],
): ChainChiralReport {
  const r = chiralInvariants(drive, gamma, { frames: { tolerance: tol }, propagator, declaredFrames });
  const ratio = (w: { minModulus: number; maxModulus: number }) => (w.maxModulus > 0 ? w.minModulus / w.maxModulus : 0);
  return {
    status: r.status,
    source,
    frameSource: r.frameSource,
    frameNotes: r.notes,
    frames: r.frames.map((f) => ({
      frameTime: f.frameTime,
      winding: f.result.winding,
      points: f.result.points,
      maxStepPhase: f.result.maxStepPhase,
      modulusRatio: f.result.maxModulus > 0 ? f.result.minModulus / f.result.maxModulus : 0,
      floquetResidual: f.floquetResidual,
    })),
    frameResidual: r.search?.residual ?? Infinity,
    frameTolerance: r.search?.tolerance ?? tol,
    ...(r.zero ? { zero: r.zero } : {}),
    ...(r.pi ? { pi: r.pi } : {}),
    ...(r.halfPeriod
      ? {
          halfPeriod: {
            frameTime: r.halfPeriod.frameTime,
            zero: r.halfPeriod.zero.winding,
            pi: r.halfPeriod.pi.winding,
            zeroModulusRatio: ratio(r.halfPeriod.zero),
            piModulusRatio: ratio(r.halfPeriod.pi),
          },
        }
      : {}),
    ...(r.reason !== undefined ? { reason: r.reason } : {}),
  };
}

function majoranaReport(drive: LatticeDrive, uc: ComplexMatrix, propagator?: PropagatorOptions): ChainMajoranaReport {
  const r = majoranaInvariants(drive, uc, { propagator });
  return {
    status: r.status,
    zero: r.zero?.sign ?? null,
    pi: r.pi?.sign ?? null,
    zeroMargin: r.zero?.margin ?? 0,
    piMargin: r.pi?.margin ?? 0,
    tolerance: r.zero?.tolerance ?? 0,
    momenta: r.points.map(({ momentum, spinTrace, pfaffian, realityDefect, liftConsistency }) => ({ momentum, spinTrace, pfaffian, realityDefect, liftConsistency })),
    ...(r.reason !== undefined ? { reason: r.reason } : {}),
  };
}
