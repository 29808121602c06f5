/**
 * Dense complex matrices: the one representation used by every numerical routine.
 *
 * A matrix of size rows × cols is stored row-major in two Float64Arrays of the
 * same length, `re` and `im` (split storage): element (i, j) is
 * `re[i * cols + j] + i·im[i * cols + j]`. Split storage keeps the inner loops of
 * products and rotations free of stride arithmetic and lets real-only kernels
 * skip the imaginary part. A complex vector is a matrix with one column.
 *
 * Functions here never mutate their inputs unless their name says so (`…InPlace`).
 */
export interface ComplexMatrix {
  readonly rows: number;
  readonly cols: number;
  readonly re: Float64Array;
  readonly im: Float64Array;
}

/** A complex scalar. */
export interface Complex {
  re: number;
  im: number;
}

export function zeros(rows: number, cols: number = rows): ComplexMatrix {
  return { rows, cols, re: new Float64Array(rows * cols), im: new Float64Array(rows * cols) };
}

export function identity(n: number): ComplexMatrix {
  const m = zeros(n, n);
  for (let i = 0; i < n; i++) m.re[i * n + i] = 1;
  return m;
}

export function clone(a: ComplexMatrix): ComplexMatrix {
  return { rows: a.rows, cols: a.cols, re: a.re.slice(), im: a.im.slice() };
}

/** Builds a matrix from nested arrays of [re, im] pairs or real numbers (tests and small examples). */
export function fromArrays(rows: ReadonlyArray<ReadonlyArray<number | readonly [number, number]>>): ComplexMatrix {
  const r = rows.length;
  const c = r === 0 ? 0 : rows[0].length;
  const m = zeros(r, c);
  for (let i = 0; i < r; i++) {
    if (rows[i].length !== c) throw new RangeError(`fromArrays: row ${i} has ${rows[i].length} entries, expected ${c}`);
    for (let j = 0; j < c; j++) {
      const v = rows[i][j];
      if (typeof v === 'number') m.re[i * c + j] = v;
      else {
        m.re[i * c + j] = v[0];
        m.im[i * c + j] = v[1];
      }
    }
  }
  return m;
}

export function get(a: ComplexMatrix, i: number, j: number): Complex {
  const p = i * a.cols + j;
  return { re: a.re[p], im: a.im[p] };
}

export function set(a: ComplexMatrix, i: number, j: number, re: number, im: number): void {
  const p = i * a.cols + j;
  a.re[p] = re;
  a.im[p] = im;
}

/** C = A·B. */
export function multiply(a: ComplexMatrix, b: ComplexMatrix, out?: ComplexMatrix): ComplexMatrix {
  if (a.cols !== b.rows) throw new RangeError(`multiply: ${a.rows}×${a.cols} times ${b.rows}×${b.cols}`);
  const n = a.rows, m = a.cols, p = b.cols;
  const c = out ?? zeros(n, p);
  if (c === a || c === b) throw new RangeError('multiply: output must not alias an input');
  c.re.fill(0);
  c.im.fill(0);
  const ar = a.re, ai = a.im, br = b.re, bi = b.im, cr = c.re, ci = c.im;
  for (let i = 0; i < n; i++) {
    const ci0 = i * p;
    for (let k = 0; k < m; k++) {
      const xr = ar[i * m + k], xi = ai[i * m + k];
      if (xr === 0 && xi === 0) continue;
      const bk = k * p;
      for (let j = 0; j < p; j++) {
        const yr = br[bk + j], yi = bi[bk + j];
        cr[ci0 + j] += xr * yr - xi * yi;
        ci[ci0 + j] += xr * yi + xi * yr;
      }
    }
  }
  return c;
}

/** Conjugate transpose A†. */
export function adjoint(a: ComplexMatrix): ComplexMatrix {
  const t = zeros(a.cols, a.rows);
  for (let i = 0; i < a.rows; i++) {
    for (let j = 0; j < a.cols; j++) {
      t.re[j * a.rows + i] = a.re[i * a.cols + j];
      t.im[j * a.rows + i] = -a.im[i * a.cols + j];
    }
  }
  return t;
}

