/**
 * Ribbon spectra: a sheet cut open along one lattice vector (supercell.ts),
 * sampled along the remaining periodic direction.
 *
 * Geometry (docs/conventions.md, "Ribbons"): the ribbon is finite along a_f
 * (f = `finiteDirection`) with `width` cells j = 0 … width−1 and periodic along
 * the other lattice vector a_p; k_∥ is the reduced momentum s_p of that vector,
 * with the Bloch convention of drive.ts. The "low" edge is the region of the
 * first `edgeCells` cells (j small, the −a_f side), the "high" edge the last
 * `edgeCells` cells (the +a_f side).
 *
 * Momenta are s_p = (j + 1/2)/n, j = 0 … n−1: the half-step offset keeps the
 * symmetric momenta 0 and 1/2 off the grid, where the two edges' states are
 * often degenerate at a gap's label and the eigensolver would return arbitrary
 * mixtures of them.
 *
 * Floquet operators are band matrices (banded-propagator.ts: products of
 * exact block exponentials for step drives, Chebyshev expansions with a
 * stated error otherwise), diagonalised by the banded route of
 * banded-unitary-eigen.ts, which certifies itself and falls back to the dense
 * eigensolver. The rotation it needs comes from the spectrum at the previous
 * momentum. Time-dependent segments keep the Magnus slice counts settled on a
 * narrow copy of the ribbon (banded-propagator.ts, openBandedFloquet).
 *
 * Every state also gets the edge-localisation measure of
 * ../edge-localisation.ts (weight in the outer few decay lengths against that
 * of an evenly spread state), which the site colours states by.
 *
 * Static drives (one constant Hamiltonian over the whole period, no kicks):
 * U = e^{−iHT} has the eigenvectors of H and the eigenphases −E T, so the
 * ribbon spectrum comes from one Hermitian eigen-decomposition per momentum
 * (ε = E folded into (−π/T, π/T]) instead of exponentiating H and then
 * diagonalising the unitary. The reported residual bounds ‖UV − VΛ‖_F: for a
 * unit vector v, ‖e^{−iHT}v − e^{−iET}v‖ ≤ T‖(H − E)v‖ (integrate
 * d/dt[e^{−iH(T−t)}e^{−iEt}v] over the period), so T‖HV − VE‖_F is a bound.
 */
import type { ComplexMatrix } from '../linalg/complex-matrix.ts';
import { zeros } from '../linalg/complex-matrix.ts';
import { BandedMatrix } from '../linalg/banded-matrix.ts';
import { bandedHermitianEigen } from '../linalg/banded-hermitian-eigen.ts';
import { bandedUnitaryEigen, rotationFor } from '../linalg/banded-unitary-eigen.ts';
import type { LatticeDrive } from '../evolution/drive.ts';
import { driveBandwidth, prepareBloch } from '../evolution/bloch.ts';
import type { PropagatorOptions } from '../evolution/propagator.ts';
import { openBandedFloquet } from '../evolution/banded-propagator.ts';
import type { FloquetSample } from '../quasienergy-bands.ts';
import { quasienergiesFromEigenphases, wrapQuasienergy } from '../quasienergy-bands.ts';
import { truncateDrive } from '../supercell.ts';
import { localisationRegion, regionWeights, stateLocalisation } from '../edge-localisation.ts';

export interface RibbonOptions {
  /** Index of the lattice vector along which the ribbon is finite (default 0). */
  finiteDirection?: number;
  /** Number of cells across the ribbon (default 24). */
  width?: number;
  /** Cells counted as an edge region on each side (default max(1, ⌊width/4⌋)). */
  edgeCells?: number;
  /** Number of momenta along the edge (default 200). */
  momenta?: number;
  /** Largest decay length expected for edge states (cells): sets the localisation region (edge-localisation.ts). */
  decayLength?: number;
  propagator?: PropagatorOptions;
}

export const DEFAULT_RIBBON_WIDTH = 24;
export const DEFAULT_RIBBON_MOMENTA = 200;

