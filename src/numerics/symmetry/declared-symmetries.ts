/**
 * Every symmetry operator a model declares, checked on the drive: the
 * residuals of its Hamiltonian and Floquet-operator relations
 * (symmetry-residuals.ts), for chains and sheets alike, and the
 * Altland–Zirnbauer class the declared operators define (altland-zirnbauer.ts).
 */
import type { LatticeDrive } from '../evolution/drive.ts';
import type { PropagatorOptions } from '../evolution/propagator.ts';
import type { SymmetryReport } from '../portrait.ts';
import type { DeclaredOperators } from './altland-zirnbauer.ts';
import { chiralResidual, particleHoleResidual, timeReversalResidual } from './symmetry-residuals.ts';
import type { SymmetryResidual } from './symmetry-residuals.ts';

export function declaredSymmetryReports(drive: LatticeDrive, ops: DeclaredOperators, tolerance: number, propagator?: PropagatorOptions): SymmetryReport[] {
  const residuals: SymmetryResidual[] = [];
  if (ops.chiral) residuals.push(chiralResidual(drive, ops.chiral, tolerance, propagator));
  if (ops.particleHole) residuals.push(particleHoleResidual(drive, ops.particleHole.unitary, tolerance, propagator));
  if (ops.timeReversal) residuals.push(timeReversalResidual(drive, ops.timeReversal.unitary, tolerance, propagator));
  return residuals.map((r) => ({
    symmetry: r.symmetry,
    hamiltonianResidual: r.hamiltonian,
    floquetResidual: r.floquet,
    ...(r.frameTime !== undefined ? { frameTime: r.frameTime } : {}),
    tolerance: r.tolerance,
    holds: r.holds,
  }));
}
