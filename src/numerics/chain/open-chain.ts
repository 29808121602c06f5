/**
 * Open chains: the Floquet spectrum of a finite chain of L cells and the end
 * modes at quasienergy 0 and π/T.
 *
 * The chain is cut open with truncateDrive (supercell.ts); its Floquet
 * operator is a band matrix (banded-propagator.ts). Chains of at most
 * `denseStates` states are diagonalised whole (banded-unitary-eigen.ts); longer
 * ones only near the two labels: the states within half the bulk clearance of
 * 0 and of π/T by shift-and-invert, with their number checked against an exact
 * inertia count (banded-shift-invert.ts). That is everything the end-mode
 * counts below read, so both routes give the same counts, and the length can
 * grow to many thousands of cells (work and memory linear in it). The
 * spectrum kept for plots is then only those states (`coverage`).
 *
 * An end mode of a gap is a state within `window` of
 * the label (units π/T); the window is a fraction of the bulk clearance, so
 * bulk states never enter it, and the annulus between the window and half the
 * clearance must be empty ("isolated"). End states of a finite chain hybridise
 * across it (splitting ∝ e^{−L/ξ}), so counts are taken basis-free: the number
 * of modes at the low end is Σ_{states in window} (weight in the first
 * `edgeCells` cells), which is ≈ 1 per mode whatever the mixing, and likewise
 * at the high end. A count that is not within `countTolerance` of an integer
 * is reported as unsettled.
 *
 * Localisation: the summed density ρ(x) of the window states per cell is fitted
 * by ln ρ(x) = c − 2x/ξ over the half of the chain next to each end (least
 * squares over cells with ρ above 1e-13·max ρ); ξ is the amplitude decay length
 * in cells, |ψ(x)| ∝ e^{−x/ξ}.
 */
import type { ComplexMatrix } from '../linalg/complex-matrix.ts';
import { zeros } from '../linalg/complex-matrix.ts';
import type { BandedMatrix } from '../linalg/banded-matrix.ts';
import type { LatticeDrive } from '../evolution/drive.ts';
import type { PropagatorOptions } from '../evolution/propagator.ts';
import { openBandedFloquet } from '../evolution/banded-propagator.ts';
import { bandedUnitaryEigen } from '../linalg/banded-unitary-eigen.ts';
import { eigenpairsOnArc } from '../linalg/banded-shift-invert.ts';
import { wrapQuasienergy as wrap } from '../quasienergy-bands.ts';
import { localisationRegion, regionWeights, stateLocalisation } from '../edge-localisation.ts';
import type { BulkGaps } from './bulk-gaps.ts';
import { bulkGaps } from './bulk-gaps.ts';

export interface OpenChainOptions {
  /** Window as a fraction of the bulk clearance (default 0.1). */
  windowFraction?: number;
  /** Cells counted as an end region (default: max(2, ⌈3ξ⌉), at most a quarter of the chain). */
  edgeCells?: number;
  /** Largest accepted distance of a count from an integer (default 0.1). */
  countTolerance?: number;
  /** Length must be at least this many decay-length estimates (default 10). */
  lengthPerDecayLength?: number;
  /** Precomputed bulk gaps (else computed). */
  bulk?: BulkGaps;
  /** Chains of at most this many states are diagonalised whole (default 800). */
  denseStates?: number;
  propagator?: PropagatorOptions;
}

/** Chains up to this many states are diagonalised whole by default. */
export const DEFAULT_DENSE_CHAIN_STATES = 800;
/** Default length budget of open chains, in states (cells × orbitals per cell). */
export const DEFAULT_CHAIN_STATES = 40000;

export interface EndModeFit {
  /** Fitted amplitude decay length ξ (cells); 0 when the density drops below the floor within two cells. */
  length: number;
  /** Root-mean-square residual of the fit of ln ρ. */
  rmsResidual: number;
  /** Number of cells in the fit. */
  cells: number;
}