export interface RibbonSpectrum {
  finiteDirection: number;
  width: number;
  edgeCells: number;
  orbitalsPerCell: number;
  /** Reduced momenta along the edge. */
  momenta: number[];
  /** Floquet spectrum of the ribbon at each momentum (quasienergies ascending, units π/T). */
  samples: FloquetSample[];
  /** Weight of each state (column) in the low / high edge region, per momentum. */
  lowEdgeWeight: number[][];
  highEdgeWeight: number[][];
  /** Cells of each localisation region and the weight u an evenly spread state has there (edge-localisation.ts). */
  localisationCells: number;
  uniformWeight: number;
  /** Edge-localisation measure of each state on the low / high edge, per momentum. */
  lowLocalisation: number[][];
  highLocalisation: number[][];
  /** Largest propagator accuracy estimate over the momenta. */
  propagatorAccuracy: number;
  /** Largest bound on ‖UV − VΛ‖_F over the momenta. */
  eigenResidual: number;
  /** Largest bound on ‖U_band − U‖₂ over the momenta (Chebyshev tails and band truncations, radians; 0 for exact step factors). */
  truncation: number;
  /** 'hermitian': static drive, eigenvectors of H; 'floquet': eigen-decomposition of U(T). */
  route: 'hermitian' | 'floquet';
}

/** Weight of eigenvector `column` of `sample` in each cell across the ribbon. */
export function cellWeights(sample: FloquetSample, column: number, orbitalsPerCell: number): Float64Array {
  return columnCellWeights(sample.vectors, column, orbitalsPerCell);
}

/** Weight of column `column` of `vectors` (states numbered cell by cell) in each cell. */
export function columnCellWeights(v: ComplexMatrix, column: number, orbitalsPerCell: number): Float64Array {
  const cells = v.rows / orbitalsPerCell;
  const w = new Float64Array(cells);
  for (let r = 0; r < v.rows; r++) {
    const p = r * v.cols + column;
    w[Math.floor(r / orbitalsPerCell)] += v.re[p] * v.re[p] + v.im[p] * v.im[p];
  }
  return w;
}

/**
 * Index of the segment that carries the whole period when the drive is one
 * constant Hamiltonian (a single segment of positive duration without harmonic
 * modulation or vector potential, and no kick with terms); −1 otherwise.
 */
export function staticSegmentIndex(drive: LatticeDrive): number {
  let index = -1;
  for (let i = 0; i < drive.segments.length; i++) {
    const seg = drive.segments[i];
    if (seg.duration > 0) {
      if (index >= 0) return -1;
      index = i;
    } else if (seg.terms.length > 0) return -1;
  }
  if (index < 0) return -1;
  const probe = new Array<number>(drive.dimension).fill(0.5);
  return prepareBloch(drive, probe).isConstant(index) ? index : -1;
}

/**
 * The Floquet spectrum at momentum `s` of a static drive whose Hamiltonian is
 * segment `segment` (see staticSegmentIndex), from the eigen-decomposition of
 * the banded H (banded-hermitian-eigen.ts).
 */
export function staticFloquetSample(drive: LatticeDrive, segment: number, s: number[]): FloquetSample {
  const n = drive.states.length;
  const h = prepareBloch(drive, s).segmentAtBanded(segment, 0, new BandedMatrix(n, driveBandwidth(drive)));
  const eig = bandedHermitianEigen(h);
  const period = drive.period;
  // U = e^{−iHT}: eigenphase −E T, quasienergy E folded, in units π/T.
  const raw = Array.from(eig.values, (e) => wrapQuasienergy((e * period) / Math.PI));
  const order = raw.map((_, i) => i).sort((a, b) => raw[a] - raw[b]);
  const vectors = zeros(n, n);
  for (let c = 0; c < n; c++) {
    const src = order[c];
    for (let r = 0; r < n; r++) {
      vectors.re[r * n + c] = eig.vectors.re[r * n + src];
      vectors.im[r * n + c] = eig.vectors.im[r * n + src];
    }
  }
  return {
    momentum: s.slice(),
    quasienergies: Float64Array.from(order, (i) => raw[i]),
    vectors,
    eigenResidual: period * eig.residual,
    propagatorAccuracy: 0,
  };
}

