// Row-stored complex vectors against mathjs (independent complex arithmetic from the registry).
import { describe, expect, it } from 'vitest';
import { complex, conj, add, multiply, subtract, abs, sqrt, type Complex } from 'mathjs';
import { innerProductInto, projectOut, rowNorm } from '../../../src/numerics/linalg/complex-rows.ts';

const q: Complex[] = [complex(0.6, 0), complex(0, 0.8)];
const x: Complex[] = [complex(1, 2), complex(-3, 0.5)];
// Rows stored at offset 1 (a leading slot of padding) to check the offsets.
const split = (v: Complex[]) => ({ re: Float64Array.from([9, ...v.map((z) => z.re)]), im: Float64Array.from([9, ...v.map((z) => z.im)]) });

describe('complex rows', () => {
  it('inner product q†x and norm as mathjs computes them', () => {
    const a = split(q), b = split(x);
    const out = new Float64Array(2);
    innerProductInto(out, a.re, a.im, 1, b.re, b.im, 1, 2);
    const expected = add(multiply(conj(q[0]), x[0]), multiply(conj(q[1]), x[1])) as Complex;
    expect(out[0]).toBeCloseTo(expected.re, 14);
    expect(out[1]).toBeCloseTo(expected.im, 14);
    const normX = sqrt((abs(x[0]) as unknown as number) ** 2 + (abs(x[1]) as unknown as number) ** 2) as unknown as number;
    expect(rowNorm(b.re, b.im, 1, 2)).toBeCloseTo(normX, 14);
  });

  it('removes the component along a unit vector: x − q(q†x), orthogonal to q afterwards', () => {
    const a = split(q), b = split(x);
    projectOut(a.re, a.im, 1, b.re, b.im, 1, 2);
    const c = add(multiply(conj(q[0]), x[0]), multiply(conj(q[1]), x[1])) as Complex;
    for (let r = 0; r < 2; r++) {
      const expected = subtract(x[r], multiply(q[r], c)) as Complex;
      expect(b.re[1 + r]).toBeCloseTo(expected.re, 14);
      expect(b.im[1 + r]).toBeCloseTo(expected.im, 14);
    }
    const out = new Float64Array(2);
    innerProductInto(out, a.re, a.im, 1, b.re, b.im, 1, 2);
    expect(Math.hypot(out[0], out[1])).toBeLessThan(1e-14);
    expect([b.re[0], b.im[0]]).toEqual([9, 9]);
  });
});