/** αA + βB (α, β real). */
export function linearCombination(alpha: number, a: ComplexMatrix, beta: number, b: ComplexMatrix): ComplexMatrix {
  if (a.rows !== b.rows || a.cols !== b.cols) throw new RangeError('linearCombination: shapes differ');
  const c = zeros(a.rows, a.cols);
  for (let p = 0; p < a.re.length; p++) {
    c.re[p] = alpha * a.re[p] + beta * b.re[p];
    c.im[p] = alpha * a.im[p] + beta * b.im[p];
  }
  return c;
}

/** zA for a complex scalar z. */
export function scale(a: ComplexMatrix, zr: number, zi = 0): ComplexMatrix {
  const c = zeros(a.rows, a.cols);
  for (let p = 0; p < a.re.length; p++) {
    c.re[p] = zr * a.re[p] - zi * a.im[p];
    c.im[p] = zr * a.im[p] + zi * a.re[p];
  }
  return c;
}

/** Frobenius norm. */
export function frobeniusNorm(a: ComplexMatrix): number {
  let s = 0;
  for (let p = 0; p < a.re.length; p++) s += a.re[p] * a.re[p] + a.im[p] * a.im[p];
  return Math.sqrt(s);
}

/** Frobenius norm of A − B. */
export function distance(a: ComplexMatrix, b: ComplexMatrix): number {
  if (a.rows !== b.rows || a.cols !== b.cols) throw new RangeError('distance: shapes differ');
  let s = 0;
  for (let p = 0; p < a.re.length; p++) {
    const dr = a.re[p] - b.re[p], di = a.im[p] - b.im[p];
    s += dr * dr + di * di;
  }
  return Math.sqrt(s);
}

/** Trace. */
export function trace(a: ComplexMatrix): Complex {
  let re = 0, im = 0;
  const n = Math.min(a.rows, a.cols);
  for (let i = 0; i < n; i++) {
    re += a.re[i * a.cols + i];
    im += a.im[i * a.cols + i];
  }
  return { re, im };
}

/** C = A†B without forming A†. */
export function multiplyAdjointLeft(a: ComplexMatrix, b: ComplexMatrix, out?: ComplexMatrix): ComplexMatrix {
  if (a.rows !== b.rows) throw new RangeError(`multiplyAdjointLeft: (${a.rows}×${a.cols})† times ${b.rows}×${b.cols}`);
  const n = a.cols, m = a.rows, p = b.cols;
  const c = out ?? zeros(n, p);
  if (c === a || c === b) throw new RangeError('multiplyAdjointLeft: output must not alias an input');
  c.re.fill(0);
  c.im.fill(0);
  const ar = a.re, ai = a.im, br = b.re, bi = b.im, cr = c.re, ci = c.im;
  for (let k = 0; k < m; k++) {
    const bk = k * p;
    for (let i = 0; i < n; i++) {
      // conj(A_ki)
      const xr = ar[k * n + i], xi = -ai[k * n + i];
      if (xr === 0 && xi === 0) continue;
      const ci0 = i * p;
      for (let j = 0; j < p; j++) {
        const yr = br[bk + j], yi = bi[bk + j];
        cr[ci0 + j] += xr * yr - xi * yi;
        ci[ci0 + j] += xr * yi + xi * yr;
      }
    }
  }
  return c;
}

/** C = A·B† without forming B†. */
export function multiplyAdjointRight(a: ComplexMatrix, b: ComplexMatrix, out?: ComplexMatrix): ComplexMatrix {
  if (a.cols !== b.cols) throw new RangeError(`multiplyAdjointRight: ${a.rows}×${a.cols} times (${b.rows}×${b.cols})†`);
  const n = a.rows, m = a.cols, p = b.rows;
  const c = out ?? zeros(n, p);
  if (c === a || c === b) throw new RangeError('multiplyAdjointRight: output must not alias an input');
  const ar = a.re, ai = a.im, br = b.re, bi = b.im, cr = c.re, ci = c.im;
  for (let i = 0; i < n; i++) {
    const ai0 = i * m;
    for (let j = 0; j < p; j++) {
      const bj0 = j * m;
      let sr = 0, si = 0;
      for (let k = 0; k < m; k++) {
        // A_ik · conj(B_jk)
        const xr = ar[ai0 + k], xi = ai[ai0 + k], yr = br[bj0 + k], yi = -bi[bj0 + k];
        sr += xr * yr - xi * yi;
        si += xr * yi + xi * yr;
      }
      cr[i * p + j] = sr;
      ci[i * p + j] = si;
    }
  }
  return c;
}

