/**
 * One parameter point of one model: compile, run the engine for its
 * dimension, judge the claims and collect the portrait. Used by verification
 * (the model's own point) and by sweeps (every grid point).
 */
import type { LoadedModel } from '../load.ts';
import type { AnalysisRecord } from '../records/model-record.ts';
import { chainAnalysis, sheetAnalysis } from '../records/record-builder.ts';
import type { AnomalousFlag } from './anomalous.ts';
import { anomalousClaimHolds, classifyChain, classifySheet } from './anomalous.ts';
import { emptyCertificate } from './certificate.ts';
import { judgeChain } from './chain-verdicts.ts';
import type { NormalizedClaim } from './claims.ts';
import { claimedGapLabels } from './claims.ts';
import type { AnalysisRequest, EngineSet } from './engines.ts';
import type { VerdictPolicy } from './policy.ts';
import type { PortraitEntry } from './sheet-verdicts.ts';
import { judgeSheet, sameLabel } from './sheet-verdicts.ts';
import type { Verdict } from './verdict.ts';
import type { ConsistencyCheck } from '../../numerics/portrait.ts';
import type { NumericsHints } from '../model-types.generated.ts';
import { verdictPropagatorTolerance } from '../../numerics/evolution/propagator.ts';
import { DEFAULT_GAP_TOLERANCE } from '../../numerics/sheet/gaps.ts';
import { followableGridAdvice } from './grid-advice.ts';
import { BAND_INTEGER_ACCURACY } from '../../numerics/sheet/sheet-analysis.ts';
import { formatNumber } from './format.ts';
import { GAP_TOLERANCE_LIMIT } from './policy.ts';

export interface PointResult {
  dimension: number;
  analysis: AnalysisRecord;
  verdicts: Verdict[];
  entries: PortraitEntry[];
  anomalous: AnomalousFlag;
  stages: Record<string, number>;
  drive: ReturnType<EngineSet['compile']>;
}

export function analysePoint(
  loaded: LoadedModel,
  claims: NormalizedClaim[],
  engines: EngineSet,
  policy: VerdictPolicy,
  options: { overrides?: Record<string, number>; skip?: AnalysisRequest['skip']; symmetricTimes: number[]; extraLabels?: number[] },
): PointResult {
  const stages: Record<string, number> = {};
  let t = performance.now();
  const compiled = engines.compile(loaded, options.overrides);
  stages.compile = performance.now() - t;
  const labels = claimedGapLabels(claims);
  for (const l of options.extraLabels ?? []) if (!labels.some((x) => sameLabel(x, l))) labels.push(l);
  const cutClaim = claims.find((c) => c.kind === 'chern');
  const ribbonDirections = [...new Set(claims.flatMap((c) => (c.kind === 'edge-modes' ? [c.finiteAlong] : [])))].sort();
  const request: AnalysisRequest = {
    labels,
    hints: loaded.document.numerics,
    skip: options.skip ?? new Set(),
    symmetricTimes: options.symmetricTimes,
    ribbonDirections,
    edgeGaps: claims.flatMap((c) => (c.kind === 'edge-modes' ? [c.gap] : [])),
    ...(cutClaim?.kind === 'chern' ? { cut: cutClaim.cut } : {}),
  };
  const dimension = compiled.drive.dimension;
  const loosened = loosenedTolerances(loaded.document.numerics);
  t = performance.now();
  if (dimension === 2) {
    const portrait = engines.sheet(compiled, request);
    stages.engine = performance.now() - t;
    Object.assign(stages, prefixed(portrait.timings));
    const { verdicts, entries } = judgeSheet(portrait, claims, policy);
    distrustOnInconsistency(verdicts, entries, portrait.consistency);
    const anomalous = classifySheet(entries);
    finishAnomalousClaims(verdicts, claims, anomalous, 2, entries);
    noteEverywhere(verdicts, entries, loosened);
    followableGridAdvice(verdicts, loaded.document.numerics);
    return { dimension, analysis: sheetAnalysis(portrait, policy), verdicts: ordered(verdicts, claims), entries, anomalous, stages, drive: compiled };
  }
  if (dimension === 1) {
    const view = engines.chain(compiled, request);
    stages.engine = performance.now() - t;
    Object.assign(stages, prefixed(view.timings));
    const { verdicts, entries } = judgeChain(view, claims, policy);
    distrustOnInconsistency(verdicts, entries, view.consistency);
    const pi = entries.find((e) => e.quantity === 'gap-invariant' && e.gap !== null && sameLabel(e.gap, 1));
    const anomalous = classifyChain(pi);
    finishAnomalousClaims(verdicts, claims, anomalous, 1, entries);
    noteEverywhere(verdicts, entries, loosened);
    followableGridAdvice(verdicts, loaded.document.numerics);
    return { dimension, analysis: chainAnalysis(view, policy), verdicts: ordered(verdicts, claims), entries, anomalous, stages, drive: compiled };
  }
  throw new Error(`lattice dimension ${dimension} is not supported (only chains and sheets)`);
}

/**
 * When a relation that must hold between computed invariants fails (W steps by
 * C, edge counts equal ±W, Σ C = 0, bulk–end counts), at least one of the
 * numbers involved is wrong, and we cannot tell which: every settled verdict
 * and portrait entry becomes unsettled, with the failed relation named.
 */
