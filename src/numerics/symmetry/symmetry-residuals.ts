/**
 * Residuals of declared symmetries of a driven chain or sheet (units: Frobenius norm
 * relative to max(1, ‖H‖_F)); a claim resting on a symmetry whose residual
 * exceeds the tolerance is reported as "symmetry broken" with the residual.
 *
 * - chiral Γ: the best symmetric-frame residual max ‖Γ H(t₀+τ) Γ† + H(t₀−τ)‖
 *   (symmetric-frames.ts) and, in that frame, ‖Γ U Γ† − U†‖;
 * - particle–hole C = U_C K, instantaneous: ‖U_C H(k, t)* U_C† + H(−k, t)‖,
 *   and for the Floquet operator ‖U_C U(k)* U_C† − U(−k)‖;
 * - time reversal T = U_T K, reflecting time about a frame t₀:
 *   ‖U_T H(k, t₀+τ)* U_T† − H(−k, t₀−τ)‖, and in that frame
 *   ‖U_T U(k)* U_T† − U(−k)†‖.
 */
import type { ComplexMatrix } from '../linalg/complex-matrix.ts';
import type { LatticeDrive } from '../evolution/drive.ts';
import type { PropagatorOptions } from '../evolution/propagator.ts';
import { adjoint, multiply, frobeniusNorm, distance, zeros } from '../linalg/complex-matrix.ts';
import { floquetOperator } from '../evolution/propagator.ts';
import { prepareBloch } from '../evolution/bloch.ts';
import { segmentStartTimes } from '../evolution/drive.ts';
import { checkMomenta, mirrorMomentum } from './reflection-residual.ts';
import type { ReflectionRelation } from './reflection-residual.ts';
import { chiralRelation, findSymmetricFrames } from './symmetric-frames.ts';
import { shiftTimeOrigin } from '../evolution/time-shift.ts';

export interface SymmetryResidual {
  symmetry: 'chiral' | 'particle-hole' | 'time-reversal';
  /** Residual of the Hamiltonian relation (relative, see above). */
  hamiltonian: number;
  /** Residual of the Floquet-operator relation (absolute Frobenius norm, max over the check momenta). */
  floquet: number;
  /** Frame time used (chiral, time reversal), absolute units. */
  frameTime?: number;
  tolerance: number;
  holds: boolean;
}

/** ‖Γ U Γ† − U†‖_F. */
export function chiralFloquetDefect(u: ComplexMatrix, gamma: ComplexMatrix): number {
  const g = multiply(multiply(gamma, u), adjoint(gamma));
  const n = u.rows;
  let s = 0;
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      const dr = g.re[i * n + j] - u.re[j * n + i], di = g.im[i * n + j] + u.im[j * n + i];
      s += dr * dr + di * di;
    }
  }
  return Math.sqrt(s);
}

export function conjugateBy(u: ComplexMatrix, h: ComplexMatrix, conjugate: boolean): ComplexMatrix {
  const x = conjugate ? { rows: h.rows, cols: h.cols, re: h.re, im: h.im.map((v) => -v) } : h;
  return multiply(multiply(u, x), adjoint(u));
}

export function timeReversalRelation(ut: ComplexMatrix): ReflectionRelation {
  return { transform: (h) => conjugateBy(ut, h, true), sign: 1, reverseMomentum: true };
}

export function chiralResidual(drive: LatticeDrive, gamma: ComplexMatrix, tolerance = 1e-10, propagator?: PropagatorOptions): SymmetryResidual {
  const search = findSymmetricFrames(drive, chiralRelation(gamma), { tolerance });
  const t0 = search.frames[0] ?? search.bestCandidate;
  const rotated = shiftTimeOrigin(drive, t0);
  let floquet = 0;
  for (const s of checkMomenta(drive.dimension)) floquet = Math.max(floquet, chiralFloquetDefect(floquetOperator(rotated, s, propagator).operator, gamma));
  return { symmetry: 'chiral', hamiltonian: search.residual, floquet, frameTime: t0, tolerance, holds: search.residual <= tolerance && floquet <= 1e3 * tolerance };
}

export function particleHoleResidual(drive: LatticeDrive, uc: ComplexMatrix, tolerance = 1e-10, propagator?: PropagatorOptions): SymmetryResidual {
  const starts = segmentStartTimes(drive);
  let worst = 0, scale = 0, floquet = 0;
  for (const s of checkMomenta(drive.dimension)) {
    const here = prepareBloch(drive, s);
    const there = prepareBloch(drive, mirrorMomentum(s));
    drive.segments.forEach((seg, i) => {
      const times = seg.duration === 0 ? [starts[i]] : [0.21, 0.5, 0.77].map((f) => starts[i] + f * seg.duration);
      for (const t of times) {
        const a = here.segmentAt(i, t), b = there.segmentAt(i, t);
        scale = Math.max(scale, frobeniusNorm(a));
        const x = conjugateBy(uc, a, true);
        let d = 0;
        for (let p = 0; p < x.re.length; p++) d += (x.re[p] + b.re[p]) ** 2 + (x.im[p] + b.im[p]) ** 2;
        worst = Math.max(worst, Math.sqrt(d));
      }
    });
    const u = floquetOperator(drive, s, propagator).operator;
    const um = floquetOperator(drive, mirrorMomentum(s), propagator).operator;
    floquet = Math.max(floquet, distance(conjugateBy(uc, u, true), um));
  }
  const hamiltonian = worst / Math.max(1, scale);
  return { symmetry: 'particle-hole', hamiltonian, floquet, tolerance, holds: hamiltonian <= tolerance && floquet <= 1e3 * tolerance };
}

export function timeReversalResidual(drive: LatticeDrive, ut: ComplexMatrix, tolerance = 1e-10, propagator?: PropagatorOptions): SymmetryResidual {
  const search = findSymmetricFrames(drive, timeReversalRelation(ut), { tolerance });
  const t0 = search.frames[0] ?? search.bestCandidate;
  const rotated = shiftTimeOrigin(drive, t0);
  let floquet = 0;
  for (const s of checkMomenta(drive.dimension)) {
    const u = floquetOperator(rotated, s, propagator).operator;
    const um = floquetOperator(rotated, mirrorMomentum(s), propagator).operator;
    floquet = Math.max(floquet, distance(conjugateBy(ut, u, true), adjoint(um)));
  }
  return { symmetry: 'time-reversal', hamiltonian: search.residual, floquet, frameTime: t0, tolerance, holds: search.residual <= tolerance && floquet <= 1e3 * tolerance };
}

/** Γ = U_T U_C*, scaled by a phase so that Γ² = 1 (chiral symmetry as the product of time reversal and particle–hole). */
export function chiralFromTimeReversalAndParticleHole(ut: ComplexMatrix, uc: ComplexMatrix): ComplexMatrix {
  const ucConj = { rows: uc.rows, cols: uc.cols, re: uc.re, im: uc.im.map((v) => -v) };
  const g = multiply(ut, ucConj);
  const g2 = multiply(g, g);
  // Γ² = e^{iα} 1 for a genuine chiral operator; divide by e^{iα/2}.
  const alpha = Math.atan2(g2.im[0], g2.re[0]);
  const out = zeros(g.rows, g.cols);
  const cr = Math.cos(-alpha / 2), ci = Math.sin(-alpha / 2);
  for (let p = 0; p < g.re.length; p++) {
    out.re[p] = g.re[p] * cr - g.im[p] * ci;
    out.im[p] = g.re[p] * ci + g.im[p] * cr;
  }
  return out;
}