/** ‖U†U − 1‖_F: zero for an exactly unitary matrix. */
export function unitarityDefect(u: ComplexMatrix): number {
  if (u.rows !== u.cols) return Infinity;
  const g = multiplyAdjointLeft(u, u);
  const n = u.rows;
  for (let i = 0; i < n; i++) g.re[i * n + i] -= 1;
  return frobeniusNorm(g);
}

/** True when ‖U†U − 1‖_F ≤ tolerance. */
export function isUnitary(u: ComplexMatrix, tolerance = 1e-10 * Math.max(1, u.rows)): boolean {
  return unitarityDefect(u) <= tolerance;
}

/** ‖A − A†‖_F: zero for an exactly Hermitian matrix. */
export function hermiticityDefect(a: ComplexMatrix): number {
  if (a.rows !== a.cols) return Infinity;
  const n = a.rows;
  let s = 0;
  for (let i = 0; i < n; i++) {
    for (let j = 0; j <= i; j++) {
      const p = i * n + j, q = j * n + i;
      const dr = a.re[p] - a.re[q], di = a.im[p] + a.im[q];
      s += (i === j ? 1 : 2) * (dr * dr + di * di);
    }
  }
  return Math.sqrt(s);
}

/** Position (row, column) of the first non-finite entry, or undefined when all entries are finite. */
export function firstNonFinite(a: ComplexMatrix): [number, number] | undefined {
  for (let p = 0; p < a.re.length; p++) {
    if (!Number.isFinite(a.re[p]) || !Number.isFinite(a.im[p])) return [Math.floor(p / a.cols), p % a.cols];
  }
  return undefined;
}

/** Largest modulus of the entries (the max norm). */
export function maxAbs(a: ComplexMatrix): number {
  // Largest squared modulus first (no square root per entry); moduli directly when squares under- or overflow.
  let m2 = 0;
  for (let p = 0; p < a.re.length; p++) {
    const v2 = a.re[p] * a.re[p] + a.im[p] * a.im[p];
    if (v2 > m2) m2 = v2;
  }
  if (m2 > 1e-290 && m2 < 1e290) return Math.sqrt(m2);
  let m = 0;
  for (let p = 0; p < a.re.length; p++) {
    const v = Math.hypot(a.re[p], a.im[p]);
    if (v > m) m = v;
  }
  return m;
}

/**
 * C = V_S† W_S for the columns S = `cols` of V and W (n × m each): the k × k
 * matrix of W in the span of those columns of V. With `rows`, only the first
 * `rows` rows enter (the projection of a diagonal weight on those rows).
 */
export function projectColumns(v: ComplexMatrix, w: ComplexMatrix, cols: readonly number[], rows: number = v.rows): ComplexMatrix {
  const m = v.cols, k = cols.length;
  const c = zeros(k, k);
  for (let a = 0; a < k; a++) {
    for (let b = 0; b < k; b++) {
      let sr = 0, si = 0;
      for (let r = 0; r < rows; r++) {
        const p = r * m + cols[a], q = r * m + cols[b];
        sr += v.re[p] * w.re[q] + v.im[p] * w.im[q];
        si += v.re[p] * w.im[q] - v.im[p] * w.re[q];
      }
      c.re[a * k + b] = sr;
      c.im[a * k + b] = si;
    }
  }
  return c;
}

/** M_S ← M_S Z in place, for the columns S = `cols` of M and a k × k matrix Z. */
export function rotateColumnsInPlace(m: ComplexMatrix, cols: readonly number[], z: ComplexMatrix): void {
  const n = m.rows, width = m.cols, k = cols.length;
  const rowRe = new Float64Array(k), rowIm = new Float64Array(k);
  for (let r = 0; r < n; r++) {
    for (let a = 0; a < k; a++) {
      let sr = 0, si = 0;
      for (let b = 0; b < k; b++) {
        const xr = m.re[r * width + cols[b]], xi = m.im[r * width + cols[b]];
        const yr = z.re[b * k + a], yi = z.im[b * k + a];
        sr += xr * yr - xi * yi;
        si += xr * yi + xi * yr;
      }
      rowRe[a] = sr;
      rowIm[a] = si;
    }
    for (let a = 0; a < k; a++) {
      m.re[r * width + cols[a]] = rowRe[a];
      m.im[r * width + cols[a]] = rowIm[a];
    }
  }
}
