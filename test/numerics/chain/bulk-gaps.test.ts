/**
 * Gaps of driven chains against a derivation done here.
 *
 * Two-step chain (θᵢ = JᵢT/2): U(k) = e^{−iθ₂ n̂(k)·σ} e^{−iθ₁σx} with n̂(k) = (cos k, ±sin k, 0).
 * Both factors lie in SU(2), so the eigenvalues are e^{±iφ(k)} with
 *     cos φ(k) = ½ Tr U = cos θ₁ cos θ₂ − sin θ₁ sin θ₂ cos k,
 * using Tr(σ_a σ_b) = 2δ_ab. The right side is monotonic in cos k, so φ(k) ∈ [0, π] takes
 * its extremes at k = 0 (cos φ = cos(θ₁ + θ₂)) and k = π (cos φ = cos(θ₁ − θ₂)). The
 * quasienergies are ±φ/π (units π/T); the gap at 0 has direct gap 2φ/π and the gap at π
 * has 2(π − φ)/π, so
 *     minimal gap at 0 = 2 min(φ₀, φ_π)/π,   minimal gap at π = 2(π − max(φ₀, φ_π))/π,
 * closing where θ₁ ± θ₂ ∈ πℤ. A uniform onsite energy μ multiplies U by e^{−iμT}: every
 * quasienergy moves by μT/π, the direct gap does not change, the distance from the label
 * to the nearest state (the clearance) shrinks to (φ_min − μT)/π.
 */
import { describe, expect, it } from 'vitest';
import type { LatticeDrive } from '../../../src/numerics/evolution/drive.ts';
import { brentMinimum, bulkGaps, FloquetCache, twoBandPhases } from '../../../src/numerics/chain/bulk-gaps.ts';
import { UnitaryEigen } from '../../../src/numerics/linalg/unitary-eigen.ts';
import { randomUnitary, seededRandom, unitaryWithPhases } from '../../support/random.ts';
import { twoStepChain } from '../../support/drives/chains.ts';

function expectWithin(label: string, actual: number, expected: number, tolerance: number): void {
  const delta = Math.abs(actual - expected);
  if (!(delta <= tolerance)) expect.fail(`${label}: actual ${actual}, expected ${expected}, |Δ| ${delta.toExponential(2)} > tolerance ${tolerance.toExponential(2)}`);
}

/** φ(k) at k = 0 and π from the derivation above (radians in [0, π]). */
function analyticPhases(theta1: number, theta2: number): { zero: number; pi: number } {
  return { zero: Math.acos(Math.cos(theta1 + theta2)), pi: Math.acos(Math.cos(theta1 - theta2)) };
}

/** Periodic distance between reduced momenta. */
const momentumDistance = (a: number, b: number) => Math.abs(a - b - Math.round(a - b));

/** The two-step chain with a uniform onsite energy μ on both orbitals during both steps. */
function shiftedTwoStepChain(theta1: number, theta2: number, mu: number): LatticeDrive {
  const drive = twoStepChain(theta1, theta2);
  for (const segment of drive.segments) {
    for (const orbital of [0, 1]) segment.terms.push({ from: orbital, to: orbital, offset: [0], amplitude: { re: mu, im: 0 }, modulation: { kind: 'constant' } });
  }
  return drive;
}

