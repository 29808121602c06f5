/* Generated from schemas/model.schema.json by scripts/generate-model-types.mjs. Do not edit by hand: run `npm run gen:types`. */

/**
 * Kebab-case identifier equal to the file name without .json.
 */
export type ModelId = string;
/**
 * Free keywords for browsing and search, kebab-case (e.g. "anomalous", "chern-insulator").
 *
 * @maxItems 32
 *
 * Items: One keyword.
 */
export type ProvenanceTags = string[];
/**
 * Who answers for this entry: free text, e.g. "R. Okafor (Lantern Lab)".
 *
 * @minItems 1
 * @maxItems 32
 *
 * Items: One maintainer.
 */
export type ProvenanceMaintainers = string[];
/**
 * Free-text remark (Markdown allowed).
 */
export type Note = string;
/**
 * Publications the model and its claims come from.
 *
 * @maxItems 64
 */
export type ProvenanceReferences = Reference[];
/**
 * A real number, or an arithmetic expression over parameters as a string (e.g. "J*T/4", "2*pi/omega", "-sqrt(3)/2").
 */
export type Quantity = number | string;
/**
 * A short identifier: a letter, then letters, digits or underscores.
 */
export type Name = string;
/**
 * A number, an expression, or {"value", "description"}.
 */
export type Parameter = Quantity | DescribedParameter;
/**
 * Time dependence f(t) of a term within its segment; the term contributes amplitude * f(t). Omit for a constant term.
 */
export type Modulation = ConstantModulation | HarmonicModulationSpec;
/**
 * Integer cell offset n = (n1, n2, ...) in units of the lattice vectors, one entry per lattice dimension.
 *
 * @minItems 1
 * @maxItems 3
 */
export type CellOffset = number[];
/**
 * A complex amplitude: a real number or expression, {"magnitude", "phase"} (phase in radians), or {"re", "im"}.
 */
export type Amplitude = Quantity | PolarAmplitude | CartesianAmplitude;
/**
 * A matrix entry: a real number or expression, or [re, im].
 *
 * @minItems 2
 * @maxItems 2
 */
export type MatrixEntry = number | string | Quantity[];
/**
 * A square matrix on the basis states of one cell, as a list of rows. Basis order: the orbitals in the order listed; for models with pairing terms, all particle components first, then all hole components (Nambu order).
 *
 * @minItems 1
 * @maxItems 128
 */
export type OperatorMatrix = MatrixEntry[][];
/**
 * Phase-diagram scans. Each sweep varies one or two parameters over a grid (everything that depends on them is re-evaluated) and maps the requested quantities.
 *
 * @maxItems 16
 */
export type Sweeps = Sweep[];

/**
 * A periodically driven tight-binding model in the Strobe Atlas inventory (format version 1): who wrote it and where it comes from, the lattice, named parameters, the drive over one period, the claims to verify, numerics hints and sweeps. Units: hbar = 1, lengths in lattice constants, quasienergies in units of pi/T. Every numeric field may be a number or an arithmetic expression over the parameters.
 */
export interface ModelDocument {
  /**
   * Version of the model file format. Only 1 exists.
   */
  formatVersion: 1;
  id: ModelId;
  /**
   * Human-readable title shown as the page heading.
   */
  title: string;
  /**
   * One-line summary (no line breaks) shown in listings and search results.
   */
  summary: string;
  /**
   * Longer explanation in Markdown; TeX math between $...$ (inline) or $$...$$ on lines of their own (display).
   */
  description?: string;
  tags?: ProvenanceTags;
  maintainers: ProvenanceMaintainers;
  references?: ProvenanceReferences;
  dates: EntryDates;
  /**
   * true while the entry is a draft: strobe check verifies it, but the site does not publish it. Remove the field (or set false) to publish.
   */
  draft?: boolean;
  lattice: Lattice;
  parameters?: Parameters;
  drive: Drive;
  claims: Claims;
  numerics?: NumericsHints;
  sweeps?: Sweeps;
}
/**
 * One publication: a DOI, an arXiv identifier or a free citation (at least one of them).
 */
export interface Reference {
  /**
   * DOI without the https://doi.org/ prefix, e.g. 10.1103/PhysRevX.3.031005.
   */
  doi?: string;
  /**
   * arXiv identifier, new (1212.3324) or old style (cond-mat/0505018).
   */
  arxiv?: string;
  /**
   * Free-form citation, e.g. "Phys. Rev. X 3, 031005 (2013)".
   */
  citation?: string;
  note?: Note;
}
/**
 * ISO dates (YYYY-MM-DD).
 */
