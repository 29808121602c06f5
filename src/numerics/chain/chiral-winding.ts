/**
 * Chiral (classes AIII and BDI) invariants of a driven chain: ν₀ and ν_π.
 *
 * Method (Asbóth & Obuse, PRB 88, 121406(R) (2013); Asbóth, Tarasinski,
 * Delplace, PRB 90, 125143 (2014)). In each of the two symmetric time frames
 * t₀ and t₀ + T/2 (symmetric-frames.ts) the Floquet operator satisfies
 * Γ U Γ† = U†. Take the effective Hamiltonian with the branch cut at π/T,
 *     H_eff = (i/T) log U,   spectrum in (−π/T, π/T],
 * which is then chiral, Γ H_eff Γ† = −H_eff, and continuous in k as long as both
 * the 0 and the π gap are open (the cut sits in the π gap; a closing 0 gap makes
 * the block below singular). In the eigenbasis of Γ (+1 states first),
 *     W† H_eff W = [[0, h†], [h, 0]],   h = ⟨Γ = −1| H_eff |Γ = +1⟩,
 * and the frame's winding is ν = (1/2πi) ∮ d log det h(k) over the zone.
 * With ν′ from the frame t₀ and ν″ from t₀ + T/2,
 *     ν₀ = (ν′ + ν″)/2,   ν_π = (ν′ − ν″)/2.
 * Sign conventions: for the static SSH chain (intracell v from A to B,
 * intercell w, Γ = diag(1, −1)) h = v + w e^{ik} and ν₀ = +1 when |w| > |v|.
 * The sign of ν_π depends on which frame is first: the first time the model
 * lists (declaredFrames), or, when it lists none, the earlier of the two frames
 * the search finds in [0, T/2); |ν₀| and |ν_π| count end modes per end.
 *
 * The half-period method (half-period-winding.ts) gives ν₀ and ν_π in the first
 * frame as well, each needing only its own gap open; both are reported.
 */
import type { ComplexMatrix, Complex } from '../linalg/complex-matrix.ts';
import type { LatticeDrive } from '../evolution/drive.ts';
import type { IntegerEstimate } from '../certificates.ts';
import type { PropagatorOptions } from '../evolution/propagator.ts';
import { integerEstimate } from '../certificates.ts';
import { adjoint, multiply, zeros } from '../linalg/complex-matrix.ts';
import { HermitianEigen } from '../linalg/hermitian-eigen.ts';
import { UnitaryEigen } from '../linalg/unitary-eigen.ts';
import { LuDecomposition } from '../linalg/lu.ts';
import { floquetOperator } from '../evolution/propagator.ts';
import { quasienergyBelowCut, spectralSum } from '../evolution/effective-hamiltonian.ts';
import { shiftTimeOrigin } from '../evolution/time-shift.ts';
import { chiralRelation, findSymmetricFrames } from '../symmetry/symmetric-frames.ts';
import { reflectionResidual } from '../symmetry/reflection-residual.ts';
import { chiralFloquetDefect } from '../symmetry/symmetry-residuals.ts';
import type { HalfPeriodInvariants } from './half-period-winding.ts';
import { halfPeriodInvariants } from './half-period-winding.ts';
import type { FrameSearchOptions, SymmetricFrameSearch } from '../symmetry/symmetric-frames.ts';
import { phaseWinding } from './phase-winding.ts';
import type { PhaseWindingOptions, PhaseWindingResult } from './phase-winding.ts';
import { formatNumber } from '../number-format.ts';

export interface ChiralWindingOptions {
  frames?: FrameSearchOptions;
  /** Symmetric frame times in the model's order (the first defines ν′); searched for when absent or empty. */
  declaredFrames?: number[];
  winding?: PhaseWindingOptions;
  propagator?: PropagatorOptions;
}

export interface FrameWinding {
  /** Frame time t₀ (absolute units). */
  frameTime: number;
  /** Winding of det h over the zone, with its adaptive grid. */
  result: PhaseWindingResult;
  /** max over the evaluated momenta of ‖Γ U Γ† − U†‖_F in this frame. */
  floquetResidual: number;
  /** Smallest distance of an eigenphase of U from 0 and from π over the evaluated momenta (units π/T). */
  clearanceZero: number;
  clearancePi: number;
}

