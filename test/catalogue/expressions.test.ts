import { describe, expect, it } from 'vitest';
import { evaluate as mathjsEvaluate } from 'mathjs';
import { ExpressionError, evaluateExpression, parseExpression, referencedNames } from '../../src/catalogue/expressions.ts';

const scope = new Map([
  ['J', 1.5],
  ['T', 2],
  ['tau', 0.4],
]);

/** Relative tolerance for comparisons with hand-computed values: 4 ulp-scale (common practice for a few flops). */
const REL = 1e-15;
const close = (actual: number, expected: number) => expect(Math.abs(actual - expected)).toBeLessThanOrEqual(REL * Math.max(1, Math.abs(expected)));

function errorOf(text: string, names = scope): ExpressionError {
  try {
    evaluateExpression(text, names);
  } catch (error) {
    if (error instanceof ExpressionError) return error;
    throw error;
  }
  throw new Error(`expected "${text}" to fail`);
}

describe('evaluator: hand-computed values', () => {
  it.each([
    ['1 + 2*3', 7],
    ['(1 + 2)*3', 9],
    ['2^3^2', 512], // right-associative: 2^(3^2)
    ['-2^2', -4], // unary minus binds looser than ^, as in written mathematics
    ['2^-1', 0.5],
    ['10/4', 2.5],
    ['1.5e2 - .5', 149.5],
    ['J*T/4', 0.75],
    ['max(1, J, -3)', 1.5],
    ['min(T, tau)', 0.4],
    ['abs(-3)', 3],
    ['atan2(1, 1)*4', Math.PI],
    ['sqrt(2)^2', 2.0000000000000004], // (√2)² in binary floating point, computed by hand from the IEEE value of √2
    ['- - 3', 3],
  ])('%s = %d', (text, expected) => close(evaluateExpression(text, scope), expected));

  it('knows pi and e', () => {
    close(evaluateExpression('pi/2'), Math.PI / 2);
    close(evaluateExpression('log(e)'), 1);
  });
});

describe('evaluator agrees with mathjs (reference library) on arithmetic', () => {
  const cases = ['1 + 2*3 - 4/5', '2^3^2', '-2^2', '(1+2)*(3-4)/5', 'sqrt(3)/2 + cos(pi/3)', 'exp(-0.5)*sin(1.2)', 'atan2(-1, 2) + tan(0.3)', 'max(1, 4, 2) - min(3, -1)'];
  it.each(cases)('%s', (text) => {
    const ours = evaluateExpression(text);
    const reference = mathjsEvaluate(text) as number;
    // Same double-precision operations in a different order: allow 8 ulp relative.
    expect(Math.abs(ours - reference)).toBeLessThanOrEqual(8 * Number.EPSILON * Math.max(1, Math.abs(reference)));
  });
});

describe('evaluator: hostile and malformed input ends in located errors', () => {
  it.each([
    ['constructor', 'unknown parameter "constructor"', 0],
    ['__proto__ + 1', 'unknown parameter "__proto__"', 0],
    ['J + toString', 'unknown parameter "toString"', 4],
    ['constructor(1)', 'unknown function "constructor"', 0],
    ['a.b', 'unexpected "."', 1],
    ['J.constructor', 'unexpected "."', 1],
    ['10^10^10', '10^10000000000 is not a finite real number', 2],
    ['1/0', 'division by zero', 1],
    ['J/(T-2)', 'division by zero', 1],
    ['sqrt(-1)', 'sqrt(-1) is not a finite real number', 0],
    ['log(0)', 'log(0) is not a finite real number', 0],
    ['(-8)^(1/3)', '-8^0.3333333333333333 is not a finite real number', 4],
    ['foo(1)', 'unknown function "foo"', 0],
    ['sin(1, 2)', 'sin() takes 1 argument, got 2', 0],
    ['2pi', 'missing operator before "pi"', 1],
    ['2 ** 3', '"**" is not an operator here', 2],
    ['(1 + 2', 'missing ")"', 6],
    ['1 + 2)', 'unmatched ")"', 5],
    ['1 +', 'expression ends too early', 3],
    ['', 'empty expression', 0],
    ['J; process.exit()', 'unexpected character ";"', 1],
    ['`x`', 'unexpected character "`"', 0],
    ['1e999', 'number 1e999 is out of range', 0],
  ])('%s → %s (at %d)', (text, message, position) => {
    const error = errorOf(text);
    expect(error.message).toBe(message);
    expect(error.position).toBe(position);
  });

  it('refuses 10⁴ nested parentheses by length before parsing', () => {
    const deep = '('.repeat(10_000) + '1' + ')'.repeat(10_000);
    const error = errorOf(deep);
    expect(error.message).toBe('expression longer than 500 characters');
  });

  it('refuses deep nesting that fits the length limit without exhausting the stack', () => {
    const deep = '('.repeat(100) + '1' + ')'.repeat(100);
    const error = errorOf(deep);
    expect(error.message).toBe('expression nested deeper than 64 levels');
    expect(error.position).toBe(64);
    // Nesting of 60 levels is fine and evaluates to the inner value.
    expect(evaluateExpression('('.repeat(60) + '7' + ')'.repeat(60))).toBe(7);
    expect(errorOf('-'.repeat(100) + '1').message).toBe('expression nested deeper than 64 levels');
  });

  it('lists referenced parameters without constants or functions', () => {
    expect(referencedNames(parseExpression('2*pi*J/sqrt(T) + e + J')).map((r) => r.name)).toEqual(['J', 'T', 'J']);
  });
});
