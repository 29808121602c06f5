/**
 * Eigenvalues (and optionally eigenvectors) of a real symmetric tridiagonal matrix
 * by the implicit QL algorithm with Wilkinson-type shifts: the routine tql2 of
 * Bowdler, Martin, Reinsch & Wilkinson, Numer. Math. 11, 293 (1968), in the form
 * popularised by EISPACK and JAMA. Each sweep chases a bulge with Givens rotations;
 * the shift is the eigenvalue of the leading 2×2 block closer to d[l], which gives
 * cubic convergence in practice.
 *
 * Layout: `d` holds the diagonal (n entries), `e[i]` couples i and i+1 (n entries,
 * e[n−1] ignored). Rotations are accumulated into `z`, row-major n×n with the
 * eigenvectors as COLUMNS (z[k·n + j] = component k of eigenvector j). The
 * rotations of one QL sweep are recorded first and then applied row by row of
 * z, carrying one value from rotation to rotation: each entry is read and
 * written once per sweep, with stride 1. On return `d` is sorted ascending and
 * the columns of `z` follow.
 */
export const MAX_QL_ITERATIONS_PER_EIGENVALUE = 60;

/**
 * √(a² + b²) without Math.hypot (several times slower in V8) when the squares
 * neither overflow nor underflow; Math.hypot otherwise.
 */
function hypot(a: number, b: number): number {
  const s = a * a + b * b;
  return s < 1e300 && s > 1e-300 ? Math.sqrt(s) : Math.hypot(a, b);
}


export function tridiagonalQl(d: Float64Array, e: Float64Array, z: Float64Array | null): void {
  const n = d.length;
  if (n === 0) return;
  const cs = new Float64Array(n), sn = new Float64Array(n);
  e[n - 1] = 0;
  const eps = 2 ** -52;
  let f = 0;
  let tst1 = 0;
  for (let l = 0; l < n; l++) {
    tst1 = Math.max(tst1, Math.abs(d[l]) + Math.abs(e[l]));
    let m = l;
    while (m < n - 1 && Math.abs(e[m]) > eps * tst1) m++;
    if (m > l) {
      let iter = 0;
      do {
        if (++iter > MAX_QL_ITERATIONS_PER_EIGENVALUE) {
          throw new RangeError(
            `tridiagonalQl: eigenvalue ${l} of ${n} did not converge in ${MAX_QL_ITERATIONS_PER_EIGENVALUE} QL sweeps (|e| = ${Math.abs(e[l]).toExponential(3)})`,
          );
        }
        // Implicit shift from the leading 2×2 block.
        let g = d[l];
        let p = (d[l + 1] - g) / (2 * e[l]);
        let r = hypot(p, 1);
        if (p < 0) r = -r;
        d[l] = e[l] / (p + r);
        d[l + 1] = e[l] * (p + r);
        const dl1 = d[l + 1];
        let h = g - d[l];
        for (let i = l + 2; i < n; i++) d[i] -= h;
        f += h;
        // QL sweep from m−1 down to l.
        p = d[m];
        let c = 1, c2 = 1, c3 = 1;
        const el1 = e[l + 1];
        let s = 0, s2 = 0;
        for (let i = m - 1; i >= l; i--) {
          c3 = c2;
          c2 = c;
          s2 = s;
          g = c * e[i];
          h = c * p;
          r = hypot(p, e[i]);
          e[i + 1] = s * r;
          s = e[i] / r;
          c = p / r;
          p = c * d[i] - s * g;
          d[i + 1] = h + s * (c * g + s * d[i]);
          cs[i] = c;
          sn[i] = s;
        }
        if (z !== null) {
          // Rotation i mixes columns i and i+1: (z_i, z_{i+1}) ← (c z_i − s z_{i+1}, s z_i + c z_{i+1}), for i = m−1 … l.
          // Four rows at a time: four independent carry chains keep the floating-point units busy.
          let k = 0;
          for (; k + 3 < n; k += 4) {
            const r0 = k * n, r1 = r0 + n, r2 = r1 + n, r3 = r2 + n;
            let c0 = z[r0 + m], c1 = z[r1 + m], c2 = z[r2 + m], c3 = z[r3 + m];
            for (let i = m - 1; i >= l; i--) {
              const ci = cs[i], si = sn[i];
              const a0 = z[r0 + i], a1 = z[r1 + i], a2 = z[r2 + i], a3 = z[r3 + i];
              z[r0 + i + 1] = si * a0 + ci * c0;
              z[r1 + i + 1] = si * a1 + ci * c1;
              z[r2 + i + 1] = si * a2 + ci * c2;
              z[r3 + i + 1] = si * a3 + ci * c3;
              c0 = ci * a0 - si * c0;
              c1 = ci * a1 - si * c1;
              c2 = ci * a2 - si * c2;
              c3 = ci * a3 - si * c3;
            }
            z[r0 + l] = c0;
            z[r1 + l] = c1;
            z[r2 + l] = c2;
            z[r3 + l] = c3;
          }
          for (; k < n; k++) {
            const row = k * n;
            let carry = z[row + m];
            for (let i = m - 1; i >= l; i--) {
              const zi = z[row + i], ci = cs[i], si = sn[i];
              z[row + i + 1] = si * zi + ci * carry;
              carry = ci * zi - si * carry;
            }
            z[row + l] = carry;
          }
        }
        p = (-s * s2 * c3 * el1 * e[l]) / dl1;
        e[l] = s * p;
        d[l] = c * p;
      } while (Math.abs(e[l]) > eps * tst1);
    }
    d[l] += f;
    e[l] = 0;
  }
  // Ascending order (stable), then the columns of z permuted to match.
  const order = Array.from({ length: n }, (_, i) => i).sort((a, b) => d[a] - d[b]);
  const sorted = Float64Array.from(order, (i) => d[i]);
  d.set(sorted);
  if (z !== null) {
    const tmp = new Float64Array(n);
    for (let k = 0; k < n; k++) {
      const row = k * n;
      for (let j = 0; j < n; j++) tmp[j] = z[row + order[j]];
      z.set(tmp, row);
    }
  }
}
