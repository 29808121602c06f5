/** compileModel: the Bloch-relevant structure of compiled drives, checked against analytic forms. */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { checkModelSource, loadModels, type LoadedModel } from '../../src/catalogue/load.ts';
import { CompileError, compileModel } from '../../src/catalogue/compile.ts';
import type { LatticeDrive, Modulation } from '../../src/numerics/evolution/drive.ts';
import { seededRandom } from '../support/random.ts';

const { models } = await loadModels(['models']);
const byId = (id: string): LoadedModel => models.find((m) => m.id === id)!;

function fromDocument(change: (doc: any) => void): LoadedModel {
  const doc = JSON.parse(readFileSync('test/fixtures/valid/minimal-chain.json', 'utf8'));
  change(doc);
  const { model, diagnostics } = checkModelSource('minimal-chain.json', JSON.stringify(doc, null, 2));
  if (!model) throw new Error(diagnostics.map((d) => d.message).join('; '));
  return model;
}

/** H(s)_{ba} = Σ t_{a→b,n} e^{−2πi s·n} + h.c., onsite terms once (the convention stated in src/numerics/drive.ts), as 2×2 [re, im] pairs. */
function blochMatrix(drive: LatticeDrive, segment: number, s: number[]): [number, number][][] {
  const n = drive.states.length;
  const h = Array.from({ length: n }, () => Array.from({ length: n }, () => [0, 0] as [number, number]));
  for (const term of drive.segments[segment].terms) {
    const onsite = term.from === term.to && term.offset.every((x) => x === 0);
    const phase = -2 * Math.PI * term.offset.reduce((acc, x, i) => acc + x * s[i], 0);
    const re = term.amplitude.re * Math.cos(phase) - term.amplitude.im * Math.sin(phase);
    const im = term.amplitude.re * Math.sin(phase) + term.amplitude.im * Math.cos(phase);
    h[term.to][term.from][0] += re;
    h[term.to][term.from][1] += im;
    if (!onsite) {
      h[term.from][term.to][0] += re;
      h[term.from][term.to][1] -= im;
    }
  }
  return h;
}

function modulationAt(m: Modulation, t: number, omega: number): number {
  if (m.kind === 'constant') return 1;
  return m.mean + m.components.reduce((acc, c) => acc + c.amplitude * Math.cos(c.harmonic * omega * t + c.phase), 0);
}