export interface EndModeReport {
  /** Gap label: 0 or 1 (units π/T). */
  label: 0 | 1;
  /** Quasienergies (units π/T) of the states inside the window. */
  quasienergies: number[];
  /** Half-width of the window (units π/T). */
  window: number;
  /** Summed weights at the low / high end (what the counts round). */
  lowWeight: number;
  highWeight: number;
  /** Modes per end, null when unsettled. */
  low: number | null;
  high: number | null;
  lowFit: EndModeFit | null;
  highFit: EndModeFit | null;
  /** Largest |ε − label| among the window states (units π/T): the finite-size splitting. */
  largestOffset: number;
  settled: boolean;
  reason?: string;
}

export interface OpenChainSpectrum {
  cells: number;
  edgeCells: number;
  /** 'all': every state of the chain; 'near-gap-labels': the states within half the bulk clearance of 0 and π/T (long chains). */
  coverage: 'all' | 'near-gap-labels';
  /** Quasienergies of the open chain (units π/T), ascending (see coverage). */
  quasienergies: number[];
  /** Weight of each state (in the order of `quasienergies`) in the first and the last `edgeCells` cells. */
  lowEdgeWeight: number[];
  highEdgeWeight: number[];
  /** Edge-localisation measure of each state (edge-localisation.ts): region size, even-spread weight, per-state measures. */
  localisationCells: number;
  uniformWeight: number;
  lowLocalisation: number[];
  highLocalisation: number[];
  /** Bound on ‖U_band − U‖₂ of the open chain's operator (radians). */
  truncation: number;
  modes: [EndModeReport, EndModeReport];
  /** Bulk decay-length estimate used for the checks (cells), the larger of the two gaps. */
  decayLengthEstimate: number;
  eigenResidual: number;
  propagatorAccuracy: number;
}

/** Default length: ⌈factor·ξ⌉ + 4 cells, at least 12, capped at `cap` cells (the budget). */
export function defaultChainLength(bulk: BulkGaps, factor = 10, cap = 160): { cells: number; sufficient: boolean } {
  const xi = Math.max(1, ...bulk.gaps.filter((g) => g.open).map((g) => g.decayLengthEstimate));
  const wanted = Math.max(12, Math.ceil(factor * xi) + 4);
  return { cells: Math.min(wanted, cap), sufficient: wanted <= cap };
}

