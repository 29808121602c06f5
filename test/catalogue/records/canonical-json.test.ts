import { describe, expect, it } from 'vitest';
import { canonicalJson, canonicalNumber } from '../../../src/catalogue/records/canonical-json.ts';
import { seededRandom } from '../../support/random.ts';

describe('canonical JSON', () => {
  it('writes keys in code-point order at every depth, whatever the insertion order', () => {
    const a = { b: 1, a: { z: [1, { y: 2, x: 3 }], é: 1, E: 2 } };
    const b = { a: { E: 2, é: 1, z: [1, { x: 3, y: 2 }] }, b: 1 };
    const text = canonicalJson(a);
    expect(canonicalJson(b)).toBe(text);
    // Code-point order: "E" (U+0045) < "z" (U+007A) < "é" (U+00E9); JSON spec (RFC 8259) allows any order, we fix this one.
    expect(text.indexOf('"E"')).toBeLessThan(text.indexOf('"z"'));
    expect(text.indexOf('"z"')).toBeLessThan(text.indexOf('"é"'));
    expect(text.endsWith('}\n')).toBe(true);
  });

  it('writes −0 as 0 and non-finite numbers as null', () => {
    expect(canonicalJson({ a: -0, b: NaN, c: -Infinity, d: [Infinity] }, 0)).toBe('{"a":0,"b":null,"c":null,"d":[null]}');
    expect(Object.is(canonicalNumber(-1e-300 * 1e-300), 0)).toBe(true);
  });

  it('keeps 12 significant digits: parsing back agrees to a relative 5e-12 (half a unit in the 12th digit)', () => {
    const rng = seededRandom(20261201);
    for (let i = 0; i < 2000; i++) {
      const x = (rng() - 0.5) * 10 ** Math.floor(rng() * 40 - 20);
      const back = JSON.parse(canonicalJson(x, 0)) as number;
      const tol = 5e-12 * Math.abs(x);
      if (Math.abs(back - x) > tol) throw new Error(`x=${x} back=${back} delta=${Math.abs(back - x)} tol=${tol}`);
      // Idempotent: a written value writes back to the same text.
      expect(canonicalJson(back, 0)).toBe(canonicalJson(x, 0));
    }
  });

  it('hides last-bit differences of summation order', () => {
    // 0.1 + 0.2 + 0.3 and 0.3 + 0.2 + 0.1 differ in the last bit in IEEE 754 double arithmetic.
    const forward = 0.1 + 0.2 + 0.3;
    const backward = 0.3 + 0.2 + 0.1;
    expect(forward).not.toBe(backward);
    expect(canonicalJson(forward)).toBe(canonicalJson(backward));
  });

  it('drops undefined properties, keeps integers exact, converts typed arrays, refuses maps', () => {
    expect(canonicalJson({ a: undefined, b: 123456789012345, c: new Float64Array([0.5, -0]) }, 0)).toBe('{"b":123456789012345,"c":[0.5,0]}');
    expect(() => canonicalJson({ m: new Map() })).toThrow(/Map at \$\.m/);
  });
});
