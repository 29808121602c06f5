/**
 * Hofstadter model: nearest-neighbour hopping −t on the square lattice with flux
 * p/q flux quanta per plaquette (Thouless, Kohmoto, Nightingale, den Nijs, PRL 49,
 * 405 (1982)), in the Landau gauge A = (0, Bx): the magnetic cell holds q sites
 * j = 0 … q−1 at (j, 0), a₁ = (q, 0), a₂ = (0, 1), and a hop from (j, y) to
 * (j, y+1) carries the phase e^{2πi(p/q) j}. The phase around a plaquette
 * traversed counter-clockwise is then 2πp/q. Negative p reverses the field.
 */
import type { LatticeDrive } from '../../../src/numerics/evolution/drive.ts';
import type { StaticHopping } from './static.ts';
import { staticDrive } from './static.ts';

export interface HofstadterParameters {
  p: number;
  q: number;
  hopping?: number;
}

export function hofstadterDrive({ p, q, hopping = 1 }: HofstadterParameters, period?: number): LatticeDrive {
  const hoppings: StaticHopping[] = [];
  for (let j = 0; j < q; j++) {
    hoppings.push({ from: j, to: (j + 1) % q, offset: [j === q - 1 ? 1 : 0, 0], amplitude: -hopping });
    const phase = (2 * Math.PI * p * j) / q;
    hoppings.push({ from: j, to: j, offset: [0, 1], amplitude: [-hopping * Math.cos(phase), -hopping * Math.sin(phase)] });
  }
  return staticDrive(
    {
      latticeVectors: [
        [q, 0],
        [0, 1],
      ],
      states: Array.from({ length: q }, (_, j) => ({ label: `x${j}`, position: [j, 0], charge: 1 })),
      hoppings,
    },
    period,
  );
}
