/**
 * Two-band kernels of the winding integral (winding-integral.ts), written out
 * element by element on the packed split storage of a whole grid: no calls,
 * no allocation in the per-(momentum, time node) loops. Matrices are 2×2,
 * row-major, four consecutive entries per momentum (re and im arrays apart,
 * as in complex-matrix.ts). The general-size path computes the same quantities
 * with the shared complex-matrix routines; the tests compare the two.
 */

/**
 * Writes V = U Q_F diag(e^{iφ_b}) Q_F† for every cut, with
 * U = Q diag(e^{−iλτ}) Q† S (S the propagator at the start of the piece,
 * Q, λ the generator's eigen-decomposition) and φ_b = θ_b · phaseScale.
 */
export function framesTwo(
  k: number,
  lam: Float64Array, qRe: Float64Array, qIm: Float64Array, tau: number,
  sRe: Float64Array, sIm: Float64Array,
  fRe: Float64Array, fIm: Float64Array,
  theta: Float64Array[], phaseScale: number,
  vRe: Float64Array[], vIm: Float64Array[],
): void {
  const o = 4 * k;
  const l0 = lam[2 * k] * tau, l1 = lam[2 * k + 1] * tau;
  const e0r = Math.cos(l0), e0i = -Math.sin(l0), e1r = Math.cos(l1), e1i = -Math.sin(l1);
  const q00r = qRe[o], q00i = qIm[o], q01r = qRe[o + 1], q01i = qIm[o + 1];
  const q10r = qRe[o + 2], q10i = qIm[o + 2], q11r = qRe[o + 3], q11i = qIm[o + 3];
  // Z = Q diag(e): columns scaled.
  const z00r = q00r * e0r - q00i * e0i, z00i = q00r * e0i + q00i * e0r;
  const z10r = q10r * e0r - q10i * e0i, z10i = q10r * e0i + q10i * e0r;
  const z01r = q01r * e1r - q01i * e1i, z01i = q01r * e1i + q01i * e1r;
  const z11r = q11r * e1r - q11i * e1i, z11i = q11r * e1i + q11i * e1r;
  // E = Z Q†: E_ij = Σ_a Z_ia conj(Q_ja).
  const x00r = z00r * q00r + z00i * q00i + z01r * q01r + z01i * q01i;
  const x00i = z00i * q00r - z00r * q00i + z01i * q01r - z01r * q01i;
  const x01r = z00r * q10r + z00i * q10i + z01r * q11r + z01i * q11i;
  const x01i = z00i * q10r - z00r * q10i + z01i * q11r - z01r * q11i;
  const x10r = z10r * q00r + z10i * q00i + z11r * q01r + z11i * q01i;
  const x10i = z10i * q00r - z10r * q00i + z11i * q01r - z11r * q01i;
  const x11r = z10r * q10r + z10i * q10i + z11r * q11r + z11i * q11i;
  const x11i = z10i * q10r - z10r * q10i + z11i * q11r - z11r * q11i;
  // U = E S.
  const s00r = sRe[o], s00i = sIm[o], s01r = sRe[o + 1], s01i = sIm[o + 1];
  const s10r = sRe[o + 2], s10i = sIm[o + 2], s11r = sRe[o + 3], s11i = sIm[o + 3];
  const u00r = x00r * s00r - x00i * s00i + x01r * s10r - x01i * s10i;
  const u00i = x00r * s00i + x00i * s00r + x01r * s10i + x01i * s10r;
  const u01r = x00r * s01r - x00i * s01i + x01r * s11r - x01i * s11i;
  const u01i = x00r * s01i + x00i * s01r + x01r * s11i + x01i * s11r;
  const u10r = x10r * s00r - x10i * s00i + x11r * s10r - x11i * s10i;
  const u10i = x10r * s00i + x10i * s00r + x11r * s10i + x11i * s10r;
  const u11r = x10r * s01r - x10i * s01i + x11r * s11r - x11i * s11i;
  const u11i = x10r * s01i + x10i * s01r + x11r * s11i + x11i * s11r;
  // W = U Q_F.
  const f00r = fRe[o], f00i = fIm[o], f01r = fRe[o + 1], f01i = fIm[o + 1];
  const f10r = fRe[o + 2], f10i = fIm[o + 2], f11r = fRe[o + 3], f11i = fIm[o + 3];
  const w00r = u00r * f00r - u00i * f00i + u01r * f10r - u01i * f10i;
  const w00i = u00r * f00i + u00i * f00r + u01r * f10i + u01i * f10r;
  const w01r = u00r * f01r - u00i * f01i + u01r * f11r - u01i * f11i;
  const w01i = u00r * f01i + u00i * f01r + u01r * f11i + u01i * f11r;
  const w10r = u10r * f00r - u10i * f00i + u11r * f10r - u11i * f10i;
  const w10i = u10r * f00i + u10i * f00r + u11r * f10i + u11i * f10r;
  const w11r = u10r * f01r - u10i * f01i + u11r * f11r - u11i * f11i;
  const w11i = u10r * f01i + u10i * f01r + u11r * f11i + u11i * f11r;
  for (let j = 0; j < theta.length; j++) {
    const p0 = theta[j][2 * k] * phaseScale, p1 = theta[j][2 * k + 1] * phaseScale;
    const g0r = Math.cos(p0), g0i = Math.sin(p0), g1r = Math.cos(p1), g1i = Math.sin(p1);
    const y00r = w00r * g0r - w00i * g0i, y00i = w00r * g0i + w00i * g0r;
    const y10r = w10r * g0r - w10i * g0i, y10i = w10r * g0i + w10i * g0r;
    const y01r = w01r * g1r - w01i * g1i, y01i = w01r * g1i + w01i * g1r;
    const y11r = w11r * g1r - w11i * g1i, y11i = w11r * g1i + w11i * g1r;
    const vr = vRe[j], vi = vIm[j];
    // V = Y Q_F†.
    vr[o] = y00r * f00r + y00i * f00i + y01r * f01r + y01i * f01i;
    vi[o] = y00i * f00r - y00r * f00i + y01i * f01r - y01r * f01i;
    vr[o + 1] = y00r * f10r + y00i * f10i + y01r * f11r + y01i * f11i;
    vi[o + 1] = y00i * f10r - y00r * f10i + y01i * f11r - y01r * f11i;
    vr[o + 2] = y10r * f00r + y10i * f00i + y11r * f01r + y11i * f01i;
    vi[o + 2] = y10i * f00r - y10r * f00i + y11i * f01r - y11r * f01i;
    vr[o + 3] = y10r * f10r + y10i * f10i + y11r * f11r + y11i * f11i;
    vi[o + 3] = y10i * f10r - y10r * f10i + y11i * f11r - y11r * f11i;
  }
}

