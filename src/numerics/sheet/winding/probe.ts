/**
 * Where is the winding integrand sharp? Near momenta where the spectrum of
 * U(s, T) comes close to the cut ε: there the eigenvectors on either side of the
 * cut rotate over a momentum range of about d/v (d the distance of the nearest
 * quasienergy to the cut, v its velocity), and X = (i/T)log_ε U, hence V, varies
 * on that scale. This module finds those momenta and widths so that the grid
 * can crowd its points there (winding/grid.ts), and measures the smallest
 * distance, which decides whether the gap is open at all.
 *
 * Method: d on a uniform probe grid; each local minimum is polished by
 * minimising d² (smooth near a gap minimum: d² ≈ d*² + v²|s − s*|² for a
 * Dirac-like minimum, where d itself has a kink at closing) with a compass
 * search that also tries the Newton step of a local quadratic model
 * (common practice, cf. Nocedal & Wright, Numerical Optimization, ch. 9).
 */
import { circularDifference } from '../../quasienergy-bands.ts';

/** Quasienergies (units of π/T) of U(s, T) at reduced momentum s. */
export type SpectrumAt = (s: number[]) => ArrayLike<number>;

export interface CutFocus {
  /** Reduced momentum of the local minimum of the distance to the cut. */
  momentum: [number, number];
  /** Distance from the cut to the spectrum there (units π/T). */
  distance: number;
  /** Widths d/v along s₁ and s₂ (reduced units); Infinity where the distance does not vary. */
  widths: [number, number];
}

export interface CutProbe {
  /** Smallest distance found (units π/T) and where. */
  minimalDistance: number;
  momentumAtMinimum: [number, number];
  /** Polished local minima, smallest distance first. */
  foci: CutFocus[];
  /** Spectra evaluated. */
  evaluations: number;
}

/** Distance (units π/T) from `cut` to the nearest quasienergy. */
export function distanceToCut(quasienergies: ArrayLike<number>, cut: number): number {
  let d = Infinity;
  for (let i = 0; i < quasienergies.length; i++) d = Math.min(d, Math.abs(circularDifference(quasienergies[i], cut)));
  return d;
}

const wrap = (x: number) => x - Math.floor(x);
/** |a − b| on the unit circle of reduced momenta. */
const periodicGap = (a: number, b: number) => Math.abs(a - b - Math.round(a - b));

/**
 * Compass search with Newton steps on f = d², from `start` with initial step
 * `step`. It stops once the step is below `relative` × (the local width d/v,
 * v² ≈ ∂²f/2 from the stencil) — enough to place a focus — or below 1e-11, or
 * when d drops under `floor` (a closing, which is all the caller needs to know).
 */
function polish(f: (s: number[]) => number, start: [number, number], step: number, floor: number, relative = 0.02): { at: [number, number]; value: number } {
  let x: [number, number] = [start[0], start[1]];
  let fx = f(x);
  let h = step;
  for (let iter = 0; iter < 200 && h > 1e-11 && fx > floor * floor; iter++) {
    const p1 = f([x[0] + h, x[1]]), m1 = f([x[0] - h, x[1]]);
    const p2 = f([x[0], x[1] + h]), m2 = f([x[0], x[1] - h]);
    const pp = f([x[0] + h, x[1] + h]);
    const trial: { at: [number, number]; value: number }[] = [
      { at: [x[0] + h, x[1]], value: p1 },
      { at: [x[0] - h, x[1]], value: m1 },
      { at: [x[0], x[1] + h], value: p2 },
      { at: [x[0], x[1] - h], value: m2 },
      { at: [x[0] + h, x[1] + h], value: pp },
    ];
    const g1 = (p1 - m1) / (2 * h), g2 = (p2 - m2) / (2 * h);
    const h11 = (p1 - 2 * fx + m1) / (h * h), h22 = (p2 - 2 * fx + m2) / (h * h);
    const h12 = (pp - p1 - p2 + fx) / (h * h);
    const det = h11 * h22 - h12 * h12;
    if (h11 > 0 && det > 0) {
      const dx = -(h22 * g1 - h12 * g2) / det, dy = -(h11 * g2 - h12 * g1) / det;
      if (Math.hypot(dx, dy) <= 4 * h) {
        const at: [number, number] = [x[0] + dx, x[1] + dy];
        trial.push({ at, value: f(at) });
      }
    }
    let best = trial[0];
    for (const t of trial) if (t.value < best.value) best = t;
    if (best.value < fx) {
      const moved = Math.hypot(best.at[0] - x[0], best.at[1] - x[1]);
      x = best.at;
      fx = best.value;
      if (moved < h) h = Math.max(moved, h / 4);
    } else {
      const curvature = Math.max(h11, h22, 0) / 2;
      if (curvature > 0 && h * Math.sqrt(curvature) < relative * Math.sqrt(fx)) break;
      h /= 4;
    }
  }
  return { at: [wrap(x[0]), wrap(x[1])], value: fx };
}

