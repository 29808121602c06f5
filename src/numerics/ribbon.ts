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
 */
import type { LatticeDrive } from './drive.ts';
import type { PropagatorOptions } from './propagator.ts';
import type { FloquetSample } from './quasienergy-bands.ts';
import { FloquetSampler } from './quasienergy-bands.ts';
import { truncateDrive } from './supercell.ts';

export interface RibbonOptions {
  /** Index of the lattice vector along which the ribbon is finite (default 0). */
  finiteDirection?: number;
  /** Number of cells across the ribbon (default 24). */
  width?: number;
  /** Cells counted as an edge region on each side (default max(1, ⌊width/4⌋)). */
  edgeCells?: number;
  /** Number of momenta along the edge (default 200). */
  momenta?: number;
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
  /** Largest propagator accuracy estimate over the momenta. */
  propagatorAccuracy: number;
}

/** Weight of eigenvector `column` of `sample` in each cell across the ribbon. */
export function cellWeights(sample: FloquetSample, column: number, orbitalsPerCell: number): Float64Array {
  const v = sample.vectors;
  const cells = v.rows / orbitalsPerCell;
  const w = new Float64Array(cells);
  for (let r = 0; r < v.rows; r++) {
    const p = r * v.cols + column;
    w[Math.floor(r / orbitalsPerCell)] += v.re[p] * v.re[p] + v.im[p] * v.im[p];
  }
  return w;
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
  const sampler = new FloquetSampler(ribbon, { propagator: options.propagator });
  const momenta: number[] = [];
  const samples: FloquetSample[] = [];
  const lowEdgeWeight: number[][] = [];
  const highEdgeWeight: number[][] = [];
  for (let j = 0; j < count; j++) {
    const s = (j + 0.5) / count;
    const sample = sampler.at([s]);
    momenta.push(s);
    samples.push(sample);
    const low: number[] = [];
    const high: number[] = [];
    for (let c = 0; c < sample.vectors.cols; c++) {
      const w = cellWeights(sample, c, orbitalsPerCell);
      let lo = 0, hi = 0;
      for (let e = 0; e < edgeCells; e++) {
        lo += w[e];
        hi += w[width - 1 - e];
      }
      low.push(lo);
      high.push(hi);
    }
    lowEdgeWeight.push(low);
    highEdgeWeight.push(high);
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
    propagatorAccuracy: sampler.worstPropagatorAccuracy,
  };
}
