import { describe, expect, it } from 'vitest';
import {
  adjoint, distance, firstNonFinite, fromArrays, hermiticityDefect, identity, isUnitary, maxAbs, multiply,
  multiplyAdjointLeft, multiplyAdjointRight, unitarityDefect,
} from '../../../src/numerics/linalg/complex-matrix.ts';
import { randomComplexMatrix, randomHermitian, randomUnitary, seededRandom } from '../../support/random.ts';
import { expectBelow, expectWithin, fromMathjs, math, toMathjs } from './comparisons.ts';

describe('complex-matrix products and defects', () => {
  it('A†B and AB† match mathjs ctranspose/multiply (reference: mathjs)', () => {
    const random = seededRandom(81);
    const a = randomComplexMatrix(random, 4, 3), b = randomComplexMatrix(random, 4, 5), c = randomComplexMatrix(random, 6, 3);
    const refLeft = fromMathjs(math.multiply(math.ctranspose(toMathjs(a)), toMathjs(b)) as never);
    const refRight = fromMathjs(math.multiply(toMathjs(a), math.ctranspose(toMathjs(c))) as never);
    expectBelow('‖A†B − mathjs‖_F', distance(multiplyAdjointLeft(a, b), refLeft), 1e-14 * 4);
    expectBelow('‖AC† − mathjs‖_F', distance(multiplyAdjointRight(a, c), refRight), 1e-14 * 4);
    expectBelow('A†B = adjoint(A)·B', distance(multiplyAdjointLeft(a, b), multiply(adjoint(a), b)), 1e-15 * 4);
    expect(() => multiplyAdjointLeft(a, c)).toThrow('multiplyAdjointLeft: (4×3)† times 6×3');
    expect(() => multiplyAdjointRight(a, b)).toThrow('multiplyAdjointRight: 4×3 times (4×5)†');
  });

  it('measures unitarity and hermiticity defects by their definitions', () => {
    const random = seededRandom(82);
    expectBelow('Haar unitary defect', unitarityDefect(randomUnitary(random, 8)), 1e-14 * 8);
    expect(isUnitary(randomUnitary(random, 5))).toBe(true);
    // 2·1 (n = 3): U†U − 1 = 3·1, ‖·‖_F = 3√3.
    expectWithin('defect of 2·1', unitarityDefect(fromArrays([[2, 0, 0], [0, 2, 0], [0, 0, 2]])), 3 * Math.sqrt(3), 1e-15);
    expect(hermiticityDefect(randomHermitian(random, 6))).toBe(0);
    // [[0, 1], [0, 0]]: A − A† = [[0, 1], [−1, 0]], ‖·‖_F = √2.
    expectWithin('defect of a nilpotent', hermiticityDefect(fromArrays([[0, 1], [0, 0]])), Math.SQRT2, 1e-15);
    expect(unitarityDefect(randomComplexMatrix(random, 2, 3))).toBe(Infinity);
  });

  it('locates non-finite entries and the largest modulus', () => {
    const m = identity(3);
    expect(firstNonFinite(m)).toBeUndefined();
    m.im[7] = Number.NaN;
    expect(firstNonFinite(m)).toEqual([2, 1]);
    expect(maxAbs(fromArrays([[1, [3, -4]], [0, -2]]))).toBe(5);
  });
});