export function ribbonSpectrum(drive: LatticeDrive, options: RibbonOptions = {}): RibbonSpectrum {
  if (drive.dimension !== 2) {
    throw new RangeError(`ribbonSpectrum: needs a sheet (dimension 2), got dimension ${drive.dimension}`);
  }
  const finiteDirection = options.finiteDirection ?? 0;
  const width = options.width ?? DEFAULT_RIBBON_WIDTH;
  const edgeCells = options.edgeCells ?? Math.max(1, Math.floor(width / 4));
  const count = options.momenta ?? DEFAULT_RIBBON_MOMENTA;
  if (!Number.isInteger(count) || count < 2) throw new RangeError(`ribbonSpectrum: need at least 2 momenta, got ${count}`);
  if (!Number.isInteger(edgeCells) || edgeCells < 1 || 2 * edgeCells > width) {
    throw new RangeError(`ribbonSpectrum: edge region of ${edgeCells} cells does not fit twice into a ribbon of ${width} cells`);
  }
  const ribbon = truncateDrive(drive, finiteDirection, width);
  const orbitalsPerCell = drive.states.length;
  const staticIndex = staticSegmentIndex(ribbon);
  const floquet = staticIndex >= 0 ? null : openBandedFloquet(drive, finiteDirection, width, options.propagator);
  let rotation: number | undefined;
  let propagatorAccuracy = 0, truncation = 0;
  const sampleAt = (s: number): FloquetSample => {
    if (staticIndex >= 0) return staticFloquetSample(ribbon, staticIndex, [s]);
    const u = floquet!.at([s]);
    const eig = bandedUnitaryEigen(u.operator, rotation);
    rotation = rotationFor(eig.phases);
    propagatorAccuracy = Math.max(propagatorAccuracy, u.accuracy / Math.PI);
    truncation = Math.max(truncation, u.truncation);
    const { values, order } = quasienergiesFromEigenphases(eig.phases);
    const n = eig.vectors.rows;
    // Columns into quasienergy order, row by row in place (one scratch row instead of a second matrix).
    const vectors = eig.vectors;
    const rowRe = new Float64Array(n), rowIm = new Float64Array(n);
    for (let r = 0; r < n; r++) {
      const o = r * n;
      for (let c = 0; c < n; c++) {
        rowRe[c] = vectors.re[o + order[c]];
        rowIm[c] = vectors.im[o + order[c]];
      }
      vectors.re.set(rowRe, o);
      vectors.im.set(rowIm, o);
    }
    // The banded operator is within `truncation` of U: residuals against U grow by at most that.
    return { momentum: [s], quasienergies: values, vectors, eigenResidual: eig.residual + Math.sqrt(n) * u.truncation, propagatorAccuracy: u.accuracy / Math.PI };
  };
  const region = localisationRegion(width, options.decayLength);
  let eigenResidual = 0;
  const momenta: number[] = [];
  const samples: FloquetSample[] = [];
  const lowEdgeWeight: number[][] = [];
  const highEdgeWeight: number[][] = [];
  const lowLocalisation: number[][] = [];
  const highLocalisation: number[][] = [];
  for (let j = 0; j < count; j++) {
    const s = (j + 0.5) / count;
    const sample = sampleAt(s);
    eigenResidual = Math.max(eigenResidual, sample.eigenResidual);
    momenta.push(s);
    samples.push(sample);
    const low: number[] = [], high: number[] = [], lowRegion: number[] = [], highRegion: number[] = [];
    for (let c = 0; c < sample.vectors.cols; c++) {
      const w = cellWeights(sample, c, orbitalsPerCell);
      const [lo, hi] = regionWeights(w, edgeCells);
      low.push(lo);
      high.push(hi);
      const [rl, rh] = regionWeights(w, region.cells);
      lowRegion.push(rl);
      highRegion.push(rh);
    }
    lowEdgeWeight.push(low);
    highEdgeWeight.push(high);
    const measure = stateLocalisation(sample.quasienergies, lowRegion, highRegion, region);
    lowLocalisation.push(measure.low);
    highLocalisation.push(measure.high);
  }
  return {
    finiteDirection,
    width,
    edgeCells,
    orbitalsPerCell,
    momenta,
    samples,
    lowEdgeWeight,
    highEdgeWeight,
    localisationCells: region.cells,
    uniformWeight: region.uniformWeight,
    lowLocalisation,
    highLocalisation,
    propagatorAccuracy,
    eigenResidual,
    truncation,
    route: staticIndex >= 0 ? 'hermitian' : 'floquet',
  };
}
