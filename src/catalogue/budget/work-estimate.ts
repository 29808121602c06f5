/**
 * The cost model: how long verifying a model will take and how much memory it
 * will hold, estimated from the file alone (sizes and counts, no expression is
 * evaluated and nothing is computed), so that a model asking for hours or
 * gigabytes is refused in a millisecond instead of stalling the run.
 *
 * Everything reduces to dense linear algebra on Floquet operators:
 *
 *   one evaluation of U(k, T) for an n × n Bloch matrix costs
 *       EVALUATION_NS · (segment units + EIGEN_UNITS) · n³ · (1 + SMALL_MATRIX / n)  nanoseconds,
 *
 * a constant segment or a kick being one unit (an exponential and a product),
 * a segment with harmonic terms or a vector potential DRIVEN_SEGMENT_UNITS
 * (Magnus slices), and EIGEN_UNITS the unitary eigen-decomposition. A single
 * constant segment (a static model) is diagonalised directly: STATIC_UNITS in
 * all. The factor (1 + SMALL_MATRIX/n) carries what does not grow like n³
 * (loops over n² entries, call overhead): per n³, a 48-state matrix costs
 * about 2.5 times as much as a 480-state one. The stages count their evaluations:
 *
 *  sheets  band grid  n₁·n₂ momenta (numerics.kGrid, default 24 × 24), each also
 *                     BAND_POINT_NS for locating and naming gaps;
 *          Chern      the refinement grid doubles from max(kGrid) while it stays
 *                     within 128 (worst case: it goes all the way), cached samples
 *                     reused, CHERN_POINT_NS per point for the link variables;
 *          winding    WINDING_POINTS density evaluations (adaptive Gauss–Kronrod
 *                     cells, all gaps together; at most numerics.windingEvaluations)
 *                     of WINDING_NODES_PER_SEGMENT time nodes per segment, each node
 *                     about one unit; the cells hold little memory;
 *          ribbon     one evaluation of the (width·n)-state ribbon per momentum
 *                     (numerics.ribbon, default 24 cells, 200 momenta), once per
 *                     edge direction the claims name, and again at 1.5× the width
 *                     (the second size every edge count is checked at);
 *  chains  gap scan   kGrid[0] (default 128) momenta, three passes (gaps, symmetries,
 *                     symmetric time frames);
 *          open chain one evaluation of the (length·n)-state chain (numerics.chainLength,
 *                     default at most 160 cells), and again at 1.5× the length;
 *  sweeps             every grid point repeats the bulk stages the sweep asks for.
 *
 * Memory: a Floquet sample takes SAMPLE_BYTES_PER_ENTRY · n² + SAMPLE_OVERHEAD_BYTES
 * (measured: 950 bytes at n = 2, 3.3 kB at n = 8); the band grid keeps every
 * sample for the whole analysis, the Chern refinement at most
 * SAMPLER_CACHE_LIMIT more and the frames of every point; ribbons keep the
 * eigenvectors of every momentum; an open chain holds OPEN_CHAIN_MATRICES
 * dense matrices. Heaps of small objects need room to be collected: HEAP_SLACK.
 *
 * The constants were measured with `npm run bench -- work-estimate` (synthetic
 * stacks of Qi–Wu–Zhang sheets and dimer chains, test/support/synthetic-models.ts)
 * on the 2-core development machine under the load of other jobs; the bench
 * prints estimate against measurement per stage, and docs/benchmarks.md keeps
 * the last figures. They are central estimates (within a factor of about 2.5
 * either way on those models), not bounds: the time limit stays the backstop.
 * When an engine changes its cost (e.g. banded ribbons), adjust the stage here
 * and re-run the bench.
 */
import type { ModelDocument } from '../model-types.generated.ts';

