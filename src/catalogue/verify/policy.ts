/**
 * Tolerances behind every verdict. A numerical check is evidence, not proof:
 * these numbers decide when the evidence is strong enough to confirm or
 * contradict a claim, and each one is written into the certificate of the
 * verdicts it affected.
 */
export interface VerdictPolicy {
  /** Smallest quasienergy gap (units π/T) we ever accept as open, whatever the grid. */
  gapFloor: number;
  /**
   * The sampled minimal gap can overestimate the true one by about
   * (band velocity) × (grid spacing): between two k points a band can move by
   * that much. A gap counts as open only if it exceeds
   *   max(gapFloor, velocitySafety · v · Δs),
   * v = π · (width of the adjacent band groups) in units π/T per unit of
   * reduced momentum (the steepest slope of a cosine band of that width) and
   * Δs = 1 / (smallest grid size). When an engine reports the band velocity
   * itself (chains), that value replaces the estimate. This keeps a
   * near-critical model from being confirmed by luck on a coarse grid.
   */
  velocitySafety: number;
  /** Accept an integer only if the last two refinement steps round to the same value. */
  requireStableRefinement: boolean;
  /** Largest |x − round x| accepted when the engine's own estimate carries no tolerance. */
  defaultResidualTolerance: number;
  /** Largest symmetry residual (‖ΓUΓ − U†‖ and similar) for a symmetry-protected invariant. */
  symmetryTolerance: number;
}

export const DEFAULT_POLICY: VerdictPolicy = {
  gapFloor: 1e-3,
  velocitySafety: 0.5,
  requireStableRefinement: true,
  defaultResidualTolerance: 0.05,
  symmetryTolerance: 1e-8,
};

/** The gap tolerance for a given adjacent band width (units π/T) and grid. */
export function gapTolerance(policy: VerdictPolicy, adjacentWidth: number, grid: number[]): number {
  const n = grid.length === 0 ? 1 : Math.min(...grid);
  const velocity = Math.PI * Math.max(0, adjacentWidth);
  return Math.max(policy.gapFloor, (policy.velocitySafety * velocity) / Math.max(1, n));
}
