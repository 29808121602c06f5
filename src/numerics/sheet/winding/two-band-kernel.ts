/**
 * Two-band kernels of the winding integral (winding/integral.ts), written out
 * element by element on the packed split storage of a whole grid: no calls,
 * no allocation in the per-(momentum, time node) loops. Matrices are 2×2,
 * row-major, four consecutive entries per momentum (re and im arrays apart,
 * as in complex-matrix.ts). The general-size path computes the same quantities
 * with the shared complex-matrix routines; the tests compare the two.
 */

/**
 * out = exp(−iGτ) S for the 2×2 Hermitian G at offset go, by the closed form
 * for G = g₀ + h·σ (the same as linalg/exponential.ts):
 * exp(−iGτ) = e^{−ig₀τ}[cos(|h|τ) − i sin(|h|τ) ĥ·σ]. out may not alias S.
 */
export function propagateTwo(
  gRe: Float64Array, gIm: Float64Array, go: number, tau: number,
  sRe: Float64Array, sIm: Float64Array, so: number,
  outRe: Float64Array, outIm: Float64Array, oo: number,
): void {
  const a = gRe[go], d = gRe[go + 3];
  const hx = 0.5 * (gRe[go + 2] + gRe[go + 1]), hy = 0.5 * (gIm[go + 2] - gIm[go + 1]);
  const h0 = 0.5 * (a + d), hz = 0.5 * (a - d);
  const r = Math.sqrt(hx * hx + hy * hy + hz * hz);
  const phi = r * tau;
  const c = Math.cos(phi);
  const sn = Math.abs(phi) < 1e-4 ? tau * (1 - (phi * phi) / 6) : Math.sin(phi) / r;
  const gr = Math.cos(h0 * tau), gi = -Math.sin(h0 * tau);
  // M = [[c − i s hz, −s hy − i s hx], [s hy − i s hx, c + i s hz]] times e^{−ig₀τ}.
  const x00r = gr * c + gi * sn * hz, x00i = gi * c - gr * sn * hz;
  const x01r = -gr * sn * hy + gi * sn * hx, x01i = -gi * sn * hy - gr * sn * hx;
  const x10r = gr * sn * hy + gi * sn * hx, x10i = gi * sn * hy - gr * sn * hx;
  const x11r = gr * c - gi * sn * hz, x11i = gi * c + gr * sn * hz;
  const s00r = sRe[so], s00i = sIm[so], s01r = sRe[so + 1], s01i = sIm[so + 1];
  const s10r = sRe[so + 2], s10i = sIm[so + 2], s11r = sRe[so + 3], s11i = sIm[so + 3];
  outRe[oo] = x00r * s00r - x00i * s00i + x01r * s10r - x01i * s10i;
  outIm[oo] = x00r * s00i + x00i * s00r + x01r * s10i + x01i * s10r;
  outRe[oo + 1] = x00r * s01r - x00i * s01i + x01r * s11r - x01i * s11i;
  outIm[oo + 1] = x00r * s01i + x00i * s01r + x01r * s11i + x01i * s11r;
  outRe[oo + 2] = x10r * s00r - x10i * s00i + x11r * s10r - x11i * s10i;
  outIm[oo + 2] = x10r * s00i + x10i * s00r + x11r * s10i + x11i * s10r;
  outRe[oo + 3] = x10r * s01r - x10i * s01i + x11r * s11r - x11i * s11i;
  outIm[oo + 3] = x10r * s01i + x10i * s01r + x11r * s11i + x11i * s11r;
}

const uRe = new Float64Array(4), uIm = new Float64Array(4);

/**
 * Writes V = U Q_F diag(e^{iφ_b}) Q_F† for every cut at momentum k, with
 * U = exp(−iGτ) S (G the piece's generator, S the propagator at the start of
 * the piece) and φ_b = θ_b · phaseScale.
 */