export interface EntryDates {
  /**
   * Date the entry was first added.
   */
  created: string;
  /**
   * Date of the last change to physics or claims. Must not precede created.
   */
  updated?: string;
}
/**
 * Bravais lattice (Cartesian vectors in lattice constants) and the orbitals of one unit cell. Vectors and positions have as many Cartesian components as the lattice has dimensions.
 */
export interface Lattice {
  /**
   * Number of periodic directions: 1 (chain) or 2 (sheet). 3 is reserved for a later format version.
   */
  dimension: 1 | 2;
  /**
   * Bravais vectors a1 (and a2) in Cartesian coordinates. In 2D the basis must be right-handed (a1 x a2 > 0): orientation-dependent signs of Chern numbers, windings and edge currents are defined for it.
   *
   * @minItems 1
   * @maxItems 3
   */
  vectors: Quantity[][];
  /**
   * Orbitals (basis states) of one unit cell, in basis order. At most 64.
   *
   * @minItems 1
   * @maxItems 64
   */
  orbitals: Orbital[];
}
/**
 * One orbital: a name used by terms and a position inside the cell.
 */
export interface Orbital {
  name: Name;
  /**
   * Cartesian position in lattice constants, `dimension` components. Enters Peierls phases and the real-space geometry of edges.
   *
   * @minItems 1
   * @maxItems 3
   */
  position: Quantity[];
  note?: Note;
}
/**
 * Named parameters. A value is a number, an expression over other parameters, or an object with a value and a description. Names are identifiers; pi and e are built-in constants and cannot be redefined. Parameters may refer to each other in any order, but not in a cycle.
 */
export interface Parameters {
  [k: string]: Parameter | undefined;
}
/**
 * A parameter with a description shown on the site.
 */
export interface DescribedParameter {
  value: Quantity;
  /**
   * Meaning of the parameter, with units (e.g. "hopping during each step, units of 1/T").
   */
  description?: string;
}
/**
 * The Hamiltonian over one period [0, T): consecutive segments starting at t = 0 whose durations sum to T. A static model is a single constant segment of duration T. The tool adds the Hermitian conjugate of every hopping and pairing term.
 */
export interface Drive {
  period: Quantity;
  /**
   * Ordered segments, at most 64.
   *
   * @minItems 1
   * @maxItems 64
   */
  segments: Segment[];
}
/**
 * A time interval with its own terms. Duration 0 is an instantaneous kick U = exp(-iK); its terms are then dimensionless phases.
 */
export interface Segment {
  /**
   * Name shown in reports, e.g. "step 1: bond a".
   */
  label?: string;
  duration: Quantity;
  /**
   * Onsite energies.
   *
   * @maxItems 4096
   */
  onsite?: OnsiteTerm[];
  /**
   * Hopping terms (Hermitian conjugate added by the tool).
   *
   * @maxItems 4096
   */
  hoppings?: HoppingTerm[];
  /**
   * Superconducting pairing terms (Bogoliubov-de Gennes); any pairing makes the model a Nambu model.
   *
   * @maxItems 4096
   */
  pairings?: PairingTermSpec[];
  /**
   * Vector potential A(t) = sum of components, entering every hopping of the segment as a Peierls phase exp(i A(t) . d), d the Cartesian hop vector (charge 1, A in units of 1/lattice constant).
   *
   * @maxItems 32
   */
  vectorPotential?: VectorPotentialSpec[];
}
/**
 * energy * f(t) |orbital><orbital| in every cell.
 */
export interface OnsiteTerm {
  orbital: Name;
  energy: Quantity;
  modulation?: Modulation;
  note?: Note;
}
/**
 * f(t) = 1.
 */
export interface ConstantModulation {
  /**
   * Constant in time.
   */
  kind: 'constant';
}
/**
 * f(t) = mean + sum of components amplitude * f(m omega t + phase).
 */
export interface HarmonicModulationSpec {
  /**
   * Sum of harmonics of the drive frequency.
   */
  kind: 'harmonic';
  mean?: Quantity;
  /**
   * Fourier components.
   *
   * @minItems 1
   * @maxItems 32
   */
  components: HarmonicComponent[];
}
/**
 * One Fourier component amplitude * f(m * omega * t + phase), f = cos or sin, omega = 2 pi / T, t the absolute time within the period (not the time since the segment started).
 */
export interface HarmonicComponent {
  amplitude: Quantity;
  /**
   * Harmonic order m (0 gives a constant).
   */
  harmonic: number;
  /**
   * cos or sin; sin(x) is stored as cos(x - pi/2).
   */
  function: 'cos' | 'sin';
  phase?: Quantity;
}
/**
 * amplitude * f(t) |to, R + offset><from, R| summed over cells R, plus its Hermitian conjugate.
 */
