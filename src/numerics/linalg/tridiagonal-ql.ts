/**
 * Eigenvalues (and optionally eigenvectors) of a real symmetric tridiagonal matrix
 * by the implicit QL algorithm with Wilkinson-type shifts: the routine tql2 of
 * Bowdler, Martin, Reinsch & Wilkinson, Numer. Math. 11, 293 (1968), in the form
 * popularised by EISPACK and JAMA. Each sweep chases a bulge with Givens rotations;
 * the shift is the eigenvalue of the leading 2×2 block closer to d[l], which gives
 * cubic convergence in practice.
 *
 * Layout: `d` holds the diagonal (n entries), `e[i]` couples i and i+1 (n entries,
 * e[n−1] ignored). Rotations are accumulated into `zt`, which stores eigenvector
 * j as ROW j (zt[j·n + k] = component k), so each rotation touches two contiguous
 * rows. On return `d` is sorted ascending and the rows of `zt` follow.
 */
export const MAX_QL_ITERATIONS_PER_EIGENVALUE = 60;


export function tridiagonalQl(d: Float64Array, e: Float64Array, zt: Float64Array | null): void {
  const n = d.length;
  if (n === 0) return;
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
        let r = Math.hypot(p, 1);
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
          r = Math.hypot(p, e[i]);
          e[i + 1] = s * r;
          s = e[i] / r;
          c = p / r;
          p = c * d[i] - s * g;
          d[i + 1] = h + s * (c * g + s * d[i]);
          if (zt !== null) {
            const ri = i * n, rj = (i + 1) * n;
            for (let k = 0; k < n; k++) {
              const zk1 = zt[rj + k], zk = zt[ri + k];
              zt[rj + k] = s * zk + c * zk1;
              zt[ri + k] = c * zk - s * zk1;
            }
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
  // Selection sort, ascending; swaps whole rows of zt.
  for (let i = 0; i < n - 1; i++) {
    let k = i;
    let p = d[i];
    for (let j = i + 1; j < n; j++) {
      if (d[j] < p) {
        k = j;
        p = d[j];
      }
    }
    if (k !== i) {
      d[k] = d[i];
      d[i] = p;
      if (zt !== null) {
        for (let c = 0; c < n; c++) {
          const t = zt[i * n + c];
          zt[i * n + c] = zt[k * n + c];
          zt[k * n + c] = t;
        }
      }
    }
  }
}
