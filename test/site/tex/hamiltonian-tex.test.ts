// Hamiltonians typeset from the terms of a model file. Expected pieces follow from
// the format's definition of a term (docs/model-format.md: a hopping a → b with
// offset n is t·c†_{b,R+n} c_{a,R} + h.c.; on-site ε n_{a,R}; a kick applies
// e^{−iK}); every formula must also typeset in KaTeX without an error.
import { describe, expect, it } from 'vitest';
import katex from 'katex';
import type { ModelDocument } from '../../../src/catalogue/model-types.generated.ts';
import { hamiltonianFormulas, timeTex } from '../../../src/site/tex/hamiltonian-tex.ts';
import { quantityTex } from '../../../src/site/tex/expression-tex.ts';
import { matrixTex } from '../../../src/site/tex/operators-tex.ts';
import { parameterSymbol, parameterTex } from '../../../src/site/symbols.ts';
import { evaluateQuantity } from '../../../src/catalogue/parameters.ts';

const scope = new Map(Object.entries({ T: 1, tau: 0.2, J: 1, Delta: 0.5, A0: 0.3, t2: 0.1, phi: 1 }));
const value = (q: number | string) => evaluateQuantity(q, scope, '') as number;

function doc(segments: ModelDocument['drive']['segments'], dimension: 1 | 2 = 2): ModelDocument {
  return {
    formatVersion: 1, id: 'x', title: 'x', summary: 'x', maintainers: ['x'], dates: { created: '2024-01-01' }, claims: {},
    lattice: dimension === 2 ? { dimension, vectors: [[1, 0], [0, 1]], orbitals: [{ name: 'A', position: [0, 0] }, { name: 'B', position: [0.5, 0.5] }] } : { dimension, vectors: [[1]], orbitals: [{ name: 'A', position: [0] }, { name: 'B', position: [0.5] }] },
    drive: { period: 'T', segments },
  } as ModelDocument;
}

const typesets = (tex: string) => !katex.renderToString(tex, { throwOnError: false, displayMode: true }).includes('katex-error');

describe('segment Hamiltonians', () => {
  it('writes a hopping with its cell offset and Hermitian conjugate, and the time window as a fraction of T', () => {
    const h = hamiltonianFormulas(doc([
      { duration: 'tau', hoppings: [{ from: 'A', to: 'B', offset: [-1, 0], amplitude: 'J' }] },
      { duration: '4*tau', onsite: [{ orbital: 'A', energy: 'Delta' }, { orbital: 'B', energy: '-Delta' }] },
    ]), value);
    expect(h.segments[0].tex).toBe('H_{1}(t) = \\sum_{\\mathbf R} J\\left(c^\\dagger_{B,\\mathbf R-\\mathbf a_1} c_{A,\\mathbf R} + \\mathrm{h.c.}\\right)');
    expect(h.segments[0].window).toBe('0 \\le t < T/5');
    expect(h.segments[1].window).toBe('T/5 \\le t < T');
    // The minus sign of −Δ is taken out of the coefficient: Δ n_A − Δ n_B.
    expect(h.segments[1].tex).toContain('\\Delta\\, n_{A,\\mathbf R} - \\Delta\\, n_{B,\\mathbf R}');
    for (const s of h.segments) expect(typesets(s.tex)).toBe(true);
  });

  it('writes modulations, complex amplitudes, Peierls phases and pairings', () => {
    const h = hamiltonianFormulas(doc([
      {
        duration: 'T',
        hoppings: [
          { from: 'A', to: 'A', offset: [1, 0], amplitude: { magnitude: 't2', phase: 'phi' } },
          { from: 'A', to: 'B', offset: [0, 0], amplitude: 'J', modulation: { kind: 'harmonic', mean: 1, components: [{ amplitude: 0.5, harmonic: 1, function: 'cos' }] } },
        ],
        pairings: [{ from: 'A', to: 'B', offset: [0, 1], amplitude: 'Delta' }],
        vectorPotential: [{ amplitude: ['A0', 0], harmonic: 1, function: 'cos' }, { amplitude: [0, 'A0'], harmonic: 1, function: 'sin' }],
      },
    ]), value);
    const tex = h.segments[0].tex;
    expect(tex).toContain('t_{2}\\, e^{i\\phi}');
    expect(tex).toContain('\\left[1 + 0.5\\cos\\left(\\omega t\\right)\\right]');
    expect(tex).toContain('e^{i\\mathbf A(t)\\cdot\\mathbf d_{AB}}');
    expect(tex).toContain('c^\\dagger_{B,\\mathbf R+\\mathbf a_2} c^\\dagger_{A,\\mathbf R}');
    expect(h.segments[0].potential).toBe('\\mathbf A(t) = \\left(A_{0}\\cos\\left(\\omega t\\right),\\; A_{0}\\sin\\left(\\omega t\\right)\\right)');
    expect(h.definitions).toContain('\\omega = 2\\pi/T');
    expect(typesets(tex)).toBe(true);
  });

  it('writes a kick as its generator and the time it acts, and chains with cell index j', () => {
    const h = hamiltonianFormulas(doc([
      { duration: 'T/2', hoppings: [{ from: 'B', to: 'A', offset: [1], amplitude: 'J' }] },
      { duration: 0, onsite: [{ orbital: 'A', energy: 1 }] },
      { duration: 'T/2' },
    ], 1), value);
    expect(h.segments[0].tex).toContain('c^\\dagger_{A,j+1} c_{B,j}');
    expect(h.segments[1].kick).toBe(true);
    expect(h.segments[1].window).toBe('U_{2} = e^{-iK_{2}} \\text{ at } t = T/2');
    expect(h.segments[2].tex).toBe('H_{3}(t) = 0');
  });

  it('summarises segments with more terms than a page should carry', () => {
    const hoppings = Array.from({ length: 40 }, (_, i) => ({ from: 'A', to: 'B', offset: [i, 0], amplitude: 1 }));
    const h = hamiltonianFormulas(doc([{ duration: 'T', hoppings }]), value);
    expect(h.segments[0].omitted).toBe(16);
    expect(h.segments[0].tex).toContain('16 more terms');
    expect(typesets(h.segments[0].tex)).toBe(true);
  });
});

