/**
 * Quasienergy bands along a path through the Brillouin zone, for the site's
 * band plots. Sheets follow the high-symmetry path of their lattice type
 * (brillouin-zone.ts: Γ–X–M–Γ on a square lattice, Γ–M–K–Γ on a hexagonal
 * one), chains run k = −π/a … π/a (s = −1/2 … 1/2). Momenta are reduced in the
 * model's basis. This is plot data only; verdicts never use it.
 */
import type { LatticeDrive } from '../../numerics/evolution/drive.ts';
import { FloquetSampler } from '../../numerics/quasienergy-bands.ts';
import { roundTo } from './decimate.ts';
import { highSymmetryPath, reciprocalVectors, type Vec2 } from './brillouin-zone.ts';

export interface BandPathRecord {
  /** Reduced momentum of each point. */
  momenta: number[][];
  /** Quasienergies (units π/T, ascending in (−1, 1]) at each point, rounded to 1e-5. */
  quasienergies: number[][];
  /** Named corners of the path: index into momenta and a label. */
  corners: { index: number; label: string }[];
}

/** Points along the whole path (legs get points in proportion to their length in k). */
export const PATH_POINTS = 72;

export function bandPath(drive: LatticeDrive): BandPathRecord {
  const corners: { at: number[]; label: string }[] =
    drive.dimension === 2
      ? highSymmetryPath(drive.latticeVectors[0] as Vec2, drive.latticeVectors[1] as Vec2).corners.map((c) => ({ at: [...c.reduced], label: c.label }))
      : [
          { at: [-0.5], label: '−π/a' },
          { at: [0], label: '0' },
          { at: [0.5], label: 'π/a' },
        ];
  const lengths = corners.slice(1).map((c, leg) => cartesianLength(drive, corners[leg].at, c.at));
  const total = lengths.reduce((a, b) => a + b, 0) || 1;
  const momenta: number[][] = [];
  const marks: { index: number; label: string }[] = [];
  for (let leg = 0; leg < corners.length - 1; leg++) {
    const a = corners[leg].at, b = corners[leg + 1].at;
    const points = Math.max(4, Math.round((PATH_POINTS * lengths[leg]) / total));
    marks.push({ index: momenta.length, label: corners[leg].label });
    for (let i = 0; i < points; i++) momenta.push(a.map((x, d) => x + ((b[d] - x) * i) / points));
  }
  marks.push({ index: momenta.length, label: corners[corners.length - 1].label });
  momenta.push(corners[corners.length - 1].at.slice());
  const sampler = new FloquetSampler(drive);
  const quasienergies = momenta.map((k) => Array.from(sampler.at(k).quasienergies, (x) => roundTo(x, 1e-5)).sort((x, y) => x - y));
  return { momenta: momenta.map((k) => k.map((x) => roundTo(x, 1e-9))), quasienergies, corners: marks };
}

/** Length of the straight leg between two reduced momenta, in Cartesian k. */
function cartesianLength(drive: LatticeDrive, from: number[], to: number[]): number {
  if (drive.dimension !== 2) return Math.abs(to[0] - from[0]);
  const [b1, b2] = reciprocalVectors(drive.latticeVectors[0] as Vec2, drive.latticeVectors[1] as Vec2);
  const d = [to[0] - from[0], to[1] - from[1]];
  return Math.hypot(d[0] * b1[0] + d[1] * b2[0], d[0] * b1[1] + d[1] * b2[1]);
}
