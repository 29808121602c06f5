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
  /** Width of the arc free of states on the k grid (the indirect gap, units π/T); minimalGap ≥ arcWidth. */
  arcWidth: number;
}

/** A Chern number with the evidence of its Fukui–Hatsugai–Suzuki lattice computation. */
export interface ChernEstimate extends IntegerEstimate {
  /** Largest plaquette flux |F| on the final grid (radians); FHS is exact while every |F| < π. */
  maxPlaquetteFlux: number;
  /** The bound |F| had to stay below for convergence (radians, default π/3). */
  fluxThreshold: number;
  /** Smallest |det Ψ(k)†Ψ(k′)| over the links of the final grid (near 0: the grid cannot follow the bands). */
  minimalLinkModulus: number;
}

/** A band or group of touching bands between two open gaps, counted upward from the cut. */
export interface BandGroupReport {
  /** 0-based position counted upward in quasienergy from the cut (the gap named by `cut`). */
  index: number;
  /** Number of eigenphase branches in the group (> 1 when bands touch). */
  branches: number;
  /** Labels of the gaps below and above (units π/T); NaN when the spectrum has no open gap (then one group holds every branch). */
  gapBelow: number;
  gapAbove: number;
  /** Lowest and highest quasienergy of the group on the k grid (units π/T); lower > upper when the group runs through π. */
  range: [number, number];
  /** Smallest distance between two branches inside the group on the k grid (units π/T; Infinity for one branch). */
  minimalInternalGap: number;
  /** True when branches inside the group come closer than the gap tolerance (touching bands, grouped). */
  touching: boolean;
  /** Chern number (2D only), Fukui–Hatsugai–Suzuki. */
  chern?: ChernEstimate;
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
  /** Signed count (Σ of directions of crossings of `gap` by states on this edge), null when unsettled. */
  count: number | null;
  crossings: EdgeCrossing[];
  /** Estimated decay length of edge states in cells (fitted on the crossing states, else the bulk estimate v/(πΔ)), and the ribbon width in cells. */
  decayLength: number;
  width: number;
  settled: boolean;
  reason?: string;
}

export interface RibbonReport {
  /** Index (0 or 1) of the lattice vector along which the ribbon is finite; k∥ is the reduced momentum of the other. */
  finiteDirection: number;
  /** Ribbon width in cells, and the number of cells on each side counted as edge region. */
  width: number;
  edgeCells: number;
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
  /** True only when every input was settled and the relation holds. */
  holds: boolean;
  detail: string;
  /** True when an input was unsettled, so the relation could not be tested (then holds is false). */
  inconclusive?: boolean;
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
  /** Gap tolerance used (units π/T): a gap is open when its minimal direct gap exceeds it. */
  gapTolerance: number;
  /** The quasienergy the band groups are counted upward from (units π/T; the label of the cut gap). */
  cut: number;
  /** Largest eigen-decomposition residual ‖UV − VΛ‖_F over every momentum evaluated. */
  eigenResidual: number;
  /** Number of Floquet operators evaluated for the bulk (bands, refinement, Chern grids). */
  floquetEvaluations: number;
  /** Wall time per stage in milliseconds. */
  timings: Record<string, number>;
}
