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
  /** Smallest direct gap found (units π/T) and where (reduced momenta). */
  minimalGap: number;
  at: number[];
  /** The tolerance it had to exceed (see policy.ts), and whether it did. */
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
  /** Grids and values of successive refinements, coarsest first. */
  refinement: { grid: number[]; value: number }[];
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
    refinement: estimate.history.map((step) => ({ grid: [...step.grid], value: step.value })),
    gaps: [],
    symmetry: [],
    stage,
    notes: estimate.caveat ? [estimate.caveat] : [],
  };
}
