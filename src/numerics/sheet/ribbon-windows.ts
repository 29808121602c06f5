/**
 * The ribbon states whose quasienergy lies within h of a gap label c, at one
 * momentum: what banded-edge-counts.ts follows in k∥. Two sources.
 *
 * Driven ribbons: the eigenpairs of the banded Floquet operator U(k∥) on the
 * arc |φ + πc| < πh (eigenvalues e^{−iπε}), by shift-invert with an exact
 * inertia count (banded-shift-invert.ts). The operator of the last momentum
 * is kept, so the windows of several gaps at one momentum share it. Error of a
 * quasienergy: (residual + truncation + time-integration bound)/π.
 *
 * Static ribbons (one constant Hamiltonian H over the period T): U = e^{−iHT},
 * so ε = ET/π folded into (−1, 1], and the window is the union of the energy
 * intervals E ∈ (π(c − h + 2m)/T, π(c + h + 2m)/T) that meet the spectrum of
 * H(k∥) (Gershgorin bounds). Their eigenpairs come from shift-invert on the
 * banded H itself, with the inertia count of H − E: no exponential is formed,
 * so the result is exact up to the eigenpair residuals (error T·r/π).
 */
import type { ComplexMatrix } from '../linalg/complex-matrix.ts';
import { zeros } from '../linalg/complex-matrix.ts';
import { BandedMatrix } from '../linalg/banded-matrix.ts';
import { spectralInterval } from '../linalg/banded-exponential.ts';
import { eigenpairsInInterval, eigenpairsOnArc } from '../linalg/banded-shift-invert.ts';
import type { BandedFloquet, BandedPropagation } from '../evolution/banded-propagator.ts';
import type { LatticeDrive } from '../evolution/drive.ts';
import { compileConstantDrive, driveBandwidth } from '../evolution/bloch.ts';
import { circularDifference, wrapQuasienergy } from '../quasienergy-bands.ts';

export interface WindowStatesAt {
  /** Quasienergies (units π/T) ordered by ε − c, and their error bounds. */
  eps: Float64Array;
  error: Float64Array;
  /** Unit eigenvectors as columns. */
  vectors: ComplexMatrix;
  /** Bound on ‖U_band − U‖₂ of the operator used (radians; 0 for static ribbons). */
  truncation: number;
  /** Why not every state of the window was found, when that happened. */
  caveat?: string;
  /** True when the window held more than MAX_WINDOW_STATES states (it reaches into a bulk band). */
  crowded?: boolean;
}

/** More states than this in a window near a gap label means the window reaches into a bulk band. */
export const MAX_WINDOW_STATES = 24;

export interface WindowSource {
  /** The states with |ε − c| < h (units π/T) at momentum k (reduced, taken mod 1). */
  at(k: number, c: number, h: number, start?: ComplexMatrix): WindowStatesAt;
}

export function floquetWindows(floquet: BandedFloquet, tolerance: number): WindowSource {
  // The operators of the last two momenta: the sweep's and a refinement's, so gaps share both.
  const recent: { k: number; u: BandedPropagation }[] = [];
  return {
    at(k, c, h, start) {
      const s = k - Math.floor(k);
      let entry = recent.find((e) => e.k === s);
      if (entry === undefined) {
        entry = { k: s, u: floquet.at([s]) };
        recent.unshift(entry);
        recent.length = Math.min(recent.length, 2);
      }
      const u = entry.u;
      const arc = eigenpairsOnArc(u.operator, -Math.PI * c, Math.PI * h, { tolerance, maxCount: MAX_WINDOW_STATES, ...(start && start.cols > 0 ? { start } : {}) });
      return {
        eps: Float64Array.from(arc.phases, (p) => wrapQuasienergy(-p / Math.PI)),
        error: Float64Array.from(arc.residuals, (r) => (r + u.truncation + u.accuracy) / Math.PI),
        vectors: arc.vectors,
        truncation: u.truncation,
        ...(arc.converged ? {} : { caveat: arc.caveat ?? 'the states near the label were not all found' }),
        ...(arc.crowded ? { crowded: true } : {}),
      };
    },
  };
}

/** Windows of a static ribbon whose Hamiltonian is segment `segment` of `ribbon` (a drive with one periodic direction). */
export function staticWindows(ribbon: LatticeDrive, segment: number, tolerance: number): WindowSource {
  const compiled = compileConstantDrive(ribbon);
  if (compiled === null) throw new RangeError('staticWindows: the drive is not piecewise constant');
  const n = ribbon.states.length, T = ribbon.period;
  const h = new BandedMatrix(n, driveBandwidth(ribbon));
  let lastK = NaN;
  return {
    at(k, c, halfWidth, start) {
      const s = k - Math.floor(k);
      if (s !== lastK) {
        compiled.fillBanded(segment, [s], h);
        lastK = s;
      }
      const { centre, radius } = spectralInterval(h);
      const lowest = ((centre - radius) * T) / Math.PI, highest = ((centre + radius) * T) / Math.PI;
      const parts: { eps: number; error: number; column: number; vectors: ComplexMatrix }[] = [];
      const caveats: string[] = [];
      let crowded = false;
      for (let m = Math.floor((lowest - c - halfWidth) / 2); c + 2 * m - halfWidth < highest; m++) {
        const lo = c + 2 * m - halfWidth, hi = c + 2 * m + halfWidth;
        if (hi <= lowest) continue;
        const found = eigenpairsInInterval(h, (Math.PI * lo) / T, (Math.PI * hi) / T, { tolerance, maxCount: MAX_WINDOW_STATES, ...(start && start.cols > 0 ? { start } : {}) });
        if (!found.converged) caveats.push(found.caveat ?? 'the states near the label were not all found');
        crowded ||= found.crowded === true;
        for (let j = 0; j < found.phases.length; j++) {
          parts.push({ eps: wrapQuasienergy((found.phases[j] * T) / Math.PI), error: (found.residuals[j] * T) / Math.PI, column: j, vectors: found.vectors });
        }
      }
      parts.sort((a, b) => circularDifference(a.eps, c) - circularDifference(b.eps, c));
      const vectors = zeros(n, parts.length);
      parts.forEach((p, col) => {
        for (let r = 0; r < n; r++) {
          vectors.re[r * parts.length + col] = p.vectors.re[r * p.vectors.cols + p.column];
          vectors.im[r * parts.length + col] = p.vectors.im[r * p.vectors.cols + p.column];
        }
      });
      return {
        eps: Float64Array.from(parts, (p) => p.eps),
        error: Float64Array.from(parts, (p) => p.error),
        vectors,
        truncation: 0,
        ...(caveats.length > 0 ? { caveat: caveats[0] } : {}),
        ...(crowded ? { crowded: true } : {}),
      };
    },
  };
}