/** Nanoseconds per unit per (states)³ in one Floquet evaluation of a large matrix. */
export const EVALUATION_NS = 10;
/** The unitary eigen-decomposition and the bookkeeping around it, in segment units. */
export const EIGEN_UNITS = 4;
/** A static model (one constant segment): one Hermitian eigen-decomposition, in units. */
export const STATIC_UNITS = 2;
/** A segment with harmonic terms: Magnus slices (two exponentials each), doubled until converged. */
export const DRIVEN_SEGMENT_UNITS = 32;
/** States below which per-entry work and call overhead outweigh the n³ of dense algebra. */
export const SMALL_MATRIX = 100;
/** Per band-grid momentum besides its evaluation: gap location, band groups (measured 100–150 µs). */
export const BAND_POINT_NS = 100_000;
/** Per Chern-grid momentum besides its evaluation: overlap determinants of the link variables. */
export const CHERN_POINT_NS = 20_000;
/** Density evaluations the adaptive winding quadrature typically needs for the gaps of a model (measured 4 000–53 000 per gap, docs/benchmarks.md). */
export const WINDING_POINTS = 20_000;
/** Time nodes per segment and momentum in the winding-number integral (Gauss–Legendre, about one per radian). */
export const WINDING_NODES_PER_SEGMENT = 10;
/** Bytes per cell of the adaptive winding quadrature (rectangle, sums and error estimates per gap, heap entry). */
export const WINDING_CELL_BYTES = 400;
/** Bytes per entry of a Floquet sample (eigenvectors and their copies, 16 bytes per complex number). */
export const SAMPLE_BYTES_PER_ENTRY = 32;
/** Bytes per Floquet sample besides its entries (typed arrays, object headers, cache maps). */
export const SAMPLE_OVERHEAD_BYTES = 900;
/** Bytes per Chern-grid point for the frames of a band group besides its entries. */
export const FRAME_OVERHEAD_BYTES = 300;
/** Live heap to memory held, for stages that keep many small objects (garbage awaiting collection). */
export const HEAP_SLACK = 1.5;
/** Samples the Floquet sampler keeps before it starts over (quasienergy-bands.ts, cacheLimit). */
export const SAMPLER_CACHE_LIMIT = 1 << 16;
/** Dense matrices of the open chain's size alive at once (Hamiltonian, exponential, product, eigenvectors). */
export const OPEN_CHAIN_MATRICES = 4;
/** Dense working matrices of the ribbon's size besides the kept eigenvectors. */
export const RIBBON_WORK_MATRICES = 4;

/** Engine defaults the estimate assumes when the file does not set a hint (docs/model-format.md). */
export const DEFAULTS = {
  sheetGrid: 24,
  chainGrid: 128,
  chernMaxGrid: 128,
  windingCells: 2_000,
  ribbonWidth: 24,
  ribbonMomenta: 200,
  chainLength: 160,
  secondSize: 1.5,
} as const;

const COMPLEX_BYTES = 16;

export interface CostDriver {
  /** JSON pointer of the field this cost grows with. */
  pointer: string;
  /** What the field contributes, e.g. "96 × 96 momenta". */
  text: string;
  /** How far the field is above its usual size (cost ratio to the default); the largest is blamed. */
  excess: number;
}

export interface StageEstimate {
  stage: string;
  seconds: number;
  memoryBytes: number;
  /** What the numbers are made of, e.g. "9216 momenta × 4 × 4 Floquet operators". */
  detail: string;
  drivers: CostDriver[];
}

export interface WorkEstimate {
  /** Estimated compute time of the whole verification, seconds on the reference machine. */
  seconds: number;
  /** Largest memory any stage holds, bytes. */
  memoryBytes: number;
  stages: StageEstimate[];
}

interface Shape {
  states: number;
  /** Segment units of one evaluation (without the eigen-decomposition). */
  units: number;
  isStatic: boolean;
  segments: number;
  driven: number;
}

function shapeOf(doc: ModelDocument): Shape {
  const segments = doc.drive?.segments ?? [];
  const nambu = segments.some((s) => (s.pairings ?? []).length > 0);
  const states = (doc.lattice?.orbitals?.length ?? 1) * (nambu ? 2 : 1);
  let units = 0, driven = 0;
  for (const s of segments) {
    const terms = [...(s.onsite ?? []), ...(s.hoppings ?? []), ...(s.pairings ?? [])];
    const isDriven = (s.vectorPotential ?? []).length > 0 || terms.some((t) => t.modulation?.kind === 'harmonic');
    if (isDriven) {
      driven++;
      const hinted = doc.numerics?.timeSlices !== undefined ? 2 * doc.numerics.timeSlices : 0;
      units += Math.max(DRIVEN_SEGMENT_UNITS, hinted);
    } else units += 1;
  }
  return { states, units: Math.max(1, units), isStatic: segments.length === 1 && driven === 0, segments: segments.length, driven };
}

/** Nanoseconds of one unit of dense algebra on n states. */
const unitNs = (n: number) => EVALUATION_NS * n ** 3 * (1 + SMALL_MATRIX / n);

