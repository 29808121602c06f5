/**
 * Two-band closed forms used by the winding loop (winding/time-loop.ts) and
 * density (winding/density.ts): the propagator of one constant 2×2 generator
 * and the eigen-decomposition of a 2×2 unitary, written out element by element
 * on split storage (re and im arrays apart, as in complex-matrix.ts, four
 * consecutive entries per matrix, row-major): no calls, no allocation.
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

const spinor = new Float64Array(4);

/**
 * The normalised eigenvector (x₀, x₁) of a·σ for the eigenvalue +|a|, written as
 * (re x₀, im x₀, re x₁, im x₁) into out, from whichever of the two forms
 * (a_z + |a|, a_x + i a_y) and (a_x − i a_y, |a| − a_z) avoids cancellation;
 * (1, 0) for a = 0. The other eigenvector is (−conj x₁, conj x₀).
 */
export function pauliEigenvector(ax: number, ay: number, az: number, out: Float64Array): void {
  const r = Math.sqrt(ax * ax + ay * ay + az * az);
  let x0r: number, x0i: number, x1r: number, x1i: number;
  if (r === 0) {
    x0r = 1; x0i = 0; x1r = 0; x1i = 0;
  } else if (az >= 0) {
    x0r = az + r; x0i = 0; x1r = ax; x1i = ay;
  } else {
    x0r = ax; x0i = -ay; x1r = r - az; x1i = 0;
  }
  const norm = Math.sqrt(x0r * x0r + x0i * x0i + x1r * x1r + x1i * x1i);
  out[0] = x0r / norm;
  out[1] = x0i / norm;
  out[2] = x1r / norm;
  out[3] = x1i / norm;
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
  pauliEigenvector(ax, ay, az, spinor);
  const x0r = spinor[0], x0i = spinor[1], x1r = spinor[2], x1i = spinor[3];
  // Columns: v₊ = (x0, x1), v₋ = (−conj x1, conj x0).
  vRe[o] = x0r; vIm[o] = x0i; vRe[o + 2] = x1r; vIm[o + 2] = x1i;
  vRe[o + 1] = -x1r; vIm[o + 1] = x1i; vRe[o + 3] = x0r; vIm[o + 3] = -x0i;
}
