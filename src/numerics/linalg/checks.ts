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

/**
 * Checks ‖U†U − 1‖_F ≤ tolerance·max(1, √n). With `probe`, first tests
 * |‖Ux‖² − 1| for two fixed unit vectors x (O(n²), a necessary condition since
 * x†(U†U − 1)x ≤ ‖U†U − 1‖_F) and only forms U†U (O(n³)) to report a failure.
 */
export function assertUnitary(routine: string, u: ComplexMatrix, tolerance = DEFAULT_UNITARITY_TOLERANCE, probe = false): void {
  assertSquareFinite(routine, u);
  const bound = tolerance * Math.max(1, Math.sqrt(u.rows));
  if (probe && probeDefect(u) <= bound) return;
  const defect = unitarityDefect(u);
  if (defect > bound) {
    throw new MatrixInputError(
      routine,
      `matrix is not unitary: ‖U†U − 1‖_F = ${defect.toExponential(3)} exceeds ${bound.toExponential(3)}; ` +
        'a Floquet operator must be a product of exponentials of Hermitian matrices',
    );
  }
}

/** max over two fixed unit vectors x of |‖Ux‖² − 1|, plus the largest deviation of a column norm² from 1. */
function probeDefect(u: ComplexMatrix): number {
  const n = u.rows;
  let worst = 0;
  for (let j = 0; j < n; j++) {
    let s = 0;
    for (let i = 0; i < n; i++) s += u.re[i * n + j] ** 2 + u.im[i * n + j] ** 2;
    worst = Math.max(worst, Math.abs(s - 1));
  }
  const xr = new Float64Array(n), xi = new Float64Array(n);
  for (const seed of [0.7548776662466927, 0.5698402909980532]) {
    for (let j = 0; j < n; j++) {
      const angle = 2 * Math.PI * ((seed * (j + 1) * (j + 2)) % 1);
      xr[j] = Math.cos(angle) / Math.sqrt(n);
      xi[j] = Math.sin(angle) / Math.sqrt(n);
    }
    let s = 0;
    for (let i = 0; i < n; i++) {
      let yr = 0, yi = 0;
      const row = i * n;
      for (let j = 0; j < n; j++) {
        yr += u.re[row + j] * xr[j] - u.im[row + j] * xi[j];
        yi += u.re[row + j] * xi[j] + u.im[row + j] * xr[j];
      }
      s += yr * yr + yi * yi;
    }
    worst = Math.max(worst, Math.abs(s - 1));
  }
  return worst;
}
