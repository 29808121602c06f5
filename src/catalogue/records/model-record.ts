/**
 * Results records: everything the site shows about one model, and the
 * catalogue summary. Described by schemas/report.schema.json; written as
 * canonical JSON (canonical-json.ts) so that two runs give identical bytes.
 * Nothing machine-dependent belongs here: compute times go to timings.json.
 */
import type { Certificate } from '../verify/certificate.ts';
import type { Verdict } from '../verify/verdict.ts';
import type { PortraitEntry } from '../verify/sheet-verdicts.ts';
import type { AnomalousClass } from '../verify/anomalous.ts';
import type { BandPathRecord } from './band-path.ts';

export const RECORD_FORMAT = 1;

/**
 * verified: every claim confirmed (at least one claim);
 * disputed: at least one claim contradicted;
 * unsettled: none contradicted, at least one unsettled;
 * portrait-only: the file makes no claims; the computed portrait is all there is;
 * invalid: the file did not load or compile (see diagnostics);
 * failed: the computation did not finish: refused because its estimated cost
 *   exceeds the model's limits, timed out, crashed or raised an error.
 */
export type ModelStatus = 'verified' | 'disputed' | 'unsettled' | 'portrait-only' | 'invalid' | 'failed';

export interface RecordDiagnostic {
  file: string;
  line: number;
  column: number;
  pointer: string;
  message: string;
  hint: string | null;
  severity: 'error' | 'warning';
}

export interface GapRecord {
  label: number;
  lower: number;
  upper: number;
  minimalGap: number;
  /** Certified lower bound on the minimal direct gap over the zone (units π/T). */
  lowerBound: number;
  at: number[];
  /** The tolerance the lower bound had to exceed (policy.ts) and the verdict on it. */
  tolerance: number;
  open: boolean;
}

export interface BandRecord {
  index: number;
  branches: number;
  gapBelow: number;
  gapAbove: number;
  range: [number, number];
}

export interface SpectrumRecord {
  /** What the spectrum is: a ribbon finite along a₁/a₂, or an open chain. */
  kind: 'ribbon' | 'open-chain';
  finiteDirection: number | null;
  width: number;
  /** Momenta along the edge (reduced), decimated for plotting; empty for an open chain. */
  momenta: number[];
  /** Quasienergies (units π/T) per momentum (one row for an open chain), rounded for plotting. */
  quasienergies: number[][];
  /** Edge weight of each state: low edge, high edge (rounded to 3 decimals). */
  lowEdgeWeight: number[][];
  highEdgeWeight: number[][];
  /** Every how many momenta of the computed spectrum were kept. */
  stride: number;
}

export interface AnalysisRecord {
  kind: 'sheet' | 'chain';
  grid: number[];
  /** Bands along a path through the Brillouin zone, for plots (null when not sampled). */
  bandPath: BandPathRecord | null;
  gaps: GapRecord[];
  bands: BandRecord[];
  spectra: SpectrumRecord[];
  consistency: { name: string; holds: boolean; inconclusive: boolean; detail: string }[];
  propagatorAccuracy: number | null;
  /** Engine-specific scalar facts worth showing (e.g. symmetry residuals), name → value. */
  facts: Record<string, number>;
}

export interface SweepRecord {
  name: string;
  title: string | null;
  axes: { parameter: string; values: number[] }[];
  quantities: string[];
  /** One entry per grid point, first axis fastest. */
  points: SweepPoint[];
}

export interface SweepPoint {
  parameters: Record<string, number>;
  /** quantity id (e.g. "gap-1/winding", "gap-0/minimal-gap") → settled value or null. */
  values: Record<string, number | null>;
  /** Grid point could not be computed: why. */
  error: string | null;
}

/** The limits a model was verified under and the cost estimated for it before computing (budget/). */
export interface BudgetRecord {
  timeLimitSeconds: number;
  timeLimitSource: 'default' | 'model file' | 'command line';
  memoryLimitBytes: number;
  estimate: {
    seconds: number;
    memoryBytes: number;
    stages: { stage: string; seconds: number; memoryBytes: number; detail: string }[];
  };
}

export interface ModelRecord {
  recordFormat: number;
  engine: { version: string; numericsHash: string };
  id: string;
  /** Model file, relative to the inventory (inventory.ts), '/'-separated. */
  file: string;
  /** sha256 of the file's bytes when it was checked ("sha256:…"), null when it was not read. */
  sourceHash: string | null;
  status: ModelStatus;
  statusReason: string;
  model: {
    title: string;
    summary: string;
    description: string | null;
    tags: string[];
    maintainers: string[];
    references: { doi: string | null; arxiv: string | null; citation: string | null; note: string | null }[];
    dates: { created: string; updated: string | null };
    dimension: number | null;
    symmetryClass: string | null;
    /** Marked "draft": true in the file: verified, but not published on the site. */
    draft: boolean;
  } | null;
  parameters: { name: string; value: number | null; expression: string | null; description: string | null }[];
  drive: {
    period: number;
    latticeVectors: number[][];
    handedness: 'right' | 'left' | 'n/a';
    states: string[];
    nambu: boolean;
    segments: { label: string | null; duration: number; terms: number; driven: boolean }[];
  } | null;
  analysis: AnalysisRecord | null;
  claims: Verdict[];
  counts: { confirmed: number; contradicted: number; unsettled: number };
  portrait: PortraitEntry[];
  anomalous: { classification: AnomalousClass; reason: string; definition: string };
  sweeps: SweepRecord[];
  diagnostics: RecordDiagnostic[];
  incident: { kind: IncidentKind; message: string } | null;
  /** Limits and cost estimate; null for a model that did not load. */
  budget: BudgetRecord | null;
}

export type IncidentKind = 'over-budget' | 'timed-out' | 'crashed' | 'error';

/** Machine-dependent facts kept out of the records (timings.json). */
export interface ModelTimings {
  /** Wall time of the whole verification, ms; 0 for a cache hit. */
  totalMs: number;
  /** Engine stage → ms, as measured when the result was computed. */
  stages: Record<string, number>;
  cached: boolean;
}

export interface CatalogueSummary {
  recordFormat: number;
  engine: { version: string; numericsHash: string };
  /** "i/n" when this summary covers one shard, null for the whole catalogue. */
  shard: string | null;
  counts: Record<ModelStatus, number>;
  models: {
    id: string;
    file: string;
    title: string | null;
    summary: string | null;
    tags: string[];
    dimension: number | null;
    status: ModelStatus;
    statusReason: string;
    anomalous: AnomalousClass;
    claims: { confirmed: number; contradicted: number; unsettled: number };
    draft: boolean;
  }[];
}

export type { Certificate };
