/**
 * Time-dependent (harmonically modulated) drives through the sweep path of the
 * propagator (slice counts settled once per drive) and the sheet analysis.
 *
 * Modulated Qi–Wu–Zhang model (Qi, Wu, Zhang, PRB 74, 085308 (2006)): every
 * hopping multiplied by f(t) = 1 + a cos ωt, the onsite mass m constant:
 *     H(k, t) = A(k) + f(t) B(k),   A = m σ_z,   B = sin k_x σ_x + sin k_y σ_y + (cos k_x + cos k_y) σ_z.
 * Derivation of the high-frequency limit (Magnus expansion of U(T), common
 * practice): U(T) = exp(−iT H_F) with
 *     H_F = (1/T)∫₀ᵀ H dt + (1/2iT)∫₀ᵀdt₁∫₀^{t₁}dt₂ [H(t₁), H(t₂)] + O(T²‖H‖³).
 * The first term is the static model with m (the mean of f is 1). In the second,
 * [H(t₁), H(t₂)] = (f(t₂) − f(t₁))[A, B] and
 *     ∫₀ᵀdt₁∫₀^{t₁}dt₂ (cos ωt₂ − cos ωt₁) = ∫₀ᵀ (sin ωt₁/ω − t₁ cos ωt₁) dt₁ = 0 − 0,
 * so H_F = H_QWZ(m) + O(T²‖A‖‖B‖²). For T‖H‖ small the correction cannot close
 * the gap 2·min|d| = 2||m| − 2|·… of the static model (2 at m = ±1), and the
 * spectrum |E| ≤ |m| + 2 stays inside (−π/T, π/T] when (|m| + 2)T < π: the
 * Floquet bands are the static bands, with the static Chern numbers, lower
 * band C = +1 at m = 1 and −1 at m = −1 (our sign anchor, docs/conventions.md).
 */
import { describe, expect, it } from 'vitest';
import type { DriveTerm, LatticeDrive } from '../../../src/numerics/evolution/drive.ts';
import { floquetOperator, magnusSlicePlan, prepareFloquet } from '../../../src/numerics/evolution/propagator.ts';
import { magnusCF4 } from '../../../src/numerics/evolution/magnus.ts';
import { analyseSheet } from '../../../src/numerics/sheet/sheet-analysis.ts';
import { blochHamiltonian } from '../../../src/numerics/evolution/bloch.ts';
import { distance, zeros } from '../../../src/numerics/linalg/complex-matrix.ts';
import type { ComplexMatrix } from '../../../src/numerics/linalg/complex-matrix.ts';
import { qwzDrive } from '../../support/drives/qwz.ts';
import { seededRandom } from '../../support/random.ts';
import { expectBelow, fromMathjs, math, toMathjs } from '../linalg/comparisons.ts';

/** QWZ with every hopping (not the mass) multiplied by 1 + a cos(ωt + phase). */
function modulatedQwz(m: number, a: number, period: number, phase = 0): LatticeDrive {
  const drive = qwzDrive(m, period);
  const modulation: DriveTerm['modulation'] = { kind: 'harmonic', mean: 1, components: [{ amplitude: a, harmonic: 1, phase }] };
  return {
    ...drive,
    segments: drive.segments.map((seg) => ({
      ...seg,
      terms: seg.terms.map((t) => (t.from === t.to && t.offset.every((x) => x === 0) ? t : { ...t, modulation })),
    })),
  };
}

describe('modulated Qi–Wu–Zhang model at high frequency', () => {
  // T = 0.5: (|m| + 2)T = 1.5 < π, and ω = 4π is twice the bandwidth 6 of the static model.
  for (const [m, lower] of [[1, 1], [-1, -1]] as const) {
    it(`has the Chern numbers of the static average at m = ${m}: lower band ${lower}, upper ${-lower}`, () => {
      const drive = modulatedQwz(m, 0.8, 0.5);
      const p = analyseSheet(drive, { grid: [8, 8], run: { winding: false, edges: false } });
      const byGap = (label: number) => p.bands.find((b) => Math.abs(b.gapBelow - label) < 1e-9);
      // Bands counted upward from π/T: the lower band lies between the gaps at π/T and 0.
      expect(byGap(1)?.chern?.nearest).toBe(lower);
      expect(byGap(0)?.chern?.nearest).toBe(-lower);
      for (const b of p.bands) {
        expect(b.chern?.converged, `band ${b.index}: ${b.chern?.caveat}`).toBe(true);
        // The refinement starts at the requested grid (8) and doubles.
        expect(b.chern?.history[0].grid).toEqual([8, 8]);
      }
      // The quasienergy gap at 0 is the static gap 2 (energy) up to O(T²) corrections: 2T/π = 0.318 π/T.
      const gap0 = p.gaps.find((g) => Math.abs(g.label) < 1e-9);
      expect(gap0?.open).toBe(true);
      expect(Math.abs((gap0?.minimalGap ?? 0) - (2 * 0.5) / Math.PI)).toBeLessThan(0.05);
      // The derived tolerance (10⁻⁶ π/T with the defaults) is what the integration reached.
      expect(p.propagatorAccuracy).toBeGreaterThan(0);
      expect(p.propagatorAccuracy).toBeLessThanOrEqual(1e-6);
    });
  }

  it('has a trivial lower band at m = 3 (outside 0 < |m| < 2)', () => {
    const p = analyseSheet(modulatedQwz(3, 0.8, 0.4), { grid: [8, 8], run: { winding: false, edges: false } });
    expect(p.bands.map((b) => b.chern?.nearest)).toEqual([0, 0]);
  });
});