/**
 * Probes the distance from `cut` (units π/T) to the spectrum on a probeGrid ×
 * probeGrid grid, polishes up to `maxFoci` local minima and estimates their widths.
 */
export function probeCut(spectrum: SpectrumAt, cut: number, probeGrid: number, options: { maxFoci?: number; sharpWidth?: number; floor?: number } = {}): CutProbe {
  const maxFoci = options.maxFoci ?? 6;
  const sharpWidth = options.sharpWidth ?? Infinity;
  const floor = options.floor ?? 0;
  let evaluations = 0;
  const d = (s: number[]) => {
    evaluations++;
    return distanceToCut(spectrum([wrap(s[0]), wrap(s[1])]), cut);
  };
  const n = probeGrid;
  const grid = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) grid[i * n + j] = d([i / n, j / n]);
  const minima: number[] = [];
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      const v = grid[i * n + j];
      let isMin = true;
      for (let a = -1; a <= 1 && isMin; a++) {
        for (let b = -1; b <= 1; b++) {
          if (a === 0 && b === 0) continue;
          const w = grid[((i + a + n) % n) * n + ((j + b + n) % n)];
          // Ties broken by index so that a flat valley yields one representative per plateau cell.
          if (w < v || (w === v && ((i + a + n) % n) * n + ((j + b + n) % n) < i * n + j)) {
            isMin = false;
            break;
          }
        }
      }
      if (isMin) minima.push(i * n + j);
    }
  }
  minima.sort((a, b) => grid[a] - grid[b]);
  // A grid minimum can only hide a sharp focus if d/v, with v the largest slope towards its
  // neighbours, is below twice the width of interest (a closing between grid points has d ≈ v h).
  const slope = (idx: number) => {
    const i = Math.floor(idx / n), j = idx % n;
    let v = 0;
    for (const [a, b] of [[1, 0], [-1, 0], [0, 1], [0, -1]]) v = Math.max(v, (grid[((i + a + n) % n) * n + ((j + b + n) % n)] - grid[idx]) * n);
    return v;
  };
  const worth = minima.filter((idx, rank) => rank === 0 || grid[idx] < 2 * sharpWidth * slope(idx));
  const foci: CutFocus[] = [];
  for (const idx of worth.slice(0, maxFoci)) {
    const start: [number, number] = [Math.floor(idx / n) / n, (idx % n) / n];
    const best = polish((s) => d(s) ** 2, start, 1 / n, floor);
    const dist = Math.sqrt(best.value);
    const dw = 0.25 / n;
    const widths = [0, 1].map((axis) => {
      const e = axis === 0 ? [dw, 0] : [0, dw];
      const plus = d([best.at[0] + e[0], best.at[1] + e[1]]), minus = d([best.at[0] - e[0], best.at[1] - e[1]]);
      const v2 = ((plus * plus + minus * minus) / 2 - dist * dist) / (dw * dw);
      return v2 > 0 ? dist / Math.sqrt(v2) : Infinity;
    }) as [number, number];
    if (foci.some((f) => Math.hypot(periodicGap(f.momentum[0], best.at[0]), periodicGap(f.momentum[1], best.at[1])) < 1e-6)) continue;
    foci.push({ momentum: best.at, distance: dist, widths });
  }
  foci.sort((a, b) => a.distance - b.distance);
  const first = foci[0];
  return { minimalDistance: first.distance, momentumAtMinimum: first.momentum, foci, evaluations };
}
