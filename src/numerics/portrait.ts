/**
 * What the engine computes for one model at one parameter point: its "portrait".
 * The verification pipeline (src/catalogue) compares claims against these records;
 * the site presents them. Quasienergies are in units of π/T throughout, in (−1, 1].
 *
 * Field names here are a contract between numerics and catalogue: change them
 * together with their users.
 */
import type { IntegerEstimate } from './certificates.ts';
import type { SymmetryClassReport } from './symmetry/altland-zirnbauer.ts';

/**
 * The certified lower bound of a minimal direct gap (certified-minimum.ts): the
 * true minimum over the zone lies in [lower, minimalGap], up to the stated
 * evaluation margin, when `status` is 'above' or 'below'.
 */
export interface GapCertificate {
  /** Lower bound on the minimal direct gap over the whole zone (units π/T; 0 when none could be shown). */
  lower: number;
  /** 'above': lower > decisionLevel (open); 'below': a sample at or below it; 'undecided': the evaluation budget ran out in between. */
  status: 'above' | 'below' | 'undecided';
  /** Floquet operators evaluated by the bound, and cells examined (coarse grid included). */
  evaluations: number;
  cells: number;
  /** Lipschitz constants of the direct gap per direction (units π/T per unit of reduced momentum), from the drive's terms. */
  lipschitz: number[];
  /** Error allowed for one evaluation (twice the time-integration bound, units π/T). */
  margin: number;
  /** The gap tolerance the bound was decided against (units π/T). */
  decisionLevel: number;
}

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
  /** Whether the gap counts as open: the certified lower bound of the minimal direct gap exceeds the gap tolerance. */
  open: boolean;
  /** Width of the arc free of states on the k grid (the indirect gap, units π/T); minimalGap ≥ arcWidth. */
  arcWidth: number;
  /** The certified lower bound behind `open` (absent from hand-made reports). */
  certified?: GapCertificate;
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

/** How a gap winding number was integrated (sheet/winding/gap-winding.ts). */
export interface WindingQuadrature {
  /** Winding densities evaluated (momenta, each integrated over the time loop), time-rule checks included. */
  evaluations: number;
  /** Cells of the final adaptive mesh, and of the graded first mesh. */
  cells: number;
  meshCells: number;
  /** Summed |Kronrod − Gauss| estimate of the momentum quadrature (units of W). */
  errorEstimate: number;
  /** The value before rounding. */
  raw: number;
  /** Gauss–Legendre nodes over the whole loop, and the largest relative change of the density when one more node per piece was added. */
  timeNodes: number;
  timeRuleChange: number;
  /** Smallest distance from the cut to the spectrum met by the mesh (units π/T), and where. */
  minimalDistance: number;
  momentumAtMinimum: [number, number];
}

export interface WindingReport {
  /** Gap label (units π/T). */
  gap: number;
  /** Rudner–Lindner–Berg–Levin winding number W[U_ε]. */
  winding: IntegerEstimate;
  /** Present when the integral was computed (the gap open at the cut). */
  quadrature?: WindingQuadrature;
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
  /** Declared symmetries with residuals (empty when none is declared). */
  symmetries: SymmetryReport[];
  /** The Altland–Zirnbauer class the declared operators define. */
  symmetryClass: SymmetryClassReport;
  /** Wall time per stage in milliseconds. */
  timings: Record<string, number>;
}

/** A quasienergy gap of a chain at 0 or π/T (see src/numerics/chain/bulk-gaps.ts). */
export interface ChainGapReport {
  /** 0 or 1 (units π/T). */
  label: 0 | 1;
  /**
   * Minimal direct gap over k (units π/T): the smallest distance between the two
   * eigenphases bounding the label; 2 × clearance when the gap is closed.
   */
  minimalGap: number;
  /** Reduced momentum where the minimal direct gap occurs. */
  momentumAtMinimum: number;
  /** Edges of the arc free of bulk states around the label (units π/T) and its width (the indirect gap). */
  lower: number;
  upper: number;
  arcWidth: number;
  /** Distance from the label to the nearest bulk quasienergy over k (units π/T), and where. */
  clearance: number;
  clearanceMomentum: number;
  /** clearance > gapTolerance and the certified lower bound of the minimal direct gap above the gap tolerance. */
  open: boolean;
  /** Decay length estimate v_max / clearance of end states (cells; Infinity when closed). */
  decayLengthEstimate: number;
  /** The certified lower bound of the minimal direct gap; `open` also needs it above the tolerance. */
  certified?: GapCertificate;
}

/** A declared symmetry and how well the drive satisfies it (chains and sheets). */
export interface SymmetryReport {
  symmetry: 'chiral' | 'particle-hole' | 'time-reversal';
  /** Relative residual of the Hamiltonian relation, ‖…‖_F / max(1, ‖H‖_F), max over checked times and momenta. */
  hamiltonianResidual: number;
  /** Absolute residual of the Floquet-operator relation (in the symmetric frame where one applies). */
  floquetResidual: number;
  /** Frame time the relation was checked about (absolute units), for chiral and time reversal. */
  frameTime?: number;
  tolerance: number;
  /** False: the symmetry is broken ("symmetry broken" for any claim resting on it). */
  holds: boolean;
}

export type ChainSymmetryReport = SymmetryReport;

/** The winding of one symmetric time frame. */
export interface ChainFrameReport {
  /** Frame start t₀ (absolute units). */
  frameTime: number;
  /** Winding of det h(k) of the chiral block of H_eff (cut at π/T) in this frame. */
  winding: IntegerEstimate;
  /** Momenta in the adaptive grid and the largest phase step on it (radians, must be < π/4). */
  points: number;
  maxStepPhase: number;
  /** min |det h| / max |det h| over the grid: small means a gap closes on the loop. */
  modulusRatio: number;
  /** max_k ‖Γ U Γ† − U†‖_F in this frame. */
  floquetResidual: number;
}

