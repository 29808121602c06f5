/**
 * Bulk quasienergy gaps of a chain at 0 and at π/T.
 *
 * The clearance of a gap is the distance (units π/T) from its label (0 or 1)
 * to the nearest bulk quasienergy over the Brillouin zone. A uniform k grid is
 * refined around its minimum by golden-section search (common practice), since
 * a closing gap first shows between grid points. With chiral or particle–hole
 * symmetry the spectrum is symmetric about the label and the direct gap is
 * twice the clearance.
 *
 * The group velocity max |dε/dk| (quasienergy bands sorted upward from the cut
 * in the larger gap) gives the decay-length estimate ξ ≈ v/clearance (cells)
 * used to size open chains.
 */
import type { LatticeDrive } from '../drive.ts';
import type { PropagatorOptions } from '../propagator.ts';
import { floquetOperator } from '../propagator.ts';
import { UnitaryEigen } from '../linalg/unitary-eigen.ts';

export interface ChainGap {
  /** 0 or 1 (units π/T). */
  label: 0 | 1;
  /** Distance from the label to the nearest bulk quasienergy (units π/T), and where (reduced momentum). */
  clearance: number;
  momentumAtMinimum: number;
  /** clearance > gapTolerance. */
  open: boolean;
  /** Decay length estimate of end states in this gap, v_max / clearance (cells; Infinity when closed). */
  decayLengthEstimate: number;
}

export interface BulkGapOptions {
  /** Uniform k points (default 128). */
  points?: number;
  /** Clearance below this counts as closed (units π/T, default 1e-6). */
  gapTolerance?: number;
  propagator?: PropagatorOptions;
}

export interface BulkGaps {
  gaps: [ChainGap, ChainGap];
  /** Max |dε/dk| over the grid (units π/T per radian of k). */
  velocity: number;
  grid: number;
  /** Largest accuracy estimate reported by the propagator. */
  propagatorAccuracy: number;
}

/** Eigenphases φ ∈ (−π, π] of U(s, T) (eigenvalues e^{iφ}); quasienergy ε = −φ/π in units π/T. */
export function floquetPhases(drive: LatticeDrive, s: number, propagator?: PropagatorOptions): { phases: Float64Array; accuracy: number } {
  const p = floquetOperator(drive, [s], propagator);
  return { phases: new UnitaryEigen(p.operator).phases, accuracy: p.accuracy };
}

function clearanceOf(phases: Float64Array, label: 0 | 1): number {
  let c = Infinity;
  for (const phi of phases) c = Math.min(c, label === 0 ? Math.abs(phi) / Math.PI : 1 - Math.abs(phi) / Math.PI);
  return c;
}

export function bulkGaps(drive: LatticeDrive, options: BulkGapOptions = {}): BulkGaps {
  const n = options.points ?? 128;
  const tol = options.gapTolerance ?? 1e-6;
  let accuracy = 0;
  const at = (s: number) => {
    const r = floquetPhases(drive, s, options.propagator);
    accuracy = Math.max(accuracy, r.accuracy);
    return r.phases;
  };
  const samples = Array.from({ length: n }, (_, j) => at(j / n));
  // Bands sorted upward from the cut in the larger gap; velocity from neighbouring differences.
  const bigger: 0 | 1 = Math.min(...samples.map((p) => clearanceOf(p, 0))) >= Math.min(...samples.map((p) => clearanceOf(p, 1))) ? 0 : 1;
  const sorted = samples.map((p) => Array.from(p, (phi) => {
    const e = -phi / Math.PI; // units π/T
    const d = e - bigger; // measured upward from the cut
    return d - 2 * Math.floor(d / 2);
  }).sort((a, b) => a - b));
  let velocity = 0;
  const dk = (2 * Math.PI) / n;
  for (let j = 0; j < n; j++) {
    const a = sorted[j], b = sorted[(j + 1) % n];
    for (let m = 0; m < a.length; m++) velocity = Math.max(velocity, Math.abs(b[m] - a[m]) / dk);
  }
  const gap = (label: 0 | 1): ChainGap => {
    let jMin = 0, cMin = Infinity;
    samples.forEach((p, j) => {
      const c = clearanceOf(p, label);
      if (c < cMin) {
        cMin = c;
        jMin = j;
      }
    });
    // Golden-section refinement on [s_{j−1}, s_{j+1}].
    let a = (jMin - 1) / n, b = (jMin + 1) / n;
    const g = (Math.sqrt(5) - 1) / 2;
    let x1 = b - g * (b - a), x2 = a + g * (b - a);
    let f1 = clearanceOf(at(x1), label), f2 = clearanceOf(at(x2), label);
    for (let it = 0; it < 40 && b - a > 1e-12; it++) {
      if (f1 < f2) {
        b = x2; x2 = x1; f2 = f1; x1 = b - g * (b - a); f1 = clearanceOf(at(x1), label);
      } else {
        a = x1; x1 = x2; f1 = f2; x2 = a + g * (b - a); f2 = clearanceOf(at(x2), label);
      }
    }
    let s = jMin / n;
    if (Math.min(f1, f2) < cMin) {
      cMin = Math.min(f1, f2);
      s = f1 < f2 ? x1 : x2;
    }
    s -= Math.floor(s);
    const open = cMin > tol;
    return { label, clearance: cMin, momentumAtMinimum: s, open, decayLengthEstimate: open ? Math.max(velocity, cMin) / cMin : Infinity };
  };
  return { gaps: [gap(0), gap(1)], velocity, grid: n, propagatorAccuracy: accuracy };
}