export interface ChiralInvariants {
  status: 'computed' | 'no-symmetric-frame' | 'unbalanced-chiral-operator' | 'declared-frame-not-symmetric';
  search?: SymmetricFrameSearch;
  /** Whether the frames are the model's (first listed first) or found by the search (earlier first). */
  frameSource: 'declared' | 'found';
  frames: FrameWinding[];
  /** ν₀ and ν_π from the H_eff windings of the two frames, present when status = 'computed'. */
  zero?: IntegerEstimate;
  pi?: IntegerEstimate;
  /** ν₀ and ν_π from the half-period evolution in the first frame (half-period-winding.ts). */
  halfPeriod?: HalfPeriodInvariants;
  /** Which frames were used and why, in words. */
  notes: string[];
  reason?: string;
}

/** Residual of the chiral relation above which a declared time is not a symmetric frame (relative, reflection-residual.ts). */
const DEFAULT_FRAME_TOLERANCE = 1e-10;

const time = (t: number) => `${Number(t.toPrecision(6))}`;

/** Eigenbasis of a chiral operator Γ (Hermitian, Γ² = 1): columns with eigenvalue +1, then −1. */
export function chiralBasis(gamma: ComplexMatrix): { plus: ComplexMatrix; minus: ComplexMatrix; defect: number } {
  const eig = new HermitianEigen(gamma);
  const n = gamma.rows;
  const minusCols: number[] = [], plusCols: number[] = [];
  let defect = 0;
  for (let j = 0; j < n; j++) {
    const v = eig.values[j];
    if (v < 0) minusCols.push(j);
    else plusCols.push(j);
    defect = Math.max(defect, Math.abs(Math.abs(v) - 1));
  }
  const pick = (cols: number[]) => {
    const m = zeros(n, cols.length);
    cols.forEach((c, k) => {
      for (let r = 0; r < n; r++) {
        m.re[r * cols.length + k] = eig.vectors.re[r * n + c];
        m.im[r * cols.length + k] = eig.vectors.im[r * n + c];
      }
    });
    return m;
  };
  return { plus: pick(plusCols), minus: pick(minusCols), defect };
}