describe('expressions, symbols and matrices as TeX', () => {
  it('writes expressions as a physicist would', () => {
    expect(quantityTex('pi/(2*tau)')).toBe('\\frac{\\pi}{2 \\tau}');
    expect(quantityTex('2*theta1/T')).toBe('\\frac{2 \\theta_{1}}{T}');
    expect(quantityTex('sqrt(3)/2')).toBe('\\frac{\\sqrt{3}}{2}');
    expect(quantityTex('a-(b-c)')).toBe('a - \\left(b - c\\right)');
    expect(quantityTex('2*3')).toBe('2 \\cdot 3');
    expect(quantityTex(0.0001)).toBe('1 \\times 10^{-4}');
  });

  it('names parameters with Greek letters and subscripts', () => {
    expect(parameterSymbol('theta1')).toBe('θ₁');
    expect(parameterSymbol('Delta')).toBe('Δ');
    expect(parameterSymbol('J_x')).toBe('J_x');
    expect(parameterTex('theta1')).toBe('\\theta_{1}');
    expect(parameterTex('mass')).toBe('\\mathrm{mass}');
    expect(parameterTex('my_name_x')).toBe('\\mathrm{my}_{\\mathrm{name\\_x}}');
  });

  it('typesets operator matrices, complex entries included, and describes big ones', () => {
    expect(matrixTex([[1, 0], [0, -1]])).toBe('\\begin{pmatrix} 1 & 0 \\\\ 0 & -1 \\end{pmatrix}');
    expect(matrixTex([[0, [0, -1]], [[0, 1], 0]])).toBe('\\begin{pmatrix} 0 & -i \\\\ i & 0 \\end{pmatrix}');
    expect(matrixTex(Array.from({ length: 9 }, () => Array(9).fill(0)))).toContain('9 \\times 9 matrix');
  });

  it('writes times as simple fractions of the period', () => {
    expect(timeTex(0.25, 1)).toBe('T/4');
    expect(timeTex(0.6, 1)).toBe('3T/5');
    expect(timeTex(2, 2)).toBe('T');
    expect(timeTex(0.123, 1)).toBe('0.123');
  });
});
