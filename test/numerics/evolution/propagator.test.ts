import { describe, expect, it } from 'vitest';
import { evolutionOperators, floquetOperator } from '../../../src/numerics/evolution/propagator.ts';
import { magnusCF4 } from '../../../src/numerics/evolution/magnus.ts';
import { blochHamiltonian } from '../../../src/numerics/evolution/bloch.ts';
import type { DriveTerm, LatticeDrive } from '../../../src/numerics/evolution/drive.ts';
import type { ComplexMatrix } from '../../../src/numerics/linalg/complex-matrix.ts';
import { distance, fromArrays, identity, multiply, unitarityDefect, zeros } from '../../../src/numerics/linalg/complex-matrix.ts';
import { seededRandom } from '../../support/random.ts';
import { expectBelow, fixtureMatrix, fromMathjs, math, toMathjs } from '../linalg/comparisons.ts';
import type { FixtureMatrix } from '../linalg/comparisons.ts';
import { readFileSync } from 'node:fs';

const constant = { kind: 'constant' } as const;
const term = (from: number, to: number, re: number, im = 0, modulation: DriveTerm['modulation'] = constant): DriveTerm => ({ from, to, offset: [], amplitude: { re, im }, modulation });
const cosine = (harmonic: number, phase: number) => ({ kind: 'harmonic' as const, mean: 0, components: [{ amplitude: 1, harmonic, phase }] });

function twoLevel(period: number, segments: LatticeDrive['segments']): LatticeDrive {
  return { dimension: 0, spaceDimension: 1, latticeVectors: [], period, states: [{ label: '↑', position: [0], charge: 1 }, { label: '↓', position: [0], charge: 1 }], segments };
}

/**
 * Circularly driven spin: H = (Δ/2)σ_z + (Ω/2)[cos ωt σ_x + sin ωt σ_y].
 * Element (↓, ↑) of the drive term is (Ω/2)(cos ωt + i sin ωt) = (Ω/2)cos ωt + (iΩ/2)cos(ωt − π/2).
 */
function rotatingDrive(delta: number, rabi: number, omega: number): LatticeDrive {
  return twoLevel((2 * Math.PI) / omega, [{
    duration: (2 * Math.PI) / omega,
    terms: [term(0, 0, delta / 2), term(1, 1, -delta / 2), term(0, 1, rabi / 2, 0, cosine(1, 0)), term(0, 1, 0, rabi / 2, cosine(1, -Math.PI / 2))],
  }]);
}

/**
 * Exact solution in the rotating frame (derived here): with R(t) = e^{−iωtσ_z/2},
 * R†(cos ωt σ_x + sin ωt σ_y)R = σ_x and −iR†Ṙ = −(ω/2)σ_z, so ψ = Rφ with
 * iφ̇ = H_R φ, H_R = ((Δ − ω)/2)σ_z + (Ω/2)σ_x, and U(t) = R(t) e^{−iH_R t}.
 * e^{−iH_R t} is taken from mathjs expm (an independent reference).
 */
function rotatingExact(delta: number, rabi: number, omega: number, t: number): ComplexMatrix {
  const hr = fromArrays([[(delta - omega) / 2, rabi / 2], [rabi / 2, -(delta - omega) / 2]]);
  const inner = fromMathjs(math.expm(math.multiply(math.complex(0, -t), toMathjs(hr)) as never) as never);
  const r = fromArrays([[[Math.cos(omega * t / 2), -Math.sin(omega * t / 2)], 0], [0, [Math.cos(omega * t / 2), Math.sin(omega * t / 2)]]]);
  return multiply(r, inner);
}

