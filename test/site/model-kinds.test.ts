// Lattices named from their geometry, drives from their segments. The geometric
// facts are common practice: honeycomb = hexagonal Bravais lattice with two sites
// a/√3 apart; kagome = three sites at the edge midpoints (a/2 apart); Lieb = a
// square with sites at the corner and two edge midpoints; checkerboard = two sites
// a/√2 apart on a square lattice.
import { describe, expect, it } from 'vitest';
import type { ModelDocument } from '../../src/catalogue/model-types.generated.ts';
import { driveKinds, latticeKind } from '../../src/site/model-kinds.ts';
import type { ModelSource } from '../../src/site/model-source.ts';
import { evaluateQuantity } from '../../src/catalogue/parameters.ts';

function source(lattice: ModelDocument['lattice'], segments: ModelDocument['drive']['segments'] = [{ duration: 'T' }]): ModelSource {
  const scope = new Map([['T', 1]]);
  const document = { lattice, drive: { period: 'T', segments } } as ModelDocument;
  return { text: '', document, scope, value: (q) => (q === undefined ? Number.NaN : (evaluateQuantity(q, scope, '') as number)) };
}

const hexagonal = { a1: [1, 0], a2: ['1/2', 'sqrt(3)/2'] };

describe('lattice kinds', () => {
  it('recognises honeycomb, kagome and triangular lattices on a hexagonal Bravais lattice', () => {
    const v = [hexagonal.a1, hexagonal.a2];
    expect(latticeKind(source({ dimension: 2, vectors: v, orbitals: [{ name: 'A', position: [0, 0] }, { name: 'B', position: ['1/2', 'sqrt(3)/6'] }] }))).toBe('honeycomb');
    expect(latticeKind(source({ dimension: 2, vectors: v, orbitals: [{ name: 'A', position: [0, 0] }, { name: 'B', position: ['1/2', 0] }, { name: 'C', position: ['1/4', 'sqrt(3)/4'] }] }))).toBe('kagome');
    expect(latticeKind(source({ dimension: 2, vectors: v, orbitals: [{ name: 'A', position: [0, 0] }] }))).toBe('triangular');
  });

  it('recognises square, checkerboard and Lieb lattices, whatever the basis', () => {
    expect(latticeKind(source({ dimension: 2, vectors: [[1, 0], [0, 1]], orbitals: [{ name: 'a', position: [0, 0] }, { name: 'b', position: [0, 0] }] }))).toBe('square');
    expect(latticeKind(source({ dimension: 2, vectors: [[1, 0], [0, 1]], orbitals: [{ name: 'A', position: [0, 0] }, { name: 'B', position: [0.5, 0.5] }] }))).toBe('checkerboard');
    expect(latticeKind(source({ dimension: 2, vectors: [[1, 1], [-1, 1]], orbitals: [{ name: 'A', position: [0, 0] }, { name: 'B', position: [1, 0] }] }))).toBe('checkerboard');
    expect(latticeKind(source({ dimension: 2, vectors: [[1, 0], [0, 1]], orbitals: [{ name: 'A', position: [0, 0] }, { name: 'B', position: [0.5, 0] }, { name: 'C', position: [0, 0.5] }] }))).toBe('Lieb');
  });

  it('calls a one-dimensional lattice a chain and other lattices by their Bravais type', () => {
    expect(latticeKind(source({ dimension: 1, vectors: [[1]], orbitals: [{ name: 'A', position: [0] }] }))).toBe('chain');
    expect(latticeKind(source({ dimension: 2, vectors: [[2, 0], [0, 1]], orbitals: [{ name: 'A', position: [0, 0] }] }))).toBe('rectangular');
  });
});

describe('drive kinds', () => {
  const chain: ModelDocument['lattice'] = { dimension: 1, vectors: [[1]], orbitals: [{ name: 'A', position: [0] }] };
  it('tells static, step, kicked, modulated and light-driven models apart', () => {
    expect(driveKinds(source(chain, [{ duration: 'T', onsite: [{ orbital: 'A', energy: 1 }] }]))).toEqual(['static']);
    expect(driveKinds(source(chain, [{ duration: 'T/2' }, { duration: 'T/2' }]))).toEqual(['step drive']);
    expect(driveKinds(source(chain, [{ duration: 'T' }, { duration: 0 }]))).toEqual(['kicked']);
    expect(driveKinds(source(chain, [{ duration: 'T', onsite: [{ orbital: 'A', energy: 1, modulation: { kind: 'harmonic', components: [{ amplitude: 1, harmonic: 1, function: 'cos' }] } }] }]))).toEqual(['harmonic modulation']);
    expect(driveKinds(source(chain, [{ duration: 'T', vectorPotential: [{ amplitude: [1], harmonic: 1, function: 'cos' }] }]))).toEqual(['light field']);
  });
});
