/**
 * A bound on how fast any quasienergy can move with the reduced momentum s
 * along one periodic direction of a drive (a ribbon's k∥, a chain's k).
 *
 * dU/ds = −i ∫₀ᵀ U(T, t) ∂_sH(s, t) U(t, 0) dt (Duhamel), so ‖dU/ds‖₂ ≤
 * Φ = ∫₀ᵀ ‖∂_sH‖₂ dt, and by the matching-distance theorem for unitary
 * matrices (Bhatia & Davis, Linear Multilinear Algebra 15, 71 (1984)) every
 * eigenphase is Lipschitz in s with constant Φ, crossings included. In the
 * Bloch convention of drive.ts a term with cell offset n along the periodic
 * direction carries e^{−2πi s n}, so ∂_sH has the pattern of H with each
 * amplitude times 2π|n|; its spectral norm is bounded by the largest absolute
 * row sum (Hermitian), with each term counted at |amplitude|·max|f(t)| in the
 * rows of both states it couples; a kick counts with weight 1 (its generator
 * is applied once, U = e^{−iK}). The bound is returned in units of π/T per unit
 * of s, the units of quasienergy reports: v = Φ/π.
 *
 * Given the sheet (or chain) itself, the row sums are taken per orbital with
 * every term counted, as in a cell far from any edge: the bound then holds for
 * every ribbon or open geometry cut from it, whatever its width.
 */
import type { LatticeDrive } from './drive.ts';

export function quasienergyVelocityBound(drive: LatticeDrive, direction = 0): number {
  if (!(Number.isInteger(direction) && direction >= 0 && direction < drive.dimension)) {
    throw new RangeError(`quasienergyVelocityBound: direction ${direction} is not one of the drive's periodic directions 0…${drive.dimension - 1}`);
  }
  let phi = 0;
  for (const seg of drive.segments) {
    const rows = new Float64Array(drive.states.length);
    for (const term of seg.terms) {
      const n = Math.abs(term.offset[direction] ?? 0);
      if (n === 0) continue;
      const m = term.modulation;
      const fMax = m.kind === 'constant' ? 1 : Math.abs(m.mean) + m.components.reduce((sum, c) => sum + Math.abs(c.amplitude), 0);
      const size = 2 * Math.PI * n * Math.hypot(term.amplitude.re, term.amplitude.im) * fMax;
      rows[term.to] += size;
      rows[term.from] += size;
    }
    let max = 0;
    for (const r of rows) max = Math.max(max, r);
    phi += (seg.duration === 0 ? 1 : seg.duration) * max;
  }
  return phi / Math.PI;
}
