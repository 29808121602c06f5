/**
 * How fast quasienergies can move with momentum: a bound L_d on |∂ε/∂s_d| that
 * holds everywhere in the zone, read off the drive's terms.
 *
 * Derivation. U(s, T) = 𝒯 exp(−i∫₀ᵀ H(s, t) dt) (kicks included as factors
 * exp(−iK(s))), so by Duhamel's formula
 *     ∂_d U(T) = −i ∫₀ᵀ U(T, t) ∂_d H(s, t) U(t, 0) dt − i Σ_kicks (…∂_d K…),
 * and ‖∂_d U(T)‖ ≤ ∫₀ᵀ ‖∂_d H(s, t)‖ dt + Σ_kicks ‖∂_d K(s)‖ (spectral norms;
 * the derivative of exp(−iK) is bounded by ‖∂K‖ by the same formula). Along a
 * straight line in s the unitary family is real-analytic, so its eigenphases
 * can be chosen analytic (Rellich's theorem) with |∂φ| = |⟨v|U†∂U|v⟩| ≤ ‖∂U‖.
 * The distance from a fixed quasienergy to the nearest eigenvalue is a
 * minimum over such branches and inherits the bound; so does each end of a gap.
 *
 * In the cell gauge (drive.ts) a term (a → b, offset n, amplitude t, modulation f)
 * enters H(s) as t f(t) e^{iqA·d} e^{−2πi s·n}|b⟩⟨a| + h.c.; the Peierls phase
 * has modulus one and does not depend on s. Its derivative along s_d is the
 * same matrix times −2πi n_d, whose spectral norm is 2π|n_d||t||f(t)| (twice
 * that when a = b: the term and its conjugate then share the diagonal entry).
 * With |f(t)| ≤ |mean| + Σ|amplitude_j| and the triangle inequality over terms,
 *     L_d = (1/π) [ Σ_segments τ Σ_terms c·2π|n_d||t| max|f| + Σ_kicks Σ_terms c·2π|n_d||t| max|f| ]
 * in units of π/T per unit of reduced momentum (eigenphase φ = −επ/T·T).
 * The bound is global and often pessimistic by a small factor; it is exact
 * arithmetic on the model, so it needs no sampling.
 */
import type { DriveTerm, LatticeDrive, Modulation } from './drive.ts';

function largestModulation(m: Modulation): number {
  if (m.kind === 'constant') return 1;
  return Math.abs(m.mean) + m.components.reduce((a, c) => a + Math.abs(c.amplitude), 0);
}

function termSlope(term: DriveTerm, direction: number): number {
  const n = term.offset[direction] ?? 0;
  if (n === 0) return 0;
  const magnitude = Math.hypot(term.amplitude.re, term.amplitude.im) * largestModulation(term.modulation);
  const doubled = term.from === term.to ? 2 : 1;
  return doubled * 2 * Math.PI * Math.abs(n) * magnitude;
}

/**
 * L_d for every periodic direction d: |ε(s + δ) − ε(s)| ≤ Σ_d L_d |δ_d| for the
 * quasienergies bounding any fixed cut (units π/T; δ in reduced momenta).
 */
export function quasienergyLipschitz(drive: LatticeDrive): number[] {
  const bounds: number[] = [];
  for (let d = 0; d < drive.dimension; d++) {
    let phase = 0;
    for (const segment of drive.segments) {
      const weight = segment.duration === 0 ? 1 : segment.duration;
      let slope = 0;
      for (const term of segment.terms) slope += termSlope(term, d);
      phase += weight * slope;
    }
    bounds.push(phase / Math.PI);
  }
  return bounds;
}
