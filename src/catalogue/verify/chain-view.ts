/**
 * What chain verdicts need from the one-dimensional engine, in one shape.
 * `fromChainPortrait` (chain-adapter.ts) fills it from the engine's ChainPortrait;
 * tests fill it by hand.
 */
import type { IntegerEstimate } from '../../numerics/certificates.ts';
import type { BandGroupReport, ConsistencyCheck, GapReport } from '../../numerics/portrait.ts';
import type { SymmetryClassReport } from '../../numerics/symmetry/altland-zirnbauer.ts';

export interface ChainInvariant {
  /** Gap label (units π/T): 0 for ν₀, 1 for ν_π. */
  gap: number;
  /** Integer winding (chiral classes) or Z₂ index 0/1 (class D). */
  kind: 'winding' | 'z2';
  estimate: IntegerEstimate;
  /** Symmetry relations the invariant rests on, with residuals and tolerances. */
  symmetry: { name: string; residual: number; tolerance: number }[];
  /** The Altland–Zirnbauer class the declared operators define (absent from hand-made views). */
  symmetryClass?: SymmetryClassReport;
  /** True when the value is not refined on grids but decided by a sign with a margin (Pfaffian signs). */
  signDecided?: boolean;
  /** True for ν₀, ν_π computed from the frame windings: their stability under refinement is that of the frames. */
  fromFrames?: boolean;
  /** How a chiral invariant was computed, in words, for the certificate. */
  method?: string;
}

export interface FrameWinding {
  /** Start time t₀ of the symmetric frame. */
  time: number;
  /** "first" (ν′) or "second" (ν″) frame, in the order the file lists symmetricTimes. */
  name: 'first' | 'second';
  estimate: IntegerEstimate;
}

export interface EndModeCount {
  gap: number;
  /** Modes at this quasienergy bound to each end, null when unsettled. */
  count: number | null;
  settled: boolean;
  reason?: string;
  chainLength: number;
  decayLength: number;
}

export interface ChainView {
  grid: number[];
  gaps: GapReport[];
  bands: BandGroupReport[];
  invariants: ChainInvariant[];
  frames: FrameWinding[];
  /** Which symmetric frames were used and where they come from (the model's symmetricTimes or the engine's search). */
  frameNotes?: string[];
  endModes: EndModeCount[];
  /**
   * End-mode counts of a second, longer open chain (verify-model.ts recomputes
   * them at 1.5× the length): a count is settled only when both lengths agree.
   */
  checkEndModes?: EndModeCount[];
  openChain: { length: number; quasienergies: number[]; lowEdgeWeight: number[]; highEdgeWeight: number[] } | null;
  /**
   * Residuals of the declared symmetries with their tolerance, two per symmetry:
   * the Hamiltonian relation and the Floquet-operator relation. Each name starts
   * with the symmetry ("chiral", "particle-hole", "time-reversal") followed by
   * " symmetry of H(t)…" or " symmetry of the Floquet operator".
   */
  symmetry: { name: string; residual: number; tolerance: number }[];
  /** The Altland–Zirnbauer class the declared operators define (absent from hand-made views). */
  symmetryClass?: SymmetryClassReport;
  /** Why the engine computed no 0/π invariant although a symmetry is declared (e.g. no symmetric time frame), when it says. */
  invariantNote?: string;
  consistency: ConsistencyCheck[];
  propagatorAccuracy: number | null;
  /** The engine's gap tolerance (units π/T). */
  gapTolerance?: number;
  /** Width of the bands next to the gaps (units π/T), to tell a gap small against it. */
  bandwidth?: number;
  timings: Record<string, number>;
}
