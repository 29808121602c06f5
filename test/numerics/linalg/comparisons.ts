/**
 * Shared pieces of the linear-algebra tests: conversion to mathjs (the reference
 * library for complex eigenvalues, expm, det and lusolve), the numpy/scipy
 * fixture file, and a comparison that reports actual, expected, delta and the
 * tolerance when it fails.
 */
import { readFileSync } from 'node:fs';
import { create, all } from 'mathjs';
import type { Matrix, Complex as MathComplex } from 'mathjs';
import { expect } from 'vitest';
import type { ComplexMatrix } from '../../../src/numerics/linalg/complex-matrix.ts';
import { distance, identity, multiply, multiplyAdjointLeft, zeros } from '../../../src/numerics/linalg/complex-matrix.ts';
import type { UnitaryEigen } from '../../../src/numerics/linalg/unitary-eigen.ts';

export const math = create(all);

export function toMathjs(a: ComplexMatrix): Matrix {
  const rows: MathComplex[][] = [];
  for (let i = 0; i < a.rows; i++) {
    const row: MathComplex[] = [];
    for (let j = 0; j < a.cols; j++) row.push(math.complex(a.re[i * a.cols + j], a.im[i * a.cols + j]));
    rows.push(row);
  }
  return math.matrix(rows);
}

export function fromMathjs(m: Matrix): ComplexMatrix {
  const [r, c] = m.size();
  const out = zeros(r, c);
  for (let i = 0; i < r; i++) {
    for (let j = 0; j < c; j++) {
      const v = m.get([i, j]) as MathComplex | number;
      if (typeof v === 'number') out.re[i * c + j] = v;
      else {
        out.re[i * c + j] = v.re;
        out.im[i * c + j] = v.im;
      }
    }
  }
  return out;
}

/** Fails with input label, actual, expected, delta and tolerance when |actual − expected| > tolerance. */
export function expectWithin(label: string, actual: number, expected: number, tolerance: number): void {
  const delta = Math.abs(actual - expected);
  if (!(delta <= tolerance)) {
    expect.fail(`${label}: actual ${actual}, expected ${expected}, delta ${delta.toExponential(3)} > tolerance ${tolerance.toExponential(3)}`);
  }
}

/** Fails when value > bound, reporting both. */
export function expectBelow(label: string, value: number, bound: number): void {
  if (!(value <= bound)) expect.fail(`${label}: ${value.toExponential(3)} exceeds tolerance ${bound.toExponential(3)}`);
}

export interface FixtureMatrix {
  rows: number;
  cols: number;
  re: number[];
  im: number[];
}

export function fixtureMatrix(m: FixtureMatrix): ComplexMatrix {
  return { rows: m.rows, cols: m.cols, re: Float64Array.from(m.re), im: Float64Array.from(m.im) };
}

export interface LinalgFixtures {
  numpy: string;
  scipy: string;
  hermitian: { name: string; matrix: FixtureMatrix; eigenvalues: number[] }[];
  exponential: { name: string; matrix: FixtureMatrix; t: number; expMinusIHt: FixtureMatrix }[];
  unitary: { name: string; matrix: FixtureMatrix; phases: number[] }[];
  lu: { name: string; matrix: FixtureMatrix; rhs: FixtureMatrix; solution: FixtureMatrix; determinant: [number, number] }[];
}

/** test/fixtures/reference/linalg.json, written by scripts/reference-fixtures/linalg.py (numpy/scipy). */
export function linalgFixtures(): LinalgFixtures {
  const url = new URL('../../fixtures/reference/linalg.json', import.meta.url);
  return JSON.parse(readFileSync(url, 'utf8')) as LinalgFixtures;
}

export const EPS = 2 ** -52;

/** Independent recomputation of ‖UV − VΛ‖_F and ‖V†V − 1‖_F for a unitary eigendecomposition. */
export function defects(u: ComplexMatrix, e: UnitaryEigen): { residual: number; orthogonality: number } {
  const n = u.rows, v = e.vectors;
  const vl = zeros(n, n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      const c = Math.cos(e.phases[j]), s = Math.sin(e.phases[j]);
      vl.re[i * n + j] = v.re[i * n + j] * c - v.im[i * n + j] * s;
      vl.im[i * n + j] = v.re[i * n + j] * s + v.im[i * n + j] * c;
    }
  }
  return { residual: distance(multiply(u, v), vl), orthogonality: distance(multiplyAdjointLeft(v, v), identity(n)) };
}
