/**
 * Quasienergy bands along a path through the Brillouin zone, for the site's
 * band plots. Reduced momenta: sheets go Γ → b₁/2 → (b₁+b₂)/2 → Γ, chains
 * run s = −1/2 … 1/2. This is plot data only; verdicts never use it.
 */
import type { LatticeDrive } from '../../numerics/evolution/drive.ts';
import { FloquetSampler } from '../../numerics/quasienergy-bands.ts';
import { roundTo } from './decimate.ts';

export interface BandPathRecord {
  /** Reduced momentum of each point. */
  momenta: number[][];
  /** Quasienergies (units π/T, ascending in (−1, 1]) at each point, rounded to 1e-5. */
  quasienergies: number[][];
  /** Named corners of the path: index into momenta and a label. */
  corners: { index: number; label: string }[];
}

export const POINTS_PER_LEG = 24;

export function bandPath(drive: LatticeDrive): BandPathRecord {
  const corners: { at: number[]; label: string }[] =
    drive.dimension === 2
      ? [
          { at: [0, 0], label: 'Γ' },
          { at: [0.5, 0], label: 'b₁/2' },
          { at: [0.5, 0.5], label: '(b₁+b₂)/2' },
          { at: [0, 0], label: 'Γ' },
        ]
      : [
          { at: [-0.5], label: '−π' },
          { at: [0], label: '0' },
          { at: [0.5], label: 'π' },
        ];
  const momenta: number[][] = [];
  const marks: { index: number; label: string }[] = [];
  for (let leg = 0; leg < corners.length - 1; leg++) {
    const a = corners[leg].at, b = corners[leg + 1].at;
    marks.push({ index: momenta.length, label: corners[leg].label });
    for (let i = 0; i < POINTS_PER_LEG; i++) momenta.push(a.map((x, d) => x + ((b[d] - x) * i) / POINTS_PER_LEG));
  }
  marks.push({ index: momenta.length, label: corners[corners.length - 1].label });
  momenta.push(corners[corners.length - 1].at.slice());
  const sampler = new FloquetSampler(drive);
  const quasienergies = momenta.map((k) => Array.from(sampler.at(k).quasienergies, (x) => roundTo(x, 1e-5)).sort((x, y) => x - y));
  return { momenta: momenta.map((k) => k.map((x) => roundTo(x, 1e-9))), quasienergies, corners: marks };
}