/** Nanoseconds of one Floquet evaluation on n states. */
function evaluationNs(shape: Shape, n: number): number {
  return (shape.isStatic ? STATIC_UNITS : shape.units + EIGEN_UNITS) * unitNs(n);
}

const sampleBytes = (n: number) => SAMPLE_BYTES_PER_ENTRY * n * n + SAMPLE_OVERHEAD_BYTES;
const fmt = (x: number) => (x >= 1e4 ? x.toExponential(1).replace('e+', 'e') : String(Math.round(x)));

function structureDrivers(shape: Shape): CostDriver[] {
  return [
    { pointer: '/lattice/orbitals', text: `${shape.states} states per cell`, excess: (shape.states / 2) ** 3 },
    { pointer: '/drive/segments', text: `${shape.segments} segments${shape.driven > 0 ? ` (${shape.driven} with time-dependent terms)` : ''}`, excess: shape.units },
  ];
}

function sheetStages(doc: ModelDocument, shape: Shape, bulkOnly: { chern: boolean; winding: boolean } | null): StageEstimate[] {
  const n = shape.states;
  const kGrid = doc.numerics?.kGrid;
  const [g1, g2] = kGrid ? [kGrid[0], kGrid[1] ?? kGrid[0]] : [DEFAULTS.sheetGrid, DEFAULTS.sheetGrid];
  const gridDriver: CostDriver[] = kGrid ? [{ pointer: '/numerics/kGrid', text: `a ${g1} × ${g2} band grid`, excess: (g1 * g2) / DEFAULTS.sheetGrid ** 2 }] : [];
  const evalS = evaluationNs(shape, n) * 1e-9;
  const stages: StageEstimate[] = [];
  const bandPoints = g1 * g2;
  // The band grid's samples stay alive for the whole analysis: every later stage holds them too.
  const bandBytes = HEAP_SLACK * bandPoints * sampleBytes(n);
  stages.push({
    stage: 'band grid',
    seconds: bandPoints * (evalS + BAND_POINT_NS * 1e-9),
    memoryBytes: bandBytes,
    detail: `${bandPoints} momenta × ${n}-state Floquet operators`,
    drivers: [...gridDriver, ...structureDrivers(shape)],
  });
  if (bulkOnly === null || bulkOnly.chern) {
    let final = Math.max(2, g1, g2);
    while (2 * final <= DEFAULTS.chernMaxGrid) final *= 2;
    const points = final * final;
    stages.push({
      stage: 'Chern numbers',
      seconds: Math.max(0, points - bandPoints) * (evalS + CHERN_POINT_NS * 1e-9),
      memoryBytes: bandBytes + HEAP_SLACK * (Math.min(points, SAMPLER_CACHE_LIMIT) * sampleBytes(n) + points * ((COMPLEX_BYTES * n * n) / 2 + FRAME_OVERHEAD_BYTES)),
      detail: `refinement up to ${final} × ${final} momenta × ${n}-state Floquet operators`,
      drivers: [...(kGrid ? [{ ...gridDriver[0], text: `a starting Chern grid of ${Math.max(g1, g2)} × ${Math.max(g1, g2)}`, excess: points / 96 ** 2 }] : []), ...structureDrivers(shape)],
    });
  }
  if (bulkOnly === null || bulkOnly.winding) {
    const nodes = WINDING_NODES_PER_SEGMENT * shape.segments;
    const points = Math.min(WINDING_POINTS, doc.numerics?.windingEvaluations ?? Infinity);
    stages.push({
      stage: 'gap winding numbers',
      seconds: points * nodes * unitNs(n) * 1e-9,
      // One momentum at a time: the cells keep their sums only, each evaluation a few matrices per time piece.
      memoryBytes: bandBytes + HEAP_SLACK * DEFAULTS.windingCells * WINDING_CELL_BYTES,
      detail: `about ${points} density evaluations × ${nodes} time nodes × ${n}-state operators`,
      drivers: structureDrivers(shape),
    });
  }
  if (bulkOnly === null) {
    const ribbon = doc.numerics?.ribbon;
    const width = ribbon?.width ?? DEFAULTS.ribbonWidth;
    const momenta = ribbon?.momenta ?? DEFAULTS.ribbonMomenta;
    const directions = new Set<number>();
    for (const gap of doc.claims?.gaps ?? []) for (const e of gap.edgeModes ?? []) directions.add(e.finiteAlong);
    const cuts = Math.max(1, directions.size);
    const states = width * n;
    const second = Math.ceil(DEFAULTS.secondSize * width) * n;
    const seconds = cuts * momenta * (evaluationNs(shape, states) + evaluationNs(shape, second)) * 1e-9;
    const drivers: CostDriver[] = [];
    if (ribbon?.width !== undefined) drivers.push({ pointer: '/numerics/ribbon/width', text: `a ribbon ${width} cells wide (${states} states, and ${second} at 1.5× the width)`, excess: (width / DEFAULTS.ribbonWidth) ** 3 });
    if (ribbon?.momenta !== undefined) drivers.push({ pointer: '/numerics/ribbon/momenta', text: `${momenta} momenta along the edge`, excess: momenta / DEFAULTS.ribbonMomenta });
    stages.push({
      stage: 'ribbon spectra',
      seconds,
      memoryBytes: bandBytes + momenta * sampleBytes(second) + RIBBON_WORK_MATRICES * second * second * COMPLEX_BYTES,
      detail: `${cuts} × ${momenta} momenta × ${states}-state ribbon operators, then ${second} states`,
      drivers: [...drivers, ...structureDrivers(shape)],
    });
  }
  return stages;
}