export interface HoppingTerm {
  from: Name;
  to: Name;
  offset: CellOffset;
  amplitude: Amplitude;
  modulation?: Modulation;
  note?: Note;
}
/**
 * magnitude * exp(i * phase).
 */
export interface PolarAmplitude {
  magnitude: Quantity;
  phase: Quantity;
}
/**
 * re + i * im.
 */
export interface CartesianAmplitude {
  re: Quantity;
  im: Quantity;
}
/**
 * amplitude * f(t) c+_{to, R + offset} c+_{from, R} summed over cells R, plus its Hermitian conjugate.
 */
export interface PairingTermSpec {
  from: Name;
  to: Name;
  offset: CellOffset;
  amplitude: Amplitude;
  modulation?: Modulation;
  note?: Note;
}
/**
 * amplitude (a Cartesian vector) * f(m omega t + phase). Circular light: (A, 0) cos(omega t) plus (0, A) sin(omega t).
 */
export interface VectorPotentialSpec {
  /**
   * Cartesian amplitude vector, `dimension` components, in units of 1/lattice constant.
   *
   * @minItems 1
   * @maxItems 3
   */
  amplitude: Quantity[];
  /**
   * Harmonic order m (0: a static vector potential, i.e. a constant Peierls twist).
   */
  harmonic: number;
  /**
   * cos or sin.
   */
  function: 'cos' | 'sin';
  phase?: Quantity;
}
/**
 * Topological statements about the model at its parameter point. Every claim is recomputed at build time. Gaps are named by a quasienergy inside them in units of pi/T (0 for the gap at zero quasienergy, 1 for the gap at pi/T).
 */
export interface Claims {
  /**
   * Altland-Zirnbauer class of the Floquet operator. A: no symmetry; AIII/BDI/CII/DIII/CI: with chiral symmetry; D, C, AI, AII: without.
   */
  symmetryClass?: 'A' | 'AIII' | 'AI' | 'AII' | 'BDI' | 'CII' | 'D' | 'DIII' | 'C' | 'CI';
  symmetries?: SymmetryOperators;
  /**
   * Claims per quasienergy gap.
   *
   * @maxItems 64
   */
  gaps?: GapClaim[];
  bands?: BandClaims;
  /**
   * True when edge modes exist although every band is Chern-trivial (or, in 1D, when pi modes exist with no static counterpart): the phase has no static analogue.
   */
  anomalous?: boolean;
  note?: Note;
}
/**
 * Unitary parts of the symmetry operators acting on the basis states of one cell (orbitals in order; particle block then hole block for Nambu models).
 */
export interface SymmetryOperators {
  chiral?: ChiralSymmetrySpec;
  particleHole?: AntiunitarySymmetrySpec;
  timeReversal?: AntiunitarySymmetrySpec;
}
/**
 * Unitary chiral operator and the symmetric time frames in which the Floquet operator obeys Gamma U Gamma^-1 = U^dagger.
 */
export interface ChiralSymmetrySpec {
  operator: OperatorMatrix;
  /**
   * Start times t0 of the symmetric time frames (usually two inequivalent ones, e.g. 0 and T/2). Needed for the 0 and pi invariants of chiral chains.
   *
   * @minItems 1
   * @maxItems 4
   */
  symmetricTimes?: Quantity[];
}
/**
 * An antiunitary operator U K (K complex conjugation).
 */
export interface AntiunitarySymmetrySpec {
  unitary: OperatorMatrix;
  /**
   * Whether the operator includes complex conjugation K. Default true (particle-hole and time-reversal are antiunitary).
   */
  antiunitary?: boolean;
}
/**
 * Claims about one quasienergy gap.
 */
export interface GapClaim {
  quasienergy: Quantity;
  /**
   * 2D: Rudner-Lindner-Berg-Levin winding number W of the gap.
   */
  winding?: number;
  /**
   * 2D: signed chiral edge-mode counts on named edges of a ribbon.
   *
   * @maxItems 4
   */
  edgeModes?: EdgeModeClaim[];
  /**
   * 1D: topological invariant of the gap: an integer winding for chiral classes (AIII, BDI, CII), 0 or 1 (Z2) for class D.
   */
  invariant?: number;
  /**
   * 1D: number of modes at this quasienergy bound to each end of an open chain (Majorana modes for class D).
   */
  endModes?: number;
  /**
   * Expected smallest direct gap over the Brillouin zone, units of pi/T (optional).
   */
  minimalGap?: number;
  note?: Note;
}
/**
 * Signed number of chiral modes crossing the gap on one edge of a ribbon: the sum over edge-localised crossings of sign(d epsilon / d k), k the reduced momentum along the other lattice vector.
 */