describe('slice counts settled once per drive', () => {
  it('reaches the tolerance at every momentum and agrees with a tightly integrated reference', () => {
    const drive = modulatedQwz(1, 0.8, 1.3, 0.4);
    const tolerance = 1e-7;
    const plan = magnusSlicePlan(drive, { tolerance });
    expect(plan.converged).toBe(true);
    expect(plan.probes.length).toBe(3);
    const propagate = prepareFloquet(drive, { tolerance });
    const random = seededRandom(2024);
    for (let j = 0; j < 12; j++) {
      const s = [random(), random()];
      const p = propagate(s);
      expect(p.converged).toBe(true);
      // The plan's counts are used unless this momentum needed more.
      expect(p.slices[0]).toBeGreaterThanOrEqual(plan.slices[0]);
      expect(p.accuracy).toBeLessThanOrEqual(tolerance);
      const reference = floquetOperator(drive, s, { tolerance: 1e-12 });
      // The reported accuracy bounds the eigenphase change under doubling; the actual error is below it.
      expectBelow(`‖U − U_ref‖ at s = (${s.map((x) => x.toFixed(3)).join(', ')})`, distance(p.operator, reference.operator), tolerance);
    }
  });

  it('starts from numerics.timeSlices when given: the counts are that start times a power of two', () => {
    const drive = modulatedQwz(1, 0.8, 1.3);
    const p = floquetOperator(drive, [0.2, 0.7], { tolerance: 1e-8, startSlices: 5 });
    const ratio = p.slices[0] / 5;
    expect(Number.isInteger(ratio) && (ratio & (ratio - 1)) === 0).toBe(true);
    expect(() => floquetOperator(drive, [0, 0], { startSlices: 0 })).toThrow('floquetOperator: startSlices must be a positive integer, got 0');
  });
});

describe('sparse route of the Magnus integrator (Taylor series on banded generators)', () => {
  it('gives exp(−iHT) of a constant 12-site chain Hamiltonian (reference: mathjs expm)', () => {
    // For constant H the two CF4 exponentials per slice multiply to exp(−iHh) exactly (α₁ + α₂ = 1/2).
    const n = 12, T = 1.7;
    const random = seededRandom(7);
    const h = zeros(n, n);
    for (let i = 0; i < n; i++) {
      h.re[i * n + i] = random() - 0.5;
      if (i + 1 < n) {
        const re = random() - 0.5, im = random() - 0.5;
        h.re[(i + 1) * n + i] = re; h.im[(i + 1) * n + i] = im;
        h.re[i * n + i + 1] = re; h.im[i * n + i + 1] = -im;
      }
    }
    const sampler = (_t: number, out: ComplexMatrix) => {
      out.re.set(h.re);
      out.im.set(h.im);
      return out;
    };
    const reference = fromMathjs(math.expm(math.multiply(math.complex(0, -T), toMathjs(h)) as never) as never);
    for (const slices of [1, 3, 10]) expectBelow(`‖U − expm‖ with ${slices} slices`, distance(magnusCF4(sampler, n, 0, T, slices), reference), 1e-12);
  });

  it('integrates a block-diagonal 16×16 modulated Hamiltonian block by block like the 2×2 closed form', () => {
    // Eight Bloch matrices of the modulated model on the diagonal: the 16×16 generator has a quarter of
    // its entries nonzero (sparse route); each block must evolve exactly as the 2×2 path (closed-form exponentials).
    const drive = modulatedQwz(1, 0.8, 1);
    const width = 8;
    const sample = (t: number, out: ComplexMatrix) => {
      out.re.fill(0);
      out.im.fill(0);
      for (let c = 0; c < width; c++) {
        const b = blochHamiltonian(drive, [0.3, c / width], t);
        for (let i = 0; i < 2; i++) for (let j = 0; j < 2; j++) {
          out.re[(2 * c + i) * 2 * width + 2 * c + j] = b.re[i * 2 + j];
          out.im[(2 * c + i) * 2 * width + 2 * c + j] = b.im[i * 2 + j];
        }
      }
      return out;
    };
    const big = magnusCF4(sample, 2 * width, 0, 1, 64);
    // Block c must equal the 2×2 CF4 result (closed-form exponentials) of the same Bloch matrix.
    for (let c = 0; c < width; c++) {
      const small = magnusCF4((t, out) => {
        const b = blochHamiltonian(drive, [0.3, c / width], t);
        out.re.set(b.re);
        out.im.set(b.im);
        return out;
      }, 2, 0, 1, 64);
      let err = 0;
      for (let i = 0; i < 2; i++) for (let j = 0; j < 2; j++) {
        const p = (2 * c + i) * 2 * width + 2 * c + j;
        err = Math.max(err, Math.hypot(big.re[p] - small.re[i * 2 + j], big.im[p] - small.im[i * 2 + j]));
      }
      expectBelow(`block ${c}: sparse 16×16 route vs 2×2 closed form`, err, 1e-13);
    }
  });
});