/** ν₀ and ν_π from the half-period evolution F = U(t₀ + T/2, t₀) of the first frame (chain/half-period-winding.ts). */
export interface ChainHalfPeriodReport {
  frameTime: number;
  /** Winding of det c (Γ = −1 rows, +1 columns of F): needs only the gap at 0 open. */
  zero: IntegerEstimate;
  /** Winding of det a (Γ = +1 block of F): needs only the gap at π/T open. */
  pi: IntegerEstimate;
  /** min |det| / max |det| of each block over the loop: small where that gap nearly closes. */
  zeroModulusRatio: number;
  piModulusRatio: number;
}

/** Chiral invariants (AIII, BDI): ν₀ = (ν′ + ν″)/2, ν_π = (ν′ − ν″)/2 (Asbóth & Obuse 2013), and the half-period invariants. */
export interface ChainChiralReport {
  /** 'computed', or why not: no symmetric time frame, Γ with unequal ±1 eigenspaces, or a declared first frame that is not symmetric. */
  status: 'computed' | 'no-symmetric-frame' | 'unbalanced-chiral-operator' | 'declared-frame-not-symmetric';
  /** Where Γ comes from: declared, or built as U_T U_C* from time reversal and particle–hole. */
  source: 'declared' | 'time-reversal × particle-hole';
  /** Whether the frames are the model's symmetricTimes (first listed defines ν′) or found by the engine. */
  frameSource: 'declared' | 'found';
  /** Which frames were used, in words. */
  frameNotes: string[];
  frames: ChainFrameReport[];
  /** Residual of the best candidate frame and its tolerance (also when none was found). */
  frameResidual: number;
  frameTolerance: number;
  zero?: IntegerEstimate;
  pi?: IntegerEstimate;
  halfPeriod?: ChainHalfPeriodReport;
  reason?: string;
}

/** Class D Z₂ invariants at 0 and π (src/numerics/chain/majorana-z2.ts). */
export interface ChainMajoranaReport {
  status: 'computed' | 'not-nambu' | 'too-many-orbitals';
  /** −1: odd number of Majorana end modes at that quasienergy; null when unsettled. */
  zero: 1 | -1 | null;
  pi: 1 | -1 | null;
  /** Margins the signs rest on (|Pf| and |Tr Û|/2ⁿ products) and their tolerance. */
  zeroMargin: number;
  piMargin: number;
  tolerance: number;
  /** Per particle–hole symmetric momentum: Tr Û/2ⁿ, Pf[(U_M − U_Mᵀ)/2], ‖Im U_M‖_F, lift consistency. */
  momenta: { momentum: number; spinTrace: number; pfaffian: number; realityDefect: number; liftConsistency: number }[];
  reason?: string;
}

/** End modes of an open chain in the gap at 0 or π. */
export interface ChainEndModes {
  label: 0 | 1;
  /** Modes per end (rounded end weights); null when unsettled. */
  low: number | null;
  high: number | null;
  /** Summed weights in the end regions (what the counts round). */
  lowWeight: number;
  highWeight: number;
  /** Fitted amplitude decay lengths at each end (cells) and rms residual of the fit of ln ρ. */
  lowDecayLength: number | null;
  highDecayLength: number | null;
  fitResidual: number;
  /** Quasienergies of the end states (units π/T) and the window half-width used. */
  quasienergies: number[];
  window: number;
  settled: boolean;
  reason?: string;
}

export interface ChainOpenReport {
  /** Chain length (cells), end-region size (cells), and whether the default length reached 10 decay lengths. */
  cells: number;
  edgeCells: number;
  lengthSufficient: boolean;
  modes: ChainEndModes[];
  /** ‖UV − VΛ‖_F of the open-chain eigen-decomposition. */
  eigenResidual: number;
  /** Every quasienergy of the open chain (units π/T), ascending. */
  quasienergies: number[];
  /** Weight of each state (order of `quasienergies`) in the first and the last `edgeCells` cells. */
  lowEdgeWeight: number[];
  highEdgeWeight: number[];
}

export interface ChainPortrait {
  kind: 'chain';
  /** Gaps at 0 and at π (in that order), with the uniform k grid size used. */
  gaps: ChainGapReport[];
  gapGrid: number;
  /** Largest band velocity max |dε/dk| on the gap grid (units π/T per radian of k). */
  velocity: number;
  /** Declared symmetries with residuals. */
  symmetries: ChainSymmetryReport[];
  /** The Altland–Zirnbauer class the declared operators define. */
  symmetryClass: SymmetryClassReport;
  /** Present when a chiral operator is declared or derivable (time reversal and particle–hole both declared). */
  chiral?: ChainChiralReport;
  /** Present when particle–hole symmetry is declared. */
  majorana?: ChainMajoranaReport;
  /** Winding of det U(k, T): 0 for every Hamiltonian drive (a consistency check). */
  determinantWinding: IntegerEstimate;
  /** Absent when the open chain was not asked for (sweep points map bulk quantities only). */
  openChain?: ChainOpenReport;
  /** Bulk–end relations: |ν₀|, |ν_π| (or the Z₂ parities) against the end-mode counts. */
  consistency: ConsistencyCheck[];
  /** Largest accuracy estimate reported by the time integration (eigenphase units). */
  propagatorAccuracy: number;
  /** Wall time per stage in milliseconds. */
  timings: Record<string, number>;
}