export function distrustOnInconsistency(verdicts: Verdict[], entries: PortraitEntry[], checks: ConsistencyCheck[]): void {
  const failed = checks.filter((c) => !c.holds && c.inconclusive !== true);
  if (failed.length === 0) return;
  const why = `computed invariants contradict each other (${failed.map((c) => `${c.name}: ${c.detail}`).join('; ')}); to settle, refine numerics.kGrid and numerics.ribbon.width, and report the model file if the relation still fails`;
  for (const v of verdicts) {
    if (v.outcome === 'unsettled' || v.kind === 'minimal-gap') continue;
    v.outcome = 'unsettled';
    v.computed = null;
    v.message = `${v.message.replace(/\.$/, '')}, but this cannot be trusted: ${why}.`;
    v.hint = 'refine numerics.kGrid and numerics.ribbon.width; if the relation still fails, report it with the model file';
    v.certificate.notes.push(why);
  }
  for (const e of entries) {
    if (!e.settled) continue;
    e.settled = false;
    e.value = null;
    e.certificate.notes.push(why);
  }
}

/** Defaults the tolerance hints are compared with (docs/model-format.md, "Numerics hints"). */
export const TOLERANCE_DEFAULTS = {
  /** Default integer tolerance: Chern numbers, gap winding numbers and chain windings (Z₂ indices: 0.01). */
  integer: 1e-6,
  /** Gap tolerance, units π/T. */
  gap: DEFAULT_GAP_TOLERANCE,
};

/**
 * Sentences naming every tolerance the model's numerics hints set looser than
 * the default: an integer tolerance above the strictest default, a gap
 * tolerance below the default, a propagator tolerance above the one derived
 * from the gap and integer tolerances (propagator.ts).
 */
export function loosenedTolerances(hints: NumericsHints | undefined): string[] {
  const t = hints?.tolerances;
  if (!t) return [];
  const notes: string[] = [];
  const g = formatNumber;
  if (t.integer !== undefined && t.integer > TOLERANCE_DEFAULTS.integer) {
    notes.push(`the model loosens numerics.tolerances.integer to ${g(t.integer)} (default 1e-6 for Chern numbers, gap winding numbers and chain windings)`);
  }
  if (t.gap !== undefined && t.gap < TOLERANCE_DEFAULTS.gap) {
    notes.push(`the model loosens numerics.tolerances.gap to ${g(t.gap)} π/T (default ${g(TOLERANCE_DEFAULTS.gap)} π/T; hard lower limit ${g(GAP_TOLERANCE_LIMIT)} π/T)`);
  }
  if (t.propagator !== undefined) {
    const derived = verdictPropagatorTolerance(t.gap ?? TOLERANCE_DEFAULTS.gap, t.integer ?? BAND_INTEGER_ACCURACY) / Math.PI;
    if (t.propagator > derived) notes.push(`the model loosens numerics.tolerances.propagator to ${g(t.propagator)} π/T (derived default ${g(derived)} π/T)`);
  }
  return notes;
}

function noteEverywhere(verdicts: Verdict[], entries: PortraitEntry[], notes: string[]): void {
  if (notes.length === 0) return;
  for (const c of [...verdicts.map((v) => v.certificate), ...entries.map((e) => e.certificate)]) {
    for (const note of notes) if (!c.notes.includes(note)) c.notes.push(note);
  }
}

function prefixed(timings: Record<string, number>): Record<string, number> {
  return Object.fromEntries(Object.entries(timings).map(([k, v]) => [`engine.${k}`, v]));
}

/** Verdicts in the order of the claims (the file's order). */
function ordered(verdicts: Verdict[], claims: NormalizedClaim[]): Verdict[] {
  const index = new Map(claims.map((c, i) => [c.id, i]));
  return [...verdicts].sort((a, b) => (index.get(a.claim) ?? 0) - (index.get(b.claim) ?? 0));
}

function finishAnomalousClaims(verdicts: Verdict[], claims: NormalizedClaim[], flag: AnomalousFlag, dimension: number, entries: PortraitEntry[]): void {
  for (const claim of claims) {
    if (claim.kind !== 'anomalous') continue;
    const holds = anomalousClaimHolds(flag, dimension);
    const certificate = emptyCertificate('anomalous');
    certificate.notes.push(flag.reason);
    certificate.gaps = entries.flatMap((e) => e.certificate.gaps).filter((g, i, all) => all.findIndex((h) => sameLabel(h.gap, g.gap)) === i);
    const base = { claim: claim.id, kind: claim.kind, pointer: claim.pointer, gap: null, claimed: claim.value, certificate };
    if (holds === null) {
      verdicts.push({ ...base, outcome: 'unsettled', computed: null, estimate: null, message: `Whether the phase is anomalous could not be settled: ${flag.reason}.`, hint: 'settle the invariants the reason names first (their own verdicts say how)' });
    } else if (holds === claim.value) {
      verdicts.push({ ...base, outcome: 'confirmed', computed: holds, estimate: holds, message: `The phase is ${holds ? '' : 'not '}anomalous, as claimed: ${flag.reason}.`, hint: null });
    } else {
      const hint =
        dimension === 2 && flag.classification === 'anomalous'
          ? 'every gap carries a winding number, but some band has a nonzero Chern number; "anomalous" in model files means Chern-trivial anomalous'
          : null;
      verdicts.push({ ...base, outcome: 'contradicted', computed: holds, estimate: holds, message: `The phase is ${holds ? '' : 'not '}anomalous, but the file claims it ${claim.value ? 'is' : 'is not'}: ${flag.reason}.`, hint });
    }
  }
}