function chainStages(doc: ModelDocument, shape: Shape, bulkOnly: boolean): StageEstimate[] {
  const n = shape.states;
  const kGrid = doc.numerics?.kGrid?.[0];
  const points = kGrid ?? DEFAULTS.chainGrid;
  const stages: StageEstimate[] = [
    {
      stage: 'gap scan',
      seconds: 3 * points * evaluationNs(shape, n) * 1e-9,
      memoryBytes: points * sampleBytes(n),
      detail: `3 × ${points} momenta × ${n}-state Floquet operators`,
      drivers: [...(kGrid !== undefined ? [{ pointer: '/numerics/kGrid', text: `${points} momenta`, excess: points / DEFAULTS.chainGrid }] : []), ...structureDrivers(shape)],
    },
  ];
  if (!bulkOnly) {
    const length = doc.numerics?.chainLength ?? DEFAULTS.chainLength;
    const states = length * n;
    const second = Math.ceil(DEFAULTS.secondSize * length) * n;
    stages.push({
      stage: 'open chain',
      seconds: (evaluationNs(shape, states) + evaluationNs(shape, second)) * 1e-9,
      memoryBytes: OPEN_CHAIN_MATRICES * second * second * COMPLEX_BYTES,
      detail: `open chains of ${states} and ${second} states`,
      drivers: [
        ...(doc.numerics?.chainLength !== undefined ? [{ pointer: '/numerics/chainLength', text: `an open chain of ${length} cells (${states} states, and ${second} at 1.5× the length)`, excess: (length / DEFAULTS.chainLength) ** 3 }] : []),
        ...structureDrivers(shape),
      ],
    });
  }
  return stages;
}

/** Estimated cost of verifying a schema-valid model document, stage by stage. */
export function estimateWork(doc: ModelDocument): WorkEstimate {
  const shape = shapeOf(doc);
  const dimension = doc.lattice?.dimension ?? 2;
  const stages = dimension === 1 ? chainStages(doc, shape, false) : sheetStages(doc, shape, null);
  (doc.sweeps ?? []).forEach((sweep, i) => {
    const points = sweep.axes.reduce((p, a) => p * a.count, 1);
    const quantities = new Set<string>(sweep.quantities);
    const perPoint = dimension === 1 ? chainStages(doc, shape, true) : sheetStages(doc, shape, { chern: quantities.has('chern'), winding: quantities.has('winding') });
    const seconds = points * perPoint.reduce((s, st) => s + st.seconds, 0);
    const widest = sweep.axes.reduce((best, a, j) => (a.count > sweep.axes[best].count ? j : best), 0);
    stages.push({
      stage: `sweep "${sweep.name}"`,
      seconds,
      memoryBytes: Math.max(...perPoint.map((st) => st.memoryBytes)),
      detail: `${sweep.axes.map((a) => a.count).join(' × ')} points × (${perPoint.map((st) => st.stage).join(', ')})`,
      drivers: [{ pointer: `/sweeps/${i}/axes/${widest}/count`, text: `${sweep.axes.map((a) => a.count).join(' × ')} = ${fmt(points)} sweep points`, excess: points }, ...perPoint[0].drivers],
    });
  });
  return {
    seconds: stages.reduce((s, st) => s + st.seconds, 0),
    memoryBytes: Math.max(0, ...stages.map((st) => st.memoryBytes)),
    stages,
  };
}
