/**
 * Builders of driven chains used across the chain tests. Every model is
 * textbook (source named beside each builder); amplitudes follow the term
 * convention of src/numerics/drive.ts.
 */
import type { DriveSegment, DriveTerm, LatticeDrive } from '../../../src/numerics/evolution/drive.ts';
import type { PairingTerm } from '../../../src/numerics/evolution/bdg.ts';
import { nambuDrive } from '../../../src/numerics/evolution/bdg.ts';

const constant = { kind: 'constant' } as const;

export function hop(from: number, to: number, offset: number, re: number, im = 0): DriveTerm {
  return { from, to, offset: [offset], amplitude: { re, im }, modulation: constant };
}

function chain(states: string[], segments: DriveSegment[], period: number): LatticeDrive {
  return {
    dimension: 1,
    spaceDimension: 1,
    latticeVectors: [[1]],
    states: states.map((label, i) => ({ label, position: [i / states.length], charge: 1 })),
    period,
    segments,
  };
}

/**
 * Su–Schrieffer–Heeger chain (PRL 42, 1698 (1979)) run as a static drive:
 * intracell v (A → B), intercell w (B → A of the next cell). Γ = diag(1, −1).
 */
export function sshChain(v: number, w: number, period = 1): LatticeDrive {
  return chain(['A', 'B'], [{ label: 'static', duration: period, terms: [hop(0, 1, 0, v), hop(1, 0, 1, w)] }], period);
}

/**
 * Two-step chain: intracell hopping J₁ for T/2, then intercell J₂ for T/2,
 * with θᵢ = JᵢT/2 (the pulse areas).
 */
export function twoStepChain(theta1: number, theta2: number, period = 1): LatticeDrive {
  const j1 = (2 * theta1) / period, j2 = (2 * theta2) / period;
  return chain(
    ['A', 'B'],
    [
      { label: 'intracell', duration: period / 2, terms: [hop(0, 1, 0, j1)] },
      { label: 'intercell', duration: period / 2, terms: [hop(1, 0, 1, j2)] },
    ],
    period,
  );
}

/** Pauli σ_y coin on the cell (A = ↑, B = ↓): H = (θ/τ) σ_y, so exp(−iHτ) = exp(−iθσ_y). */
function coin(theta: number, duration: number, label: string): DriveSegment {
  // σ_y has (B, A) element +i: term A → B with amplitude i·θ/τ.
  return { label, duration, terms: [{ from: 0, to: 1, offset: [0], amplitude: { re: 0, im: theta / duration }, modulation: constant }] };
}

/** Full transfer (Jτ = π/2) along a bond: exp(−iπ/2 σ_x) = −iσ_x on the bond. */
function fullTransfer(from: number, to: number, offset: number, duration: number, label: string): DriveSegment {
  return { label, duration, terms: [hop(from, to, offset, Math.PI / 2 / duration)] };
}

/**
 * Split-step quantum walk (Kitagawa, Rudner, Berg, Demler, PRA 82, 033429
 * (2010)) written as seven constant segments of equal duration:
 *     U = R(θ₁/2) S⁻¹ R(θ₂) S R(θ₁/2),   R(θ) = exp(−iθσ_y),
 * where the spin-dependent shift S is built from two full transfers: an
 * intercell one (B_x ↔ A_{x+1}) and an intracell one (A_x ↔ B_x); in time order
 * R(θ₁/2), intracell, intercell, R(θ₂), intercell, intracell, R(θ₁/2).
 * The sequence is a palindrome, so t₀ = 0 and T/2 are symmetric frames for Γ = σ_z.
 */
export function splitStepWalk(theta1: number, theta2: number, period = 1): LatticeDrive {
  const d = period / 7;
  return chain(
    ['A', 'B'],
    [
      coin(theta1 / 2, d, 'coin 1/2'),
      fullTransfer(0, 1, 0, d, 'flip'),
      fullTransfer(1, 0, 1, d, 'shift'),
      coin(theta2, d, 'coin 2'),
      fullTransfer(1, 0, 1, d, 'shift'),
      fullTransfer(0, 1, 0, d, 'flip'),
      coin(theta1 / 2, d, 'coin 1/2'),
    ],
    period,
  );
}

/** Normal part of a Kitaev chain: −w c†_{R+1}c_R + h.c. − μ c†c. */
function kitaevNormalTerms(w: number, mu: number): DriveTerm[] {
  return [hop(0, 0, 1, -w), hop(0, 0, 0, -mu)];
}

function kitaevPairing(delta: number): PairingTerm {
  return { from: 0, to: 0, offset: [1], amplitude: { re: delta, im: 0 }, modulation: constant };
}

/**
 * Static Kitaev chain (A. Yu. Kitaev, Phys. Usp. 44, 131 (2001)) in Nambu form:
 * H = Σ [−w c†_{R+1}c_R + Δ c†_{R+1}c†_R + h.c.] − μ Σ c†c; topological for |μ| < 2|w| (Δ ≠ 0).
 */
export function kitaevChain(w: number, delta: number, mu: number, period = 1): LatticeDrive {
  const normal = chain(['c'], [{ label: 'static', duration: period, terms: kitaevNormalTerms(w, mu) }], period);
  return nambuDrive(normal, [[kitaevPairing(delta)]]);
}

/**
 * Driven Kitaev chain with a periodically kicked chemical potential, after
 * Thakurathi, Patel, Sen, Dutta, PRB 88, 155133 (2013):
 *     H(t) = H_Kitaev(w, Δ, μ₀) + μ₁ Σ_m δ(t − mT) Σ_R (−c†_R c_R),
 * written as a kick at t = 0 followed by the static Hamiltonian for the period T.
 */
export function kickedKitaevChain(w: number, delta: number, mu0: number, mu1: number, period: number): LatticeDrive {
  const normal = chain(
    ['c'],
    [
      { label: 'kick', duration: 0, terms: [hop(0, 0, 0, -mu1)] },
      { label: 'static', duration: period, terms: kitaevNormalTerms(w, mu0) },
    ],
    period,
  );
  return nambuDrive(normal, [[], [kitaevPairing(delta)]]);
}

/**
 * Two-step Kitaev chain: chemical potential μ₁ alone for T/2, then the Kitaev
 * hopping and pairing (w = Δ) with chemical potential μ₂ for T/2.
 */
export function twoStepKitaevChain(w: number, mu1: number, mu2: number, period: number): LatticeDrive {
  const normal = chain(
    ['c'],
    [
      { label: 'potential', duration: period / 2, terms: [hop(0, 0, 0, -mu1)] },
      { label: 'wire', duration: period / 2, terms: kitaevNormalTerms(w, mu2) },
    ],
    period,
  );
  return nambuDrive(normal, [[], [kitaevPairing(w)]]);
}
