/**
 * Certificates: every number the engine reports comes with the evidence behind it.
 * A numerical check is evidence, not proof; these records say how strong it is.
 */

/** One step of a refinement: the grid used and the value obtained on it. */
export interface RefinementStep {
  /** Grid sizes, e.g. [n1, n2] for a k grid or [n1, n2, nt] with time slices; [evaluations] for adaptive quadrature. */
  grid: number[];
  value: number;
  /** What the step was, when a grid does not say it ("12 150 evaluations, 54 cells"). */
  label?: string;
}

/** A quantity that should be an integer (Chern number, winding number, edge count, Z₂ index). */
export interface IntegerEstimate {
  /** The real number actually computed. */
  raw: number;
  /** round(raw). Only meaningful when `converged`. */
  nearest: number;
  /** |raw − nearest|. */
  residual: number;
  /** The tolerance on `residual` that refinement aimed for. */
  tolerance: number;
  /** True when residual ≤ tolerance and the nearest integer was stable over the last refinement steps. */
  converged: boolean;
  /** Final grid. */
  grid: number[];
  history: RefinementStep[];
  /** Why the value is not trustworthy, when it is not (gap closed, did not converge, …). */
  caveat?: string;
}

export function integerEstimate(
  raw: number,
  tolerance: number,
  grid: number[],
  history: RefinementStep[],
  stable = true,
  caveat?: string,
): IntegerEstimate {
  const nearest = Math.round(raw) + 0; // + 0 turns −0 into 0
  const residual = Math.abs(raw - nearest);
  const converged = Number.isFinite(raw) && residual <= tolerance && stable && caveat === undefined;
  const estimate: IntegerEstimate = { raw, nearest, residual, tolerance, converged, grid, history };
  if (caveat !== undefined) estimate.caveat = caveat;
  return estimate;
}
