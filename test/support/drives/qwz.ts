/**
 * Qi–Wu–Zhang two-band Chern insulator (Qi, Wu, Zhang, PRB 74, 085308 (2006)):
 *     H(k) = sin k_x σ_x + sin k_y σ_y + (m + cos k_x + cos k_y) σ_z,
 * on the square lattice a₁ = x̂, a₂ = ŷ, k = 2π s. In the term convention of
 * drive.ts a term (a → b, offset n, amplitude t) adds t e^{−ik·n} to H_ba and its
 * conjugate to H_ab, so
 *     sin k_x σ_x: 1 → 0 with offsets ±x̂ and amplitudes ±i/2,
 *     sin k_y σ_y: 1 → 0 with offsets ±ŷ and amplitudes ±1/2,
 *     cos k σ_z:   0 → 0 (+1/2) and 1 → 1 (−1/2) with offsets x̂, ŷ,
 *     m σ_z:       onsite ±m.
 * `qwzBloch` gives the analytic matrix for cross-checks.
 */
import type { LatticeDrive } from '../../../src/numerics/evolution/drive.ts';
import type { StaticHopping } from './static.ts';
import { staticDrive } from './static.ts';

export function qwzHoppings(m: number): StaticHopping[] {
  return [
    { from: 1, to: 0, offset: [1, 0], amplitude: [0, 0.5] },
    { from: 1, to: 0, offset: [-1, 0], amplitude: [0, -0.5] },
    { from: 1, to: 0, offset: [0, 1], amplitude: 0.5 },
    { from: 1, to: 0, offset: [0, -1], amplitude: -0.5 },
    { from: 0, to: 0, offset: [1, 0], amplitude: 0.5 },
    { from: 0, to: 0, offset: [0, 1], amplitude: 0.5 },
    { from: 1, to: 1, offset: [1, 0], amplitude: -0.5 },
    { from: 1, to: 1, offset: [0, 1], amplitude: -0.5 },
    { from: 0, to: 0, offset: [0, 0], amplitude: m },
    { from: 1, to: 1, offset: [0, 0], amplitude: -m },
  ];
}

export function qwzDrive(m: number, period?: number): LatticeDrive {
  return staticDrive(
    {
      latticeVectors: [
        [1, 0],
        [0, 1],
      ],
      states: [
        { label: 'a', position: [0, 0], charge: 1 },
        { label: 'b', position: [0, 0], charge: 1 },
      ],
      hoppings: qwzHoppings(m),
    },
    period,
  );
}

/** Analytic H(k) as [[re, im]] rows, k = 2π s. */
export function qwzBloch(m: number, s: number[]): [number, number][][] {
  const kx = 2 * Math.PI * s[0], ky = 2 * Math.PI * s[1];
  const dz = m + Math.cos(kx) + Math.cos(ky);
  return [
    [[dz, 0], [Math.sin(kx), -Math.sin(ky)]],
    [[Math.sin(kx), Math.sin(ky)], [-dz, 0]],
  ];
}