describe('compileModel', () => {
  it('reproduces the Qi–Wu–Zhang Bloch Hamiltonian (PRB 74, 085308 (2006)) at seeded random momenta', () => {
    const compiled = compileModel(byId('qwz-sheet'));
    const m = 1;
    const rand = seededRandom(7);
    for (let trial = 0; trial < 20; trial++) {
      const s = [rand(), rand()];
      const [kx, ky] = s.map((x) => 2 * Math.PI * x);
      const dz = m + Math.cos(kx) + Math.cos(ky);
      // sin kx σx + sin ky σy + dz σz in the basis (A, B)
      const expected = [
        [[dz, 0], [Math.sin(kx), -Math.sin(ky)]],
        [[Math.sin(kx), Math.sin(ky)], [-dz, 0]],
      ];
      const actual = blochMatrix(compiled.drive, 0, s);
      for (let i = 0; i < 2; i++) for (let j = 0; j < 2; j++) for (let c = 0; c < 2; c++) {
        // a handful of flops on O(1) numbers: 1e-14 absolute
        expect(Math.abs(actual[i][j][c] - expected[i][j][c])).toBeLessThan(1e-14);
      }
    }
  });

  it('keeps one term per written term (the Hermitian conjugate is implicit) and resolves orbitals to indices', () => {
    const { drive } = compileModel(byId('qwz-sheet'));
    expect(drive.segments).toHaveLength(1);
    expect(drive.segments[0].terms).toHaveLength(2 + 8);
    expect(drive.states.map((s) => s.label)).toEqual(['A', 'B']);
    expect(drive.segments[0].terms.slice(2).map((t) => [t.from, t.to, t.offset])).toEqual([
      [0, 0, [1, 0]], [1, 1, [1, 0]], [0, 0, [0, 1]], [1, 1, [0, 1]], [0, 1, [1, 0]], [0, 1, [-1, 0]], [0, 1, [0, 1]], [0, 1, [0, -1]],
    ]);
    expect(drive.segments[0].terms[6].amplitude).toEqual({ re: 0, im: 0.5 });
    expect(drive.period).toBe(byId('qwz-sheet').parameters.T); // the period is the evaluated parameter T
    expect(drive.latticeVectors).toEqual([[1, 0], [0, 1]]);
  });

  it('re-evaluates dependent parameters under overrides', () => {
    const base = compileModel(byId('checkerboard-five-step'));
    expect(base.drive.segments.map((s) => s.duration)).toEqual([0.2, 0.2, 0.2, 0.2, 0.2]);
    const doubled = compileModel(byId('checkerboard-five-step'), { T: 2 });
    expect(doubled.drive.period).toBe(2);
    expect(doubled.drive.segments.map((s) => s.duration)).toEqual([0.4, 0.4, 0.4, 0.4, 0.4]);
    // J τ = π/2 must survive the change of T: J = π/(2τ) = π/0.8
    expect(Math.abs(doubled.drive.segments[0].terms[0].amplitude.re * 0.4 - Math.PI / 2)).toBeLessThan(1e-15);
  });

  it('rejects overrides that break the model, with the reason', () => {
    expect(() => compileModel(byId('checkerboard-five-step'), { tau: 0.3 })).toThrow(/segment durations sum to 1.5 but the period is 1/);
    expect(() => compileModel(byId('qwz-sheet'), { mass: 1 })).toThrow(CompileError);
    expect(() => compileModel(byId('qwz-sheet'), { mass: 1 })).toThrow(/override of unknown parameter "mass"; parameters are m, T/);
  });

  it('rewrites sin components as cos with phase − π/2 (modulation and vector potential)', () => {
    const model = fromDocument((d) => {
      d.drive.segments[0].hoppings[0].modulation = { kind: 'harmonic', mean: 0.5, components: [{ amplitude: 2, harmonic: 1, function: 'sin', phase: 0.3 }, { amplitude: -1, harmonic: 3, function: 'cos' }] };
      d.drive.segments[1].vectorPotential = [{ amplitude: [0.7], harmonic: 2, function: 'sin' }];
    });
    const { drive } = compileModel(model);
    const omega = 2 * Math.PI / drive.period;
    const f = drive.segments[0].terms[0].modulation;
    for (const t of [0, 0.1, 0.37, 0.49]) {
      const expected = 0.5 + 2 * Math.sin(omega * t + 0.3) - Math.cos(3 * omega * t);
      expect(Math.abs(modulationAt(f, t, omega) - expected)).toBeLessThan(1e-14);
      const a = drive.segments[1].vectorPotential![0];
      expect(Math.abs(a.amplitude[0] * Math.cos(a.harmonic * omega * t + a.phase) - 0.7 * Math.sin(2 * omega * t))).toBeLessThan(1e-14);
    }
    expect(drive.segments[1].terms[0].modulation).toEqual({ kind: 'constant' });
  });

  it('turns polar and Cartesian amplitudes into complex numbers', () => {
    const model = fromDocument((d) => {
      d.drive.segments[0].hoppings[0].amplitude = { magnitude: 2, phase: 'pi/3' };
      d.drive.segments[1].hoppings[0].amplitude = { re: 'J1', im: '-J2' };
    });
    const { drive } = compileModel(model);
    const a = drive.segments[0].terms[0].amplitude;
    expect(Math.abs(a.re - 1)).toBeLessThan(1e-15);
    expect(Math.abs(a.im - Math.sqrt(3))).toBeLessThan(1e-15);
    expect(drive.segments[1].terms[0].amplitude).toEqual({ re: 1, im: -2 });
  });

  it('compiles the chiral operator of the chain', () => {
    const { symmetries, nambu } = compileModel(byId('two-step-chain'));
    expect(nambu).toBe(false);
    expect(Array.from(symmetries.chiral!.re)).toEqual([1, 0, 0, -1]);
    expect(Array.from(symmetries.chiral!.im)).toEqual([0, 0, 0, 0]);
  });

  it('builds the Nambu drive for pairing terms: particle and hole blocks plus pairing terms', () => {
    const model = fromDocument((d) => {
      d.drive.segments[0].pairings = [{ from: 'A', to: 'A', offset: [1], amplitude: 0.5 }];
      d.claims = {};
    });
    const { drive, nambu } = compileModel(model);
    expect(nambu).toBe(true);
    // 2 orbitals → 4 Nambu states: particles first, then holes
    expect(drive.states.map((s) => s.charge)).toEqual([1, 1, -1, -1]);
    // segment 0: one hopping → particle + hole copy, one pairing → two Nambu terms
    expect(drive.segments[0].terms).toHaveLength(4);
    expect(drive.segments[1].terms).toHaveLength(2);
  });
});