describe('floquetOperator and evolutionOperators', () => {
  it('reproduces the Rabi formula for a constant two-level Hamiltonian, exactly (one exponential)', () => {
    const delta = 0.8, rabi = 1.1, T = 2.6;
    const drive = twoLevel(T, [{ duration: T, terms: [term(0, 0, delta / 2), term(1, 1, -delta / 2), term(0, 1, rabi / 2)] }]);
    const p = floquetOperator(drive, []);
    const w = Math.hypot(rabi, delta);
    const transfer = p.operator.re[2] ** 2 + p.operator.im[2] ** 2;
    expectBelow('|P(↑→↓) − (Ω²/W²) sin²(WT/2)|', Math.abs(transfer - (rabi * rabi) / (w * w) * Math.sin((w * T) / 2) ** 2), 1e-15 * 10);
    expect(p.accuracy).toBe(0);
    expect(p.slices).toEqual([1]);
    expect(p.converged).toBe(true);
  });

  it('matches the exact rotating-frame solution of a circularly driven two-level system', () => {
    const [delta, rabi, omega] = [1.3, 0.9, 2.1];
    const drive = rotatingDrive(delta, rabi, omega);
    const T = drive.period;
    const p = floquetOperator(drive, [], { tolerance: 1e-11 });
    const err = distance(p.operator, rotatingExact(delta, rabi, omega, T));
    expectBelow('‖U(T) − exact‖_F', err, 1e-11);
    expect(p.converged).toBe(true);
    // The reported accuracy is an upper estimate of the actual error.
    expect(err).toBeLessThanOrEqual(p.accuracy + 1e-14);
    const times = [0, 0.1 * T, 0.37 * T, 0.5 * T, T];
    evolutionOperators(drive, [], times, { tolerance: 1e-11 }).forEach((u, k) => expectBelow(`‖U(${times[k].toFixed(3)}) − exact‖_F`, distance(u, rotatingExact(delta, rabi, omega, times[k])), 1e-10));
  });

  it('converges at fourth order: the error ratio under slice doubling is ≈ 16 (Blanes & Moan; Alvermann & Fehske)', () => {
    const [delta, rabi, omega] = [1.3, 2.4, 1.7];
    const drive = rotatingDrive(delta, rabi, omega);
    const T = drive.period;
    const exact = rotatingExact(delta, rabi, omega, T);
    // (↓,↑) = (Ω/2)e^{+iωt} at index 2, its conjugate at index 1.
    const sample = (t: number, out: ComplexMatrix) => {
      const c = (rabi / 2) * Math.cos(omega * t), sn = (rabi / 2) * Math.sin(omega * t);
      out.re.set([delta / 2, c, c, -delta / 2]);
      out.im.set([0, -sn, sn, 0]);
      return out;
    };
    for (const t of [0.1, 0.8, 2.3]) expectBelow(`sampler = blochHamiltonian at t=${t}`, distance(sample(t, zeros(2, 2)), blochHamiltonian(drive, [], t)), 1e-15);
    const errors = [16, 32, 64].map((n) => distance(magnusCF4(sample, 2, 0, T, n), exact));
    for (let k = 0; k + 1 < errors.length; k++) {
      const ratio = errors[k] / errors[k + 1];
      expect(ratio, `error ratio ${errors[k]} / ${errors[k + 1]}`).toBeGreaterThan(13);
      expect(ratio, `error ratio ${errors[k]} / ${errors[k + 1]}`).toBeLessThan(19);
    }
    // The general (n > 2) path converges the same way: embed the system twice, block-diagonally.
    const sample4 = (t: number, out: ComplexMatrix) => {
      const s2 = sample(t, zeros(2, 2));
      out.re.fill(0); out.im.fill(0);
      for (const b of [0, 2]) for (let i = 0; i < 2; i++) for (let j = 0; j < 2; j++) {
        out.re[(b + i) * 4 + b + j] = s2.re[i * 2 + j];
        out.im[(b + i) * 4 + b + j] = s2.im[i * 2 + j];
      }
      // Couple the copies weakly so that the 4×4 path cannot split into 2×2 blocks.
      out.re[0 * 4 + 3] = out.re[3 * 4 + 0] = 1e-3;
      return out;
    };
    const e16 = magnusCF4(sample4, 4, 0, T, 16), e32 = magnusCF4(sample4, 4, 0, T, 32), e64 = magnusCF4(sample4, 4, 0, T, 64);
    const r4 = distance(e16, e64) / distance(e32, e64);
    // With e64 as reference: (16⁻⁴ − 64⁻⁴)/(32⁻⁴ − 64⁻⁴) = 17.
    expect(r4).toBeGreaterThan(14);
    expect(r4).toBeLessThan(20);
  });

  it('multiplies exact exponentials for piecewise-constant drives with kicks (reference: mathjs expm)', () => {
    const r = seededRandom(61);
    const h = () => {
      const a = r() - 0.5, b = r() - 0.5, c = r() - 0.5, d = r() - 0.5;
      return [term(0, 0, a), term(1, 1, b), term(0, 1, c, d)];
    };
    const segs = [{ duration: 0.3, terms: h() }, { duration: 0, terms: h() }, { duration: 0.9, terms: h() }, { duration: 0.8, terms: h() }];
    const drive = twoLevel(2, segs);
    const matrixOf = (terms: DriveTerm[]) => {
      const m = zeros(2, 2);
      for (const t of terms) {
        if (t.from === t.to) m.re[t.from * 3] += t.amplitude.re;
        else { m.re[2] += t.amplitude.re; m.im[2] += t.amplitude.im; m.re[1] += t.amplitude.re; m.im[1] -= t.amplitude.im; }
      }
      return m;
    };
    const expm = (m: ComplexMatrix, t: number) => fromMathjs(math.expm(math.multiply(math.complex(0, -t), toMathjs(m)) as never) as never);
    const factors = segs.map((s) => expm(matrixOf(s.terms), s.duration === 0 ? 1 : s.duration));
    let ref = identity(2);
    for (const f of factors) ref = multiply(f, ref);
    const p = floquetOperator(drive, []);
    expectBelow('‖U(T) − Π exp‖_F', distance(p.operator, ref), 1e-13);
    expect(p.accuracy).toBe(0);
    // Right-continuous at the kick (t = 0.3): U(0.3) includes it; U(0.3⁻) does not.
    const [before, at] = evolutionOperators(drive, [], [0.3 - 1e-12, 0.3]);
    expectBelow('U(0.3) includes the kick', distance(at, multiply(factors[1], factors[0])), 1e-12);
    expectBelow('U(0.3 − 1e-12) excludes it', distance(before, factors[0]), 1e-11);
    expectBelow('U(T) from evolutionOperators', distance(evolutionOperators(drive, [], [2])[0], p.operator), 1e-14);
  });

  it('builds Bloch steps with momentum phases and bond blocks of three states on a sheet (reference: mathjs expm)', () => {
    // Four states; step 1 couples 0–1–2 (one block of three) across cells, a kick couples 2–3, step 2 is onsite.
    // Bloch convention of drive.ts, written out here: H_ba += t e^{−2πi s·n}, H_ab += conj of it.
    const r = seededRandom(62);
    const hop = (from: number, to: number, offset: number[]): DriveTerm => ({ from, to, offset, amplitude: { re: r() - 0.5, im: r() - 0.5 }, modulation: constant });
    const onsite = (i: number): DriveTerm => ({ from: i, to: i, offset: [0, 0], amplitude: { re: r() - 0.5, im: 0 }, modulation: constant });
    const segs = [
      { duration: 0.7, terms: [hop(0, 1, [1, 0]), hop(1, 2, [0, -1]), hop(2, 0, [1, 1]), onsite(3)] },
      { duration: 0, terms: [hop(2, 3, [0, 1]), onsite(0)] },
      { duration: 1.3, terms: [onsite(0), onsite(1), onsite(2), onsite(3)] },
    ];
    const drive: LatticeDrive = {
      dimension: 2, spaceDimension: 2, latticeVectors: [[1, 0], [0, 1]], period: 2,
      states: [0, 1, 2, 3].map((i) => ({ label: `s${i}`, position: [0.1 * i, 0], charge: 1 })), segments: segs,
    };
    const s = [0.137, 0.71];
    const bloch = (terms: DriveTerm[]) => {
      const m = zeros(4, 4);
      for (const t of terms) {
        if (t.from === t.to) { m.re[t.from * 5] += t.amplitude.re; continue; }
        const arg = -2 * Math.PI * (s[0] * t.offset[0] + s[1] * t.offset[1]);
        const hr = t.amplitude.re * Math.cos(arg) - t.amplitude.im * Math.sin(arg), hi = t.amplitude.re * Math.sin(arg) + t.amplitude.im * Math.cos(arg);
        m.re[t.to * 4 + t.from] += hr; m.im[t.to * 4 + t.from] += hi;
        m.re[t.from * 4 + t.to] += hr; m.im[t.from * 4 + t.to] -= hi;
      }
      return m;
    };
    const expm = (m: ComplexMatrix, t: number) => fromMathjs(math.expm(math.multiply(math.complex(0, -t), toMathjs(m)) as never) as never);
    let ref = identity(4);
    for (const seg of segs) ref = multiply(expm(bloch(seg.terms), seg.duration === 0 ? 1 : seg.duration), ref);
    const p = floquetOperator(drive, s);
    expectBelow('‖U(T) − Π exp‖_F', distance(p.operator, ref), 1e-13);
    expect(p.slices).toEqual([1, 1, 1]);
    expect(() => floquetOperator(drive, [0.1])).toThrow(/momentum has 1 components, the lattice has dimension 2/);
  });

  it('keeps time-dependent propagators unitary and reports slices, accuracy and failure', () => {
    const drive = rotatingDrive(0.4, 3, 1);
    const p = floquetOperator(drive, [], { tolerance: 1e-9 });
    // Rounding accumulates over one 2×2 product per slice: allow 2ε per slice.
    expectBelow('‖U†U − 1‖_F', unitarityDefect(p.operator), 2 * 2 ** -52 * 2 * p.slices[0]);
    expect(p.accuracy).toBeLessThanOrEqual(1e-9);
    expect(p.slices[0]).toBeGreaterThan(2);
    const capped = floquetOperator(drive, [], { tolerance: 1e-14, maxSlices: 8 });
    expect(capped.converged).toBe(false);
    expect(capped.caveat).toBe('time integration did not reach the tolerance within 8 slices in segment(s) 0; raise maxSlices or loosen the tolerance');
  });

  it('matches scipy solve_ivp (DOP853) for a three-level harmonic drive (reference: committed fixture)', () => {
    interface Fixture {
      scipy: string;
      period: number;
      terms: { from: number; to: number; amplitude: [number, number]; mean: number | null; components: { amplitude: number; harmonic: number; phase: number }[] }[];
      times: number[];
      operators: FixtureMatrix[];
      unitarityDefect: number;
    }
    const fx = JSON.parse(readFileSync(new URL('../../fixtures/reference/propagator.json', import.meta.url), 'utf8')) as Fixture;
    const drive: LatticeDrive = {
      dimension: 0, spaceDimension: 1, latticeVectors: [], period: fx.period,
      states: [0, 1, 2].map((i) => ({ label: `q${i}`, position: [0], charge: 1 })),
      segments: [{
        duration: fx.period,
        terms: fx.terms.map((t) => term(t.from, t.to, t.amplitude[0], t.amplitude[1], t.mean === null ? constant : { kind: 'harmonic', mean: t.mean, components: t.components })),
      }],
    };
    // The reference itself is good to about its unitarity defect; allow 1e-11 on top.
    const tol = 1e-11 + 10 * fx.unitarityDefect;
    const p = floquetOperator(drive, [], { tolerance: 1e-11 });
    expect(p.converged).toBe(true);
    expectBelow(`U(T) vs scipy ${fx.scipy}`, distance(p.operator, fixtureMatrix(fx.operators[fx.operators.length - 1])), tol);
    evolutionOperators(drive, [], fx.times, { tolerance: 1e-11 }).forEach((u, k) => expectBelow(`U(${fx.times[k]}) vs scipy`, distance(u, fixtureMatrix(fx.operators[k])), tol));
  });

  it('rejects inconsistent drives and times with precise messages', () => {
    const drive = rotatingDrive(1, 1, 1);
    expect(() => floquetOperator({ ...drive, period: 7 }, [])).toThrow(`floquetOperator: segment durations sum to ${2 * Math.PI}, the period is 7`);
    expect(() => evolutionOperators(drive, [], [1, 0.5])).toThrow('evolutionOperators: times must be non-decreasing (times[0] = 1 > times[1] = 0.5)');
    expect(() => evolutionOperators(drive, [], [-1])).toThrow(/evolutionOperators: times\[0\] = -1 is outside the period/);
    expect(() => floquetOperator(drive, [], { tolerance: 0 })).toThrow('floquetOperator: tolerance must be positive, got 0');
  });
});