export interface EdgeModeClaim {
  /**
   * Index of the lattice vector along which the ribbon is finite (0 for a1, 1 for a2).
   */
  finiteAlong: number;
  /**
   * Which edge: "low" = the first cell along the finite direction, "high" = the last.
   */
  end: 'low' | 'high';
  /**
   * Signed count.
   */
  count: number;
}
/**
 * Chern numbers of Floquet bands counted upward in quasienergy from a cut.
 */
export interface BandClaims {
  cut: Quantity;
  /**
   * Chern number of each band, upward from the cut; bands that touch count as one group.
   *
   * @minItems 1
   * @maxItems 128
   */
  chern: number[];
  note?: Note;
}
/**
 * Starting grids, evaluation budgets and tolerances for verification. Grids are starting points: refinement continues until tolerances are met or a budget is spent.
 */
export interface NumericsHints {
  /**
   * Starting number of k points per reciprocal direction (one entry per lattice dimension). Sheets: band grid, and the Chern refinement starts at the largest entry (default 24 per direction). Chains: points of the bulk gap scan (default 128).
   *
   * @minItems 1
   * @maxItems 3
   */
  kGrid?: number[];
  /**
   * Starting number of Magnus time slices per period for segments with time-dependent terms; doubling continues until the propagator tolerance is met. Default: about one slice per 2 radians of phase (from the size of H and the drive frequency).
   */
  timeSlices?: number;
  ribbon?: RibbonHints;
  /**
   * Seconds this model may take to verify (default 600, at most 3600). The estimated work is held to it before anything is computed, and verification stops when it is reached. strobe check --time-limit replaces it for every model.
   */
  timeLimit?: number;
  /**
   * 2D: most evaluations of the winding density (momenta, each integrated over the period) the adaptive quadrature of all gap winding numbers may spend together. Default 400000.
   */
  windingEvaluations?: number;
  /**
   * Most Floquet operators the certified lower bound of each gap's minimal direct gap may evaluate beyond the band grid, for sheets and chains. Default 20000.
   */
  gapEvaluations?: number;
  /**
   * Cells in the open chain used for end modes (1D). Default: 10 bulk decay lengths, at most 160.
   */
  chainLength?: number;
  tolerances?: Tolerances;
}
/**
 * Ribbon geometry for edge-mode counts (2D).
 */
export interface RibbonHints {
  /**
   * Number of cells across the ribbon. Default 24.
   */
  width?: number;
  /**
   * Index of the lattice vector along which the ribbon is finite. Default 1 (edges along a1).
   */
  finiteAlong?: number;
  /**
   * Momenta along the edge. Default 200.
   */
  momenta?: number;
}
/**
 * Acceptance thresholds.
 */
export interface Tolerances {
  /**
   * Largest accepted distance of a computed invariant from the nearest integer, for every invariant (Chern numbers, gap winding numbers, chain windings, Z2 indices); for gap winding numbers also the largest accepted quadrature error estimate. At most 0.1: near 0.5 the residual test would accept any number. Defaults: 1e-6 for Chern numbers, gap winding numbers and chain windings, 0.01 for Z2 indices.
   */
  integer?: number;
  /**
   * Gap tolerance (units of pi/T): a gap counts as open when the certified lower bound of its minimal direct gap exceeds it, for sheets and chains. Default 0.001; hard lower limit 1e-5 (ten times the distance below which a winding number counts as undefined).
   */
  gap?: number;
  /**
   * Largest accepted change of quasienergies (units of pi/T) under time-slice doubling. Default derived from the other tolerances: gap x min(integer, 0.01) (1e-6 with the defaults); ribbons gap / 100; chains at most 3e-10, because their Floquet symmetry residuals are held to 1e-8.
   */
  propagator?: number;
}
/**
 * One scan.
 */
export interface Sweep {
  /**
   * Kebab-case name, unique within the model.
   */
  name: string;
  /**
   * Caption shown above the map.
   */
  title?: string;
  /**
   * One or two scanned parameters (first = horizontal axis).
   *
   * @minItems 1
   * @maxItems 2
   */
  axes: SweepAxis[];
  /**
   * What to map at each point: minimalGap (per claimed gap), chern (band Chern numbers), winding (2D gap windings), invariant (1D gap invariants).
   *
   * @minItems 1
   */
  quantities: ('minimalGap' | 'chern' | 'winding' | 'invariant')[];
  note?: Note;
}
/**
 * One scanned parameter: count points from start to stop inclusive.
 */
export interface SweepAxis {
  parameter: Name;
  start: Quantity;
  stop: Quantity;
  /**
   * Number of points, including both ends.
   */
  count: number;
}