export function framesTwo(
  k: number,
  gRe: Float64Array, gIm: Float64Array, tau: number,
  sRe: Float64Array, sIm: Float64Array,
  fRe: Float64Array, fIm: Float64Array,
  theta: Float64Array[], phaseScale: number,
  vRe: Float64Array[], vIm: Float64Array[],
): void {
  const o = 4 * k;
  propagateTwo(gRe, gIm, o, tau, sRe, sIm, o, uRe, uIm, 0);
  const u00r = uRe[0], u00i = uIm[0], u01r = uRe[1], u01i = uIm[1];
  const u10r = uRe[2], u10i = uIm[2], u11r = uRe[3], u11i = uIm[3];
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
 * A_μ = V†D_μ (D_μ the central differences of V along σ_μ, precomputed) and
 * A_t = i(X − V†HV). Returns the real part; the imaginary part is written to out[0].
 */
export function densitySumTwo(
  count: number,
  vr: Float64Array, vi: Float64Array,
  d1r: Float64Array, d1i: Float64Array, d2r: Float64Array, d2i: Float64Array,
  hRe: Float64Array, hIm: Float64Array,
  xRe: Float64Array, xIm: Float64Array,
  out: Float64Array,
): number {
  let acc = 0, accIm = 0;
  for (let k = 0; k < count; k++) {
    {
      const o = 4 * k;
      const a00r = d1r[o], a00i = d1i[o], a01r = d1r[o + 1], a01i = d1i[o + 1];
      const a10r = d1r[o + 2], a10i = d1i[o + 2], a11r = d1r[o + 3], a11i = d1i[o + 3];
      const b00r = d2r[o], b00i = d2i[o], b01r = d2r[o + 1], b01i = d2i[o + 1];
      const b10r = d2r[o + 2], b10i = d2i[o + 2], b11r = d2r[o + 3], b11i = d2i[o + 3];
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

/**
 * Eigen-decomposition of the 2×2 unitary at offset o (the same route as
 * linalg/unitary-eigen.ts, in closed form): with e^{2iα} = det U,
 * M = e^{−iα}U = cos β − i sin β (â·σ) ∈ SU(2), so U has eigenphases α − β
 * and α + β on the eigenvectors of â·σ with eigenvalues +1 and −1. â·σ is
 * read off the anti-Hermitian part of M (symmetrised); β = atan2(|a|, a₀)
 * keeps full relative accuracy for nearly degenerate eigenvalues. Writes the
 * eigenphases to phases[po], phases[po+1] and the eigenvectors as columns
 * (packed 2×2) at offset o of vRe/vIm.
 */
export function unitaryEigenTwo(
  uRe: Float64Array, uIm: Float64Array, o: number,
  phases: Float64Array, po: number,
  vRe: Float64Array, vIm: Float64Array,
): void {
  const r00 = uRe[o], i00 = uIm[o], r01 = uRe[o + 1], i01 = uIm[o + 1];
  const r10 = uRe[o + 2], i10 = uIm[o + 2], r11 = uRe[o + 3], i11 = uIm[o + 3];
  const detRe = r00 * r11 - i00 * i11 - (r01 * r10 - i01 * i10);
  const detIm = r00 * i11 + i00 * r11 - (r01 * i10 + i01 * r10);
  const alpha = 0.5 * Math.atan2(detIm, detRe);
  const cr = Math.cos(alpha), ci = -Math.sin(alpha);
  // M = e^{−iα} U.
  const m00r = cr * r00 - ci * i00, m00i = cr * i00 + ci * r00;
  const m01r = cr * r01 - ci * i01, m01i = cr * i01 + ci * r01;
  const m10r = cr * r10 - ci * i10, m10i = cr * i10 + ci * r10;
  const m11r = cr * r11 - ci * i11, m11i = cr * i11 + ci * r11;
  const a0 = 0.5 * (m00r + m11r);
  const az = 0.5 * (m11i - m00i);
  const ax = -0.5 * (m10i + m01i);
  const ay = 0.5 * (m10r - m01r);
  const r = Math.sqrt(ax * ax + ay * ay + az * az);
  const beta = Math.atan2(r, a0);
  phases[po] = alpha - beta;
  phases[po + 1] = alpha + beta;
  // Eigenvector of â·σ for +1, from whichever form avoids cancellation.
  let x0r: number, x0i: number, x1r: number, x1i: number;
  if (r === 0) {
    x0r = 1; x0i = 0; x1r = 0; x1i = 0;
  } else if (az >= 0) {
    x0r = az + r; x0i = 0; x1r = ax; x1i = ay;
  } else {
    x0r = ax; x0i = -ay; x1r = r - az; x1i = 0;
  }
  const norm = Math.sqrt(x0r * x0r + x0i * x0i + x1r * x1r + x1i * x1i);
  x0r /= norm; x0i /= norm; x1r /= norm; x1i /= norm;
  // Columns: v₊ = (x0, x1), v₋ = (−conj x1, conj x0).
  vRe[o] = x0r; vIm[o] = x0i; vRe[o + 2] = x1r; vIm[o + 2] = x1i;
  vRe[o + 1] = -x1r; vIm[o + 1] = x1i; vRe[o + 3] = x0r; vIm[o + 3] = -x0i;
}