export function chiralInvariants(drive: LatticeDrive, gamma: ComplexMatrix, options: ChiralWindingOptions = {}): ChiralInvariants {
  const basis = chiralBasis(gamma);
  const declared = options.declaredFrames ?? [];
  const frameSource = declared.length > 0 ? 'declared' : 'found';
  if (basis.plus.cols !== basis.minus.cols) {
    return {
      status: 'unbalanced-chiral-operator',
      frameSource,
      frames: [],
      notes: [],
      reason: `Γ has ${basis.plus.cols} eigenvalues +1 and ${basis.minus.cols} eigenvalues −1; the block winding needs equal numbers`,
    };
  }
  const relation = chiralRelation(gamma);
  const search = findSymmetricFrames(drive, relation, options.frames);
  const T = drive.period, half = T / 2;
  const found = search.frames.length > 0 ? `symmetric frames exist at t₀ = ${time(search.frames[0])} and ${time(search.frames[1])}` : 'no symmetric frame was found';
  let times: number[];
  const notes: string[] = [];
  if (declared.length > 0) {
    const tolerance = options.frames?.tolerance ?? DEFAULT_FRAME_TOLERANCE;
    const t0 = declared[0] - T * Math.floor(declared[0] / T);
    const residual = reflectionResidual(drive, t0, relation);
    if (!(residual <= tolerance)) {
      return {
        status: 'declared-frame-not-symmetric',
        search,
        frameSource,
        frames: [],
        notes,
        reason:
          `the first symmetric time listed, t₀ = ${time(declared[0])}, is not a symmetric frame (residual ${formatNumber(residual)} > ${formatNumber(tolerance)}); ` +
          `${found}; to settle, list a symmetric frame first in claims.symmetries.chiral.symmetricTimes`,
      };
    }
    times = [t0, t0 + half - T * Math.floor((t0 + half) / T)];
    notes.push(`frames as declared: ν′ in t₀ = ${time(times[0])} (the first time in symmetricTimes), ν″ in t₀ + T/2 = ${time(times[1])}`);
    if (declared.length > 1) {
      const second = declared[1] - T * Math.floor(declared[1] / T);
      const apart = Math.abs(second - times[1]);
      if (Math.min(apart, T - apart) > 1e-9 * T) notes.push(`the second time listed (${time(declared[1])}) is not t₀ + T/2; the frame t₀ + T/2 = ${time(times[1])} was used for ν″`);
    }
  } else {
    if (search.frames.length === 0) {
      return {
        status: 'no-symmetric-frame',
        search,
        frameSource,
        frames: [],
        notes,
        reason: `no symmetric time frame: best residual ${formatNumber(search.residual)} at t₀ = ${time(search.bestCandidate)} (tolerance ${formatNumber(search.tolerance)})`,
      };
    }
    times = search.frames;
    notes.push(`no symmetricTimes declared: the engine found the frames t₀ = ${time(times[0])} (ν′, the earlier) and ${time(times[1])} (ν″)`);
  }
  const frames = times.map((t0) => frameWinding(drive, t0, gamma, basis, options));
  const [a, b] = frames.map((f) => f.result.winding);
  const combine = (sign: 1 | -1): IntegerEstimate => {
    const raw = (a.raw + sign * b.raw) / 2;
    const caveats = [a.caveat, b.caveat].filter((c): c is string => c !== undefined);
    if ((a.nearest + b.nearest) % 2 !== 0) caveats.push(`ν′ + ν″ = ${a.nearest + b.nearest} is odd: the two frames disagree`);
    return integerEstimate(
      raw,
      Math.max(a.tolerance, b.tolerance),
      [Math.max(a.grid[0], b.grid[0])],
      [{ grid: [a.grid[0], b.grid[0]], value: raw, label: `(ν′ ${sign > 0 ? '+' : '−'} ν″)/2 from frames on ${a.grid[0]} and ${b.grid[0]} momenta` }],
      a.converged && b.converged,
      caveats.length > 0 ? caveats.join('; ') : undefined,
    );
  };
  const halfPeriod = halfPeriodInvariants(drive, times[0], basis, { propagator: options.propagator, winding: options.winding });
  return { status: 'computed', search, frameSource, frames, zero: combine(1), pi: combine(-1), halfPeriod, notes };
}

function frameWinding(
  drive: LatticeDrive,
  t0: number,
  gamma: ComplexMatrix,
  basis: { plus: ComplexMatrix; minus: ComplexMatrix },
  options: ChiralWindingOptions,
): FrameWinding {
  const rotated = shiftTimeOrigin(drive, t0);
  const T = drive.period;
  const minusDagger = adjoint(basis.minus);
  let floquetResidual = 0, clearanceZero = Infinity, clearancePi = Infinity;
  const f = (s: number): Complex => {
    const u = floquetOperator(rotated, [s], options.propagator).operator;
    floquetResidual = Math.max(floquetResidual, chiralFloquetDefect(u, gamma));
    const eig = new UnitaryEigen(u);
    const eps = new Float64Array(u.rows);
    for (let j = 0; j < u.rows; j++) {
      const phi = eig.phases[j];
      clearanceZero = Math.min(clearanceZero, Math.abs(phi) / Math.PI);
      clearancePi = Math.min(clearancePi, 1 - Math.abs(phi) / Math.PI);
      eps[j] = quasienergyBelowCut(phi, T, Math.PI / T) * T;
    }
    const h = spectralSum(eig.vectors, eps);
    const block = multiply(multiply(minusDagger, h), basis.plus);
    return block.rows === 1 ? { re: block.re[0], im: block.im[0] } : new LuDecomposition(block).determinant;
  };
  const result = phaseWinding(f, options.winding);
  return { frameTime: t0, result, floquetResidual, clearanceZero, clearancePi };
}