/**
 * Σ over the grid of Tr(A_t [A₁, A₂]) for one cut at one time node, with
 * A_μ = V†∂_μV by central differences (coefficients `coef`, scaled by the axis
 * sizes), A_t = i(X − V†HV). Returns the real part; the imaginary part is
 * written to out[0].
 */
export function densitySumTwo(
  n1: number, n2: number, coef: Float64Array,
  vr: Float64Array, vi: Float64Array,
  hRe: Float64Array, hIm: Float64Array,
  xRe: Float64Array, xIm: Float64Array,
  out: Float64Array,
): number {
  let acc = 0, accIm = 0;
  const r = coef.length;
  for (let i1 = 0; i1 < n1; i1++) {
    for (let i2 = 0; i2 < n2; i2++) {
      const o = 4 * (i1 * n2 + i2);
      let a00r = 0, a00i = 0, a01r = 0, a01i = 0, a10r = 0, a10i = 0, a11r = 0, a11i = 0;
      let b00r = 0, b00i = 0, b01r = 0, b01i = 0, b10r = 0, b10i = 0, b11r = 0, b11i = 0;
      for (let s = 1; s <= r; s++) {
        const c1 = coef[s - 1] * n1, c2 = coef[s - 1] * n2;
        let ip = i1 + s, im = i1 - s;
        if (ip >= n1) ip -= n1;
        if (im < 0) im += n1;
        const p1 = 4 * (ip * n2 + i2), m1 = 4 * (im * n2 + i2);
        let jp = i2 + s, jm = i2 - s;
        if (jp >= n2) jp -= n2;
        if (jm < 0) jm += n2;
        const p2 = 4 * (i1 * n2 + jp), m2 = 4 * (i1 * n2 + jm);
        a00r += c1 * (vr[p1] - vr[m1]); a00i += c1 * (vi[p1] - vi[m1]);
        a01r += c1 * (vr[p1 + 1] - vr[m1 + 1]); a01i += c1 * (vi[p1 + 1] - vi[m1 + 1]);
        a10r += c1 * (vr[p1 + 2] - vr[m1 + 2]); a10i += c1 * (vi[p1 + 2] - vi[m1 + 2]);
        a11r += c1 * (vr[p1 + 3] - vr[m1 + 3]); a11i += c1 * (vi[p1 + 3] - vi[m1 + 3]);
        b00r += c2 * (vr[p2] - vr[m2]); b00i += c2 * (vi[p2] - vi[m2]);
        b01r += c2 * (vr[p2 + 1] - vr[m2 + 1]); b01i += c2 * (vi[p2 + 1] - vi[m2 + 1]);
        b10r += c2 * (vr[p2 + 2] - vr[m2 + 2]); b10i += c2 * (vi[p2 + 2] - vi[m2 + 2]);
        b11r += c2 * (vr[p2 + 3] - vr[m2 + 3]); b11i += c2 * (vi[p2 + 3] - vi[m2 + 3]);
      }
      // conj(V) entries.
      const v00r = vr[o], v00i = -vi[o], v01r = vr[o + 1], v01i = -vi[o + 1];
      const v10r = vr[o + 2], v10i = -vi[o + 2], v11r = vr[o + 3], v11i = -vi[o + 3];
      // A₁ = V† D₁: (A₁)_ij = conj(V_0i) D_0j + conj(V_1i) D_1j.
      const p00r = v00r * a00r - v00i * a00i + v10r * a10r - v10i * a10i;
      const p00i = v00r * a00i + v00i * a00r + v10r * a10i + v10i * a10r;
      const p01r = v00r * a01r - v00i * a01i + v10r * a11r - v10i * a11i;
      const p01i = v00r * a01i + v00i * a01r + v10r * a11i + v10i * a11r;
      const p10r = v01r * a00r - v01i * a00i + v11r * a10r - v11i * a10i;
      const p10i = v01r * a00i + v01i * a00r + v11r * a10i + v11i * a10r;
      const p11r = v01r * a01r - v01i * a01i + v11r * a11r - v11i * a11i;
      const p11i = v01r * a01i + v01i * a01r + v11r * a11i + v11i * a11r;
      // A₂ = V† D₂.
      const q00r = v00r * b00r - v00i * b00i + v10r * b10r - v10i * b10i;
      const q00i = v00r * b00i + v00i * b00r + v10r * b10i + v10i * b10r;
      const q01r = v00r * b01r - v00i * b01i + v10r * b11r - v10i * b11i;
      const q01i = v00r * b01i + v00i * b01r + v10r * b11i + v10i * b11r;
      const q10r = v01r * b00r - v01i * b00i + v11r * b10r - v11i * b10i;
      const q10i = v01r * b00i + v01i * b00r + v11r * b10i + v11i * b10r;
      const q11r = v01r * b01r - v01i * b01i + v11r * b11r - v11i * b11i;
      const q11i = v01r * b01i + v01i * b01r + v11r * b11i + v11i * b11r;
      // [A₁, A₂] = A₁A₂ − A₂A₁.
      const k00r = p01r * q10r - p01i * q10i - (q01r * p10r - q01i * p10i);
      const k00i = p01r * q10i + p01i * q10r - (q01r * p10i + q01i * p10r);
      const k11r = -k00r, k11i = -k00i;
      const k01r = p00r * q01r - p00i * q01i + p01r * q11r - p01i * q11i - (q00r * p01r - q00i * p01i + q01r * p11r - q01i * p11i);
      const k01i = p00r * q01i + p00i * q01r + p01r * q11i + p01i * q11r - (q00r * p01i + q00i * p01r + q01r * p11i + q01i * p11r);
      const k10r = p10r * q00r - p10i * q00i + p11r * q10r - p11i * q10i - (q10r * p00r - q10i * p00i + q11r * p10r - q11i * p10i);
      const k10i = p10r * q00i + p10i * q00r + p11r * q10i + p11i * q10r - (q10r * p00i + q10i * p00r + q11r * p10i + q11i * p10r);
      // HV.
      const h00r = hRe[o], h00i = hIm[o], h01r = hRe[o + 1], h01i = hIm[o + 1];
      const h10r = hRe[o + 2], h10i = hIm[o + 2], h11r = hRe[o + 3], h11i = hIm[o + 3];
      const w00r = vr[o], w00i = vi[o], w01r = vr[o + 1], w01i = vi[o + 1];
      const w10r = vr[o + 2], w10i = vi[o + 2], w11r = vr[o + 3], w11i = vi[o + 3];
      const g00r = h00r * w00r - h00i * w00i + h01r * w10r - h01i * w10i;
      const g00i = h00r * w00i + h00i * w00r + h01r * w10i + h01i * w10r;
      const g01r = h00r * w01r - h00i * w01i + h01r * w11r - h01i * w11i;
      const g01i = h00r * w01i + h00i * w01r + h01r * w11i + h01i * w11r;
      const g10r = h10r * w00r - h10i * w00i + h11r * w10r - h11i * w10i;
      const g10i = h10r * w00i + h10i * w00r + h11r * w10i + h11i * w10r;
      const g11r = h10r * w01r - h10i * w01i + h11r * w11r - h11i * w11i;
      const g11i = h10r * w01i + h10i * w01r + h11r * w11i + h11i * w11r;
      // Y = X − V†(HV).
      const y00r = xRe[o] - (v00r * g00r - v00i * g00i + v10r * g10r - v10i * g10i);
      const y00i = xIm[o] - (v00r * g00i + v00i * g00r + v10r * g10i + v10i * g10r);
      const y01r = xRe[o + 1] - (v00r * g01r - v00i * g01i + v10r * g11r - v10i * g11i);
      const y01i = xIm[o + 1] - (v00r * g01i + v00i * g01r + v10r * g11i + v10i * g11r);
      const y10r = xRe[o + 2] - (v01r * g00r - v01i * g00i + v11r * g10r - v11i * g10i);
      const y10i = xIm[o + 2] - (v01r * g00i + v01i * g00r + v11r * g10i + v11i * g10r);
      const y11r = xRe[o + 3] - (v01r * g01r - v01i * g01i + v11r * g11r - v11i * g11i);
      const y11i = xIm[o + 3] - (v01r * g01i + v01i * g01r + v11r * g11i + v11i * g11r);
      // Tr(Y [A₁, A₂]) = Σ_ij Y_ij K_ji; the density is Re Tr(iY K) = −Im Tr(Y K).
      const tr = y00r * k00r - y00i * k00i + y01r * k10r - y01i * k10i + y10r * k01r - y10i * k01i + y11r * k11r - y11i * k11i;
      const ti = y00r * k00i + y00i * k00r + y01r * k10i + y01i * k10r + y10r * k01i + y10i * k01r + y11r * k11i + y11i * k11r;
      acc -= ti;
      accIm += tr;
    }
  }
  out[0] = accIm;
  return acc;
}
