/**
 * Boundary checks shared by the decompositions: each routine validates its input
 * once, with a message that names the routine, the offending entry and the
 * measured defect, so a caller can tell bad input from a numerical failure.
 */
import type { ComplexMatrix } from './complex-matrix.ts';
import { firstNonFinite, frobeniusNorm, hermiticityDefect, unitarityDefect } from './complex-matrix.ts';

/** Raised for input a decomposition cannot accept (shape, NaN/∞, symmetry). */
export class MatrixInputError extends RangeError {
  constructor(routine: string, message: string) {
    super(`${routine}: ${message}`);
    this.name = 'MatrixInputError';
  }
}

export function assertSquareFinite(routine: string, a: ComplexMatrix): void {
  if (a.rows !== a.cols) throw new MatrixInputError(routine, `matrix is ${a.rows}×${a.cols}, expected a square matrix`);
  const bad = firstNonFinite(a);
  if (bad !== undefined) {
    const p = bad[0] * a.cols + bad[1];
    throw new MatrixInputError(
      routine,
      `entry (${bad[0]}, ${bad[1]}) is not finite (${a.re[p]} + ${a.im[p]}i); check the inputs that produced this matrix`,
    );
  }
}

/** Default relative tolerance on ‖A − A†‖_F / max(1, ‖A‖_F). */
export const DEFAULT_HERMITICITY_TOLERANCE = 1e-10;
/** Default tolerance on ‖U†U − 1‖_F / max(1, √n). */
export const DEFAULT_UNITARITY_TOLERANCE = 1e-8;

export function assertHermitian(routine: string, a: ComplexMatrix, tolerance = DEFAULT_HERMITICITY_TOLERANCE): void {
  assertSquareFinite(routine, a);
  const defect = hermiticityDefect(a);
  const scale = Math.max(1, frobeniusNorm(a));
  if (defect > tolerance * scale) {
    const n = a.rows;
    let worst = 0, wi = 0, wj = 0;
    for (let i = 0; i < n; i++) {
      for (let j = 0; j <= i; j++) {
        const d = Math.hypot(a.re[i * n + j] - a.re[j * n + i], a.im[i * n + j] + a.im[j * n + i]);
        if (d > worst) [worst, wi, wj] = [d, i, j];
      }
    }
    throw new MatrixInputError(
      routine,
      `matrix is not Hermitian: ‖A − A†‖_F = ${defect.toExponential(3)} exceeds ${tolerance.toExponential(1)}·max(1, ‖A‖_F) = ${(tolerance * scale).toExponential(3)}; ` +
        `largest mismatch |A[${wi}][${wj}] − conj(A[${wj}][${wi}])| = ${worst.toExponential(3)}`,
    );
  }
}

export function assertUnitary(routine: string, u: ComplexMatrix, tolerance = DEFAULT_UNITARITY_TOLERANCE): void {
  assertSquareFinite(routine, u);
  const defect = unitarityDefect(u);
  const bound = tolerance * Math.max(1, Math.sqrt(u.rows));
  if (defect > bound) {
    throw new MatrixInputError(
      routine,
      `matrix is not unitary: ‖U†U − 1‖_F = ${defect.toExponential(3)} exceeds ${bound.toExponential(3)}; ` +
        'a Floquet operator must be a product of exponentials of Hermitian matrices',
    );
  }
}