describe('bulk gaps of chains', () => {
  it('two-step chain: minimal direct gaps at 0 and π and their momenta match the analytic φ(0), φ(π)', () => {
    const cases: [number, number][] = [[1.5, 2.0], [0.35 * Math.PI, 0.85 * Math.PI], [0.3, 1.2], [0.9, 0.4], [2.2, 0.6]];
    for (const [t1, t2] of cases) {
      const r = bulkGaps(twoStepChain(t1, t2), { points: 48 });
      const phi = analyticPhases(t1, t2);
      const [zero, pi] = r.gaps;
      const where = `θ = (${t1.toFixed(3)}, ${t2.toFixed(3)})`;
      expectWithin(`${where}: gap at 0`, zero.minimalGap, (2 * Math.min(phi.zero, phi.pi)) / Math.PI, 1e-9);
      expectWithin(`${where}: gap at π`, pi.minimalGap, (2 * (Math.PI - Math.max(phi.zero, phi.pi))) / Math.PI, 1e-9);
      // The minimum of φ sits at k = 0 when φ₀ < φ_π, else at k = π (s = 1/2); the maximum the other way.
      expectWithin(`${where}: momentum of the 0 gap`, momentumDistance(zero.momentumAtMinimum, phi.zero < phi.pi ? 0 : 0.5), 0, 1e-6);
      expectWithin(`${where}: momentum of the π gap`, momentumDistance(pi.momentumAtMinimum, phi.zero > phi.pi ? 0 : 0.5), 0, 1e-6);
      // Symmetric spectrum ±φ: the direct gap is twice the clearance, and the free arc is centred on the label.
      for (const g of r.gaps) {
        expectWithin(`${where}: direct gap = 2 × clearance at ${g.label}`, g.minimalGap, 2 * g.clearance, 1e-9);
        expectWithin(`${where}: arc width at ${g.label}`, g.arcWidth, g.minimalGap, 1e-9);
        expect(g.open).toBe(true);
      }
    }
  });

  it('closes the gap at 0 where θ₁ = θ₂ and the gap at π where θ₁ + θ₂ = π, and nowhere else', () => {
    const a = bulkGaps(twoStepChain(0.7, 0.7), { points: 32 });
    expect(a.gaps[0].open).toBe(false);
    expect(a.gaps[0].minimalGap).toBeLessThanOrEqual(2e-6);
    expectWithin('closing momentum (k = π)', momentumDistance(a.gaps[0].clearanceMomentum, 0.5), 0, 1e-6);
    expect(a.gaps[1].open).toBe(true);
    const b = bulkGaps(twoStepChain(1.1, Math.PI - 1.1), { points: 32 });
    expect(b.gaps[1].open).toBe(false);
    expect(b.gaps[1].minimalGap).toBeLessThanOrEqual(2e-6);
    expectWithin('closing momentum (k = 0)', momentumDistance(b.gaps[1].clearanceMomentum, 0), 0, 1e-6);
    expect(b.gaps[0].open).toBe(true);
  });

  it('a uniform onsite shift μ moves the clearance and the arc but not the direct gap', () => {
    const t1 = 0.3, t2 = 1.2, mu = 0.25; // φ_min = |θ₁ − θ₂| = 0.9 > μT
    const shifted = bulkGaps(shiftedTwoStepChain(t1, t2, mu), { points: 48 });
    const phiMin = Math.min(analyticPhases(t1, t2).zero, analyticPhases(t1, t2).pi);
    const zero = shifted.gaps[0];
    expectWithin('direct gap at 0', zero.minimalGap, (2 * phiMin) / Math.PI, 1e-9);
    expectWithin('clearance at 0', zero.clearance, (phiMin - mu) / Math.PI, 1e-9);
    // States at (μT ± φ)/π: the arc runs from (μT − φ_min)/π to (μT + φ_min)/π.
    expectWithin('lower edge of the arc', zero.lower, (mu - phiMin) / Math.PI, 1e-9);
    expectWithin('upper edge of the arc', zero.upper, (mu + phiMin) / Math.PI, 1e-9);
    expect(zero.minimalGap).toBeGreaterThan(2 * zero.clearance + 0.1);
  });

  it('shares Floquet operators through the cache: a second scan on the same cache propagates nothing', () => {
    const cache = new FloquetCache(twoStepChain(0.3, 1.2));
    const first = bulkGaps(cache.drive, { points: 32, cache });
    expect(first.evaluations).toBeGreaterThanOrEqual(32);
    const second = bulkGaps(cache.drive, { points: 32, cache });
    expect(second.evaluations).toBe(0);
    expect(second.gaps).toEqual(first.gaps);
  });

  it("Brent's method finds a smooth minimum and a kink to the requested tolerance", () => {
    const smooth = brentMinimum((x) => (x - 0.3) ** 2 + 1, 0, 1, 1e-10);
    expectWithin('smooth minimum', smooth.x, 0.3, 1e-8);
    expectWithin('smooth value', smooth.value, 1, 1e-15);
    const kink = brentMinimum((x) => Math.abs(x - 0.123), -0.5, 0.5, 1e-10);
    expectWithin('kink minimum', kink.x, 0.123, 1e-9);
  });

  it('closed-form 2×2 eigenphases agree with the unitary eigensolver and resolve nearly equal phases', () => {
    const random = seededRandom(20240611);
    const circular = (x: number) => Math.abs(x - 2 * Math.PI * Math.round(x / (2 * Math.PI)));
    for (let trial = 0; trial < 50; trial++) {
      const u = randomUnitary(random, 2);
      const closed = Array.from(twoBandPhases(u)).sort((a, b) => a - b);
      const reference = new UnitaryEigen(u).phases;
      for (const phi of closed) {
        expect(phi > -Math.PI && phi <= Math.PI).toBe(true);
        expect(Math.min(...Array.from(reference, (r) => circular(r - phi)))).toBeLessThanOrEqual(1e-12);
      }
    }
    // Phases γ ± δ with δ = 1e-9, around 0.7 and around π: the splitting 2δ to 1e-14 absolute.
    for (const centre of [0.7, Math.PI]) {
      const delta = 1e-9;
      const u = unitaryWithPhases(randomUnitary(random, 2), [centre - delta, centre + delta]);
      const [a, b] = twoBandPhases(u);
      expectWithin(`splitting around ${centre}`, circular(b - a), 2 * delta, 1e-14);
    }
  });
});
