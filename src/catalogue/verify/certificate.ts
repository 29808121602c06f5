/**
 * Certificates as they appear in results records: the grid, gap, residual and
 * refinement evidence behind one computed number, with the tolerance each was
 * held to. Compute times are machine-dependent and live in the separate
 * timings file; a certificate names the engine stage (`stage`) to look up there.
 */
import type { IntegerEstimate } from '../../numerics/certificates.ts';

export interface GapEvidence {
  /** Gap label (units π/T). */
  gap: number;
  /** Smallest direct gap found by refinement (units π/T) and where (reduced momenta). */
  minimalGap: number;
  at: number[];
  /**
   * Certified lower bound on the minimal direct gap over the whole zone (units π/T;
   * 0 when none was shown), the Floquet operators it took, and its outcome:
   * 'above' the tolerance, a sample 'below' it, or 'undecided' (budget spent).
   */
  lowerBound: number;
  bound: 'above' | 'below' | 'undecided' | 'none';
  evaluations: number;
  /** True when the refined gap is below 1 % of the adjacent bandwidth: the point sits at or near a phase transition. */
  nearTransition: boolean;
  /** The tolerance it had to exceed (see policy.ts), and whether the lower bound did. */
  tolerance: number;
  open: boolean;
}

export interface Certificate {
  /** Final grid the number was computed on. */
  grid: number[];
  /** The real number computed before rounding (null for quantities that are not numbers). */
  raw: number | null;
  /** |raw − round raw| and the tolerance it was held to. */
  residual: number | null;
  residualTolerance: number | null;
  /** Grids and values of successive refinements, coarsest first; a label says what a step was when the grid does not. */
  refinement: { grid: number[]; value: number; label?: string }[];
  /** Gaps the number depends on. */
  gaps: GapEvidence[];
  /** Symmetry residuals (e.g. ‖ΓUΓ − U†‖) with their tolerance. */
  symmetry: { name: string; residual: number; tolerance: number }[];
  /** Engine stage whose compute time applies (key into the timings file). */
  stage: string;
  /** Plain-language remarks: why unsettled, what was assumed. */
  notes: string[];
}

export function emptyCertificate(stage: string): Certificate {
  return { grid: [], raw: null, residual: null, residualTolerance: null, refinement: [], gaps: [], symmetry: [], stage, notes: [] };
}

export function certificateFromEstimate(estimate: IntegerEstimate, stage: string): Certificate {
  return {
    grid: [...estimate.grid],
    raw: estimate.raw,
    residual: estimate.residual,
    residualTolerance: estimate.tolerance,
    refinement: estimate.history.map((step) => ({ grid: [...step.grid], value: step.value, ...(step.label !== undefined ? { label: step.label } : {}) })),
    gaps: [],
    symmetry: [],
    stage,
    notes: estimate.caveat ? [estimate.caveat] : [],
  };
}
