/**
 * Tolerances behind every verdict. A numerical check is evidence, not proof:
 * these numbers decide when the evidence is strong enough to confirm or
 * contradict a claim, and each one is written into the certificate of the
 * verdicts it affected.
 */
export interface VerdictPolicy {
  /**
   * Hard lower limit of the gap tolerance (units π/T): no model setting can
   * make a smaller gap count as open. 10⁻⁵ π/T is ten times the distance below
   * which the winding integral treats a gap as closed (10⁻⁶), and a thousand
   * times the time-integration tolerance derived for it (propagator.ts), so
   * eigenphase errors stay far below the gap they would have to close.
   */
  gapFloor: number;
  /** Gap tolerance (units π/T) when neither the engine nor the model sets one. */
  defaultGapTolerance: number;
  /** Accept an integer only if the last two refinement steps round to the same value. */
  requireStableRefinement: boolean;
  /** Largest |x − round x| accepted when the engine's own estimate carries no tolerance. */
  defaultResidualTolerance: number;
  /** Largest symmetry residual (‖ΓUΓ − U†‖ and similar) for a symmetry-protected invariant. */
  symmetryTolerance: number;
}

/** The hard lower limit of numerics.tolerances.gap (schemas/model/numerics.json enforces the same number). */
export const GAP_TOLERANCE_LIMIT = 1e-5;

export const DEFAULT_POLICY: VerdictPolicy = {
  gapFloor: GAP_TOLERANCE_LIMIT,
  defaultGapTolerance: 1e-3,
  requireStableRefinement: true,
  defaultResidualTolerance: 0.05,
  symmetryTolerance: 1e-8,
};

/**
 * The tolerance a gap must exceed: the engine's (the model's numerics.tolerances.gap,
 * else the default 10⁻³ π/T), never below the hard limit. Openness is judged on
 * the certified lower bound of the minimal direct gap (portrait.ts, GapCertificate),
 * so the grid spacing no longer enters.
 */
export function gapTolerance(policy: VerdictPolicy, engineTolerance: number | undefined): number {
  return Math.max(policy.gapFloor, engineTolerance ?? policy.defaultGapTolerance);
}
