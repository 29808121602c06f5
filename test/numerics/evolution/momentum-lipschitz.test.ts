/**
 * The momentum Lipschitz bound of quasienergies (evolution/momentum-lipschitz.ts),
 * checked against a case where it is attained (derived below) and against
 * finite-difference slopes of the computed quasienergies of driven models.
 */
import { describe, expect, it } from 'vitest';
import type { LatticeDrive } from '../../../src/numerics/evolution/drive.ts';
import { quasienergyLipschitz } from '../../../src/numerics/evolution/momentum-lipschitz.ts';
import { FloquetSampler, circularDifference } from '../../../src/numerics/quasienergy-bands.ts';
import { checkerboardDrive } from '../../support/drives/checkerboard.ts';
import { circularHoneycombDrive } from '../../support/drives/honeycomb.ts';
import { qwzDrive } from '../../support/drives/qwz.ts';
import { seededRandom } from '../../support/random.ts';

describe('Lipschitz bound of quasienergies in momentum', () => {
  it('is attained by one orbital hopping to its neighbour: ε = 2tT cos(2πs)/π, slope 4tT (units π/T)', () => {
    // H(s) = t e^{−2πis} + t e^{+2πis} = 2t cos 2πs (the term and its conjugate share the diagonal), T = 0.7, t = 0.9:
    // ε (units π/T) = −(−2t cos 2πs)… the sign is immaterial; |dε/ds| = (T/π)·4πt|sin 2πs| ≤ 4tT, reached at s = 1/4.
    const t = 0.9, period = 0.7;
    const drive: LatticeDrive = {
      dimension: 1, spaceDimension: 1, latticeVectors: [[1]], states: [{ label: 'a', position: [0], charge: 1 }], period,
      segments: [{ duration: period, terms: [{ from: 0, to: 0, offset: [1], amplitude: { re: t, im: 0 }, modulation: { kind: 'constant' } }] }],
    };
    const [bound] = quasienergyLipschitz(drive);
    expect(Math.abs(bound - 4 * t * period)).toBeLessThanOrEqual(1e-14);
    const sampler = new FloquetSampler(drive);
    const h = 1e-6;
    const slope = Math.abs(circularDifference(sampler.at([0.25 + h]).quasienergies[0], sampler.at([0.25 - h]).quasienergies[0])) / (2 * h);
    expect(Math.abs(slope - bound) / bound).toBeLessThan(1e-6);
  });

  const cases: [string, LatticeDrive][] = [
    ['static Qi–Wu–Zhang, m = 1, T = 0.5', qwzDrive(1, 0.5)],
    ['five-step checkerboard, Jτ = 0.4π, Δτ = 0.3', checkerboardDrive({ hopping: 0.4 * Math.PI, offset: 0.3, stepDuration: 1 })],
    ['circularly driven honeycomb, A₀ = 1, ω = 4 (Magnus slices)', circularHoneycombDrive({ hopping: 1, amplitude: 1, frequency: 4 })],
  ];
  for (const [name, drive] of cases) {
    it(`bounds every finite-difference slope of the quasienergies: ${name}`, () => {
      const bound = quasienergyLipschitz(drive);
      const sampler = new FloquetSampler(drive);
      const random = seededRandom(4242);
      const h = 1e-4;
      for (let trial = 0; trial < 40; trial++) {
        const s = [random(), random()];
        for (const d of [0, 1]) {
          const t = s.slice();
          t[d] += h;
          const a = sampler.at(s).quasienergies, b = sampler.at(t).quasienergies;
          // Sorted quasienergies are themselves Lipschitz with the same bound (a sorted list of Lipschitz branches).
          for (let j = 0; j < a.length; j++) {
            const slope = Math.abs(circularDifference(b[j], a[j])) / h;
            expect(slope, `${name}, s = (${s.map((x) => x.toFixed(4))}), direction ${d}`).toBeLessThanOrEqual(bound[d] * (1 + 1e-6) + 1e-6 / h);
          }
        }
      }
    });
  }
});