export function openChainSpectrum(drive: LatticeDrive, cells: number, options: OpenChainOptions = {}): OpenChainSpectrum {
  if (drive.dimension !== 1) throw new RangeError(`openChainSpectrum: expected a chain (dimension 1), got dimension ${drive.dimension}`);
  const bulk = options.bulk ?? bulkGaps(drive, { propagator: options.propagator });
  const orbitals = drive.states.length;
  const propagation = openBandedFloquet(drive, 0, cells, options.propagator).at([]);
  const N = cells * orbitals;
  const dense = N <= (options.denseStates ?? DEFAULT_DENSE_CHAIN_STATES);
  const states = dense ? wholeSpectrum(propagation.operator) : nearLabels(propagation.operator, bulk);
  const quasienergies = Array.from(states.phases, (phi) => wrap(-phi / Math.PI));
  const eig = { vectors: states.vectors, residual: states.residual + Math.sqrt(N) * propagation.truncation };
  const M = states.vectors.cols;
  const xi = Math.max(1, ...bulk.gaps.filter((g) => g.open).map((g) => g.decayLengthEstimate));
  const edgeCells = options.edgeCells ?? Math.min(Math.max(2, Math.ceil(3 * xi)), Math.max(1, Math.floor(cells / 4)));
  const factor = options.lengthPerDecayLength ?? 10;
  const tolerance = options.countTolerance ?? 0.1;
  const fraction = options.windowFraction ?? 0.1;

  const modes = bulk.gaps.map((gap): EndModeReport => {
    const base = { label: gap.label, quasienergies: [] as number[], window: 0, lowWeight: 0, highWeight: 0, low: null, high: null, lowFit: null, highFit: null, largestOffset: 0 };
    if (!gap.open) return { ...base, settled: false, reason: `the bulk gap at ${gap.label} is closed (clearance ${gap.clearance.toExponential(2)} π/T)` };
    const window = fraction * gap.clearance;
    const inside: number[] = [];
    let intruders = 0;
    quasienergies.forEach((e, j) => {
      const d = Math.abs(wrap(e - gap.label));
      if (d <= window) inside.push(j);
      else if (d < 0.5 * gap.clearance) intruders++;
    });
    const density = new Float64Array(cells);
    for (const j of inside) {
      for (let c = 0; c < cells; c++) {
        for (let a = 0; a < orbitals; a++) {
          const p = (c * orbitals + a) * M + j;
          density[c] += eig.vectors.re[p] ** 2 + eig.vectors.im[p] ** 2;
        }
      }
    }
    let lowWeight = 0, highWeight = 0;
    for (let c = 0; c < edgeCells; c++) {
      lowWeight += density[c];
      highWeight += density[cells - 1 - c];
    }
    const offsets = inside.map((j) => Math.abs(wrap(quasienergies[j] - gap.label)));
    const report: EndModeReport = {
      ...base,
      quasienergies: inside.map((j) => quasienergies[j]),
      window,
      lowWeight,
      highWeight,
      largestOffset: offsets.length ? Math.max(...offsets) : 0,
      lowFit: inside.length ? fitDecay(density, false) : null,
      highFit: inside.length ? fitDecay(density, true) : null,
      settled: true,
    };
    const reasons: string[] = [];
    if (cells < factor * gap.decayLengthEstimate) {
      reasons.push(`chain of ${cells} cells is shorter than ${factor} decay lengths (ξ ≈ ${gap.decayLengthEstimate.toFixed(2)} cells)`);
    }
    if (intruders > 0) reasons.push(`${intruders} states lie between the window (${window.toExponential(2)}) and half the bulk clearance: end modes not isolated`);
    const lowOk = Math.abs(lowWeight - Math.round(lowWeight)) <= tolerance;
    const highOk = Math.abs(highWeight - Math.round(highWeight)) <= tolerance;
    if (!lowOk || !highOk) reasons.push(`end weights ${lowWeight.toFixed(3)} (low), ${highWeight.toFixed(3)} (high) are not within ${tolerance} of integers`);
    if (reasons.length > 0) {
      report.settled = false;
      report.reason = reasons.join('; ');
    } else {
      report.low = Math.round(lowWeight);
      report.high = Math.round(highWeight);
    }
    return report;
  }) as [EndModeReport, EndModeReport];

  // Every state's weight in the two end regions, states ordered by quasienergy (for plots of the spectrum).
  const order = quasienergies.map((_, j) => j).sort((x, y) => quasienergies[x] - quasienergies[y]);
  const region = localisationRegion(cells, xi);
  const lowEdgeWeight: number[] = [], highEdgeWeight: number[] = [], lowRegion: number[] = [], highRegion: number[] = [];
  for (const j of order) {
    const w = stateCellWeights(eig.vectors, j, orbitals, cells);
    const [lo, hi] = regionWeights(w, edgeCells);
    lowEdgeWeight.push(lo);
    highEdgeWeight.push(hi);
    const [rl, rh] = regionWeights(w, region.cells);
    lowRegion.push(rl);
    highRegion.push(rh);
  }
  const sorted = order.map((j) => quasienergies[j]);
  const measure = stateLocalisation(sorted, lowRegion, highRegion, region);

  return {
    cells,
    edgeCells,
    coverage: dense ? 'all' : 'near-gap-labels',
    quasienergies: sorted,
    lowEdgeWeight,
    highEdgeWeight,
    localisationCells: region.cells,
    uniformWeight: region.uniformWeight,
    lowLocalisation: measure.low,
    highLocalisation: measure.high,
    truncation: propagation.truncation,
    modes,
    decayLengthEstimate: xi,
    eigenResidual: eig.residual,
    propagatorAccuracy: propagation.accuracy,
  };
}

