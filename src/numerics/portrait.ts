/**
 * What the engine computes for one model at one parameter point: its "portrait".
 * The verification pipeline (src/catalogue) compares claims against these records;
 * the site presents them. Quasienergies are in units of π/T throughout, in (−1, 1].
 *
 * Field names here are a contract between numerics and catalogue: change them
 * together with their users.
 */
import type { IntegerEstimate } from './certificates.ts';

/** A quasienergy gap: an arc of the quasienergy circle containing no bulk state on the grid. */
export interface GapReport {
  /** The quasienergy that names the gap: the claimed label when it falls inside, else the arc's midpoint (units π/T). */
  label: number;
  /** Lower and upper edge of the arc (units π/T); for the arc through π the lower edge is > upper. */
  lower: number;
  upper: number;
  /** Smallest direct gap over the k grid (units π/T) and where it occurs (reduced momenta). */
  minimalGap: number;
  momentumAtMinimum: number[];
  /** Whether the gap counts as open: minimalGap above the gap tolerance. */
  open: boolean;
}

/** A band or group of touching bands between two open gaps, counted upward from the cut. */
export interface BandGroupReport {
  /** 0-based position counted upward in quasienergy from the cut (the gap named by `cut`). */
  index: number;
  /** Number of eigenphase branches in the group (> 1 when bands touch). */
  branches: number;
  /** Labels of the gaps below and above (units π/T). */
  gapBelow: number;
  gapAbove: number;
  /** Quasienergy range covered (units π/T). */
  range: [number, number];
  /** Chern number (2D only), Fukui–Hatsugai–Suzuki. */
  chern?: IntegerEstimate;
}

export interface WindingReport {
  /** Gap label (units π/T). */
  gap: number;
  /** Rudner–Lindner–Berg–Levin winding number W[U_ε]. */
  winding: IntegerEstimate;
}

/** A crossing of a gap by an edge-localised ribbon state. */
export interface EdgeCrossing {
  /** Reduced momentum along the edge. */
  momentum: number;
  /** Sign of dε/dk_∥ at the crossing. */
  direction: 1 | -1;
  /** Weight of the state within the edge region. */
  weight: number;
}

export interface EdgeCountReport {
  /** Gap label (units π/T). */
  gap: number;
  /** Which edge: "low" = the edge at the first cell of the finite direction, "high" = the last. */
  edge: 'low' | 'high';
  /** Signed count (Σ of directions), null when unsettled. */
  count: number | null;
  crossings: EdgeCrossing[];
  /** Estimated decay length of edge states in cells, and the ribbon width in cells. */
  decayLength: number;
  width: number;
  settled: boolean;
  reason?: string;
}

export interface RibbonReport {
  /** Index (0 or 1) of the lattice vector along which the ribbon is finite. */
  finiteDirection: number;
  width: number;
  /** Momenta along the edge (reduced) and quasienergies per momentum (units π/T). */
  momenta: number[];
  quasienergies: number[][];
  /** Weight of each state on the low and high edge regions, per momentum. */
  lowEdgeWeight: number[][];
  highEdgeWeight: number[][];
  counts: EdgeCountReport[];
}

/** A relation between computed invariants that must hold; failures are reported, never smoothed over. */
export interface ConsistencyCheck {
  name: string;
  holds: boolean;
  detail: string;
}

export interface SheetPortrait {
  kind: 'sheet';
  /** The k grid the band structure was sampled on. */
  grid: number[];
  gaps: GapReport[];
  bands: BandGroupReport[];
  windings: WindingReport[];
  ribbons: RibbonReport[];
  consistency: ConsistencyCheck[];
  /** Accuracy of the time integration: largest change of quasienergies under refinement (units π/T). */
  propagatorAccuracy: number;
  /** Wall time per stage in milliseconds. */
  timings: Record<string, number>;
}