/** Weight of state (column) j in each cell of a chain of `cells` cells. */
function stateCellWeights(v: ComplexMatrix, j: number, orbitals: number, cells: number): Float64Array {
  const w = new Float64Array(cells);
  for (let c = 0; c < cells; c++) {
    for (let a = 0; a < orbitals; a++) {
      const p = (c * orbitals + a) * v.cols + j;
      w[c] += v.re[p] ** 2 + v.im[p] ** 2;
    }
  }
  return w;
}

interface ChainStates {
  /** Eigenphases (radians) and eigenvectors (columns) of the states kept. */
  phases: Float64Array;
  vectors: ComplexMatrix;
  /** ‖UV − VΛ‖_F over the states kept. */
  residual: number;
}

function wholeSpectrum(u: BandedMatrix): ChainStates {
  const e = bandedUnitaryEigen(u);
  return { phases: e.phases, vectors: e.vectors, residual: e.residual };
}

/**
 * The states within half the bulk clearance of 0 and of π/T (everything the
 * end-mode counts read: the window and the annulus checked for intruders);
 * a closed gap contributes none.
 */
function nearLabels(u: BandedMatrix, bulk: BulkGaps): ChainStates {
  const parts = bulk.gaps
    .filter((g) => g.open)
    .map((g) => eigenpairsOnArc(u, -Math.PI * g.label, Math.min(0.95, 0.5 * g.clearance) * Math.PI));
  const failed = parts.find((p) => !p.converged);
  if (failed) throw new RangeError(`openChainSpectrum: ${failed.caveat ?? 'the states near the gap labels were not found'}`);
  const total = parts.reduce((sum, p) => sum + p.phases.length, 0);
  const n = u.n;
  const vectors = zeros(n, total);
  const phases = new Float64Array(total);
  let col = 0, residual = 0;
  for (const p of parts) {
    for (let j = 0; j < p.phases.length; j++, col++) {
      phases[col] = p.phases[j];
      residual += p.residuals[j] ** 2;
      for (let r = 0; r < n; r++) {
        vectors.re[r * total + col] = p.vectors.re[r * p.vectors.cols + j];
        vectors.im[r * total + col] = p.vectors.im[r * p.vectors.cols + j];
      }
    }
  }
  return { phases, vectors, residual: Math.sqrt(residual) };
}

/** Least-squares fit of ln ρ(x) = c − 2x/ξ over the half chain next to one end. */
export function fitDecay(density: Float64Array, fromHighEnd: boolean): EndModeFit {
  const L = density.length;
  const half = Math.max(2, Math.floor(L / 2));
  const values: number[] = [];
  for (let x = 0; x < half; x++) values.push(density[fromHighEnd ? L - 1 - x : x]);
  const peak = Math.max(...values);
  const xs: number[] = [], ys: number[] = [];
  values.forEach((v, x) => {
    if (v > 1e-13 * peak && v > 0) {
      xs.push(x);
      ys.push(Math.log(v));
    }
  });
  if (xs.length < 3) return { length: 0, rmsResidual: 0, cells: xs.length };
  const m = xs.length;
  const mx = xs.reduce((a, b) => a + b, 0) / m, my = ys.reduce((a, b) => a + b, 0) / m;
  let sxy = 0, sxx = 0;
  for (let i = 0; i < m; i++) {
    sxy += (xs[i] - mx) * (ys[i] - my);
    sxx += (xs[i] - mx) ** 2;
  }
  const slope = sxy / sxx;
  let r2 = 0;
  for (let i = 0; i < m; i++) r2 += (ys[i] - (my + slope * (xs[i] - mx))) ** 2;
  return { length: slope < 0 ? -2 / slope : Infinity, rmsResidual: Math.sqrt(r2 / m), cells: m };
}
