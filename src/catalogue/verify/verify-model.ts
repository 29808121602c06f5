/**
 * Verifies one loaded model: claims → verdicts with certificates, the
 * computed portrait, the anomalous flag, declared sweeps, and the status.
 * Problems with the file found only now (a quantity that will not evaluate,
 * a drive that will not compile) make the model invalid with a located
 * diagnostic; an engine error makes it failed. Nothing here throws for bad input.
 */
import type { Diagnostic } from '../diagnostics.ts';
import type { LoadedModel } from '../load.ts';
import { diagnosticFor } from '../load.ts';
import { CompileError } from '../compile.ts';
import type { Quantity } from '../model-types.generated.ts';
import { evaluateQuantity, isIssue } from '../parameters.ts';
import type { ModelRecord, ModelTimings } from '../records/model-record.ts';
import { RECORD_FORMAT } from '../records/model-record.ts';
import type { EngineIdentity } from '../records/record-builder.ts';
import { driveSummary, failedRecord, invalidRecord, modelMetadata, parameterRecords, recordDiagnostic } from '../records/record-builder.ts';
import { runSweepGrid, type SweepQuantity } from '../sweep/sweep-grid.ts';
import { ANOMALOUS_DEFINITION } from './anomalous.ts';
import type { NormalizedClaim } from './claims.ts';
import { normalizeClaims } from './claims.ts';
import type { AnalysisRequest, EngineSet } from './engines.ts';
import type { ChainView } from './chain-view.ts';
import type { CheckedSheetPortrait } from './sheet-verdicts.ts';
import type { VerdictPolicy } from './policy.ts';
import { DEFAULT_POLICY } from './policy.ts';
import { analysePoint } from './analyse-point.ts';
import { bandPath } from '../records/band-path.ts';
import { countVerdicts, modelStatus } from './status.ts';

export interface ModelOutcome {
  record: ModelRecord;
  timings: ModelTimings;
}

class QuantityProblem extends Error {
  constructor(readonly pointer: string, message: string, readonly hint?: string, readonly offsetInString?: number) {
    super(message);
  }
}

function locatedDiagnostic(loaded: LoadedModel, pointer: string, message: string, hint?: string, offsetInString?: number): Diagnostic {
  return diagnosticFor(loaded.file, loaded.source, { pointer, message, ...(hint !== undefined ? { hint } : {}), ...(offsetInString !== undefined ? { offsetInString } : {}) });
}

export function quantityEvaluator(parameters: Record<string, number>) {
  const scope = new Map(Object.entries(parameters));
  return (quantity: Quantity, pointer: string): number => {
    const value = evaluateQuantity(quantity, scope, pointer);
    if (isIssue(value)) throw new QuantityProblem(value.pointer, value.message, value.hint, value.offsetInString);
    return value;
  };
}

/** The second system size for edge and end counts, as a multiple of the first. */
export const SECOND_SIZE_FACTOR = 1.5;

/**
 * Engines that, whenever a ribbon or open chain gave a settled count,
 * recompute the counts on a ribbon 1.5× as wide or a chain 1.5× as long (same
 * k grid, bulk invariants skipped) and hand them to the verdicts next to the
 * first ones (checkRibbons, checkEndModes): a count is settled only when both
 * sizes agree (evidence.ts, countAtTwoSizes). Plots and records keep the first size.
 */
export function withSecondSize(engines: EngineSet): EngineSet {
  const larger = (n: number) => Math.ceil(SECOND_SIZE_FACTOR * n);
  return {
    compile: (model, overrides) => engines.compile(model, overrides),
    sheet: (compiled, request): CheckedSheetPortrait => {
      const portrait = engines.sheet(compiled, request);
      if (request.skip.has('edges') || !portrait.ribbons.some((r) => r.counts.some((c) => c.settled))) return portrait;
      const check: AnalysisRequest = {
        ...request,
        skip: new Set(['chern', 'winding']),
        ribbonDirections: portrait.ribbons.map((r) => r.finiteDirection),
        hints: { ...request.hints, ribbon: { ...request.hints?.ribbon, width: larger(Math.max(...portrait.ribbons.map((r) => r.width))) } },
      };
      return { ...portrait, checkRibbons: engines.sheet(compiled, check).ribbons };
    },
    chain: (compiled, request): ChainView => {
      const view = engines.chain(compiled, request);
      if (request.skip.has('edges') || !view.endModes.some((m) => m.settled)) return view;
      const length = Math.max(...view.endModes.map((m) => m.chainLength));
      const check: AnalysisRequest = { ...request, hints: { ...request.hints, chainLength: larger(length) } };
      return { ...view, checkEndModes: engines.chain(compiled, check).endModes };
    },
  };
}

export function verifyModel(
  loaded: LoadedModel,
  engines: EngineSet,
  engine: EngineIdentity,
  policy: VerdictPolicy = DEFAULT_POLICY,
  onStep: (step: string) => void = () => {},
): ModelOutcome {
  const start = performance.now();
  const doc = loaded.document;
  const timing = (stages: Record<string, number>): ModelTimings => ({ totalMs: performance.now() - start, stages, cached: false });

  let claims: NormalizedClaim[];
  let symmetricTimes: number[];
  let sweeps: { name: string; title: string | null; axes: { parameter: string; start: number; stop: number; count: number }[]; quantities: SweepQuantity[] }[];
  try {
    const evaluate = quantityEvaluator(loaded.parameters);
    claims = normalizeClaims(doc, evaluate);
    symmetricTimes = (doc.claims?.symmetries?.chiral?.symmetricTimes ?? []).map((q, i) => evaluate(q, `/claims/symmetries/chiral/symmetricTimes/${i}`));
    sweeps = (doc.sweeps ?? []).map((s, i) => ({
      name: s.name,
      title: s.title ?? null,
      axes: s.axes.map((a, j) => ({
        parameter: a.parameter,
        start: evaluate(a.start, `/sweeps/${i}/axes/${j}/start`),
        stop: evaluate(a.stop, `/sweeps/${i}/axes/${j}/stop`),
        count: a.count,
      })),
      quantities: [...s.quantities],
    }));
  } catch (error) {
    if (!(error instanceof QuantityProblem)) throw error;
    const d = locatedDiagnostic(loaded, error.pointer, error.message, error.hint, error.offsetInString);
    return { record: invalidRecord(engine, loaded.id, loaded.file, [d, ...loaded.warnings], doc), timings: timing({}) };
  }

  onStep('analysing');
  let point;
  try {
    point = analysePoint(loaded, claims, withSecondSize(engines), policy, { symmetricTimes });
  } catch (error) {
    if (error instanceof CompileError) {
      const diagnostics = error.issues.map((i) => locatedDiagnostic(loaded, i.pointer, i.message, i.hint, i.offsetInString));
      return { record: invalidRecord(engine, loaded.id, loaded.file, [...diagnostics, ...loaded.warnings], doc), timings: timing({}) };
    }
    const message = error instanceof Error ? `${error.name}: ${error.message}` : String(error);
    return { record: failedRecord(engine, loaded, 'error', `the engine raised an error: ${message}`), timings: timing({}) };
  }

  const sweepRecords = [];
  const sweepStart = performance.now();
  for (const sweep of sweeps) {
    onStep(`sweep ${sweep.name}`);
    sweepRecords.push(runSweepGrid(loaded, claims, engines, policy, sweep, symmetricTimes, (done, total) => onStep(`sweep ${sweep.name} ${done}/${total}`)));
  }
  const stages: Record<string, number> = { ...point.stages, sweeps: performance.now() - sweepStart };
  const pathStart = performance.now();
  try {
    point.analysis.bandPath = bandPath(point.drive.drive);
  } catch {
    point.analysis.bandPath = null; // plot data only: a failure here must not change any verdict
  }
  stages.bandPath = performance.now() - pathStart;

  const { status, reason } = modelStatus(point.verdicts);
  const record: ModelRecord = {
    recordFormat: RECORD_FORMAT,
    engine,
    id: loaded.id,
    file: loaded.file,
    sourceHash: loaded.sourceHash,
    status,
    statusReason: reason,
    model: modelMetadata(doc),
    parameters: parameterRecords(doc, loaded.parameters),
    drive: driveSummary(point.drive.drive, point.drive.nambu),
    analysis: point.analysis,
    claims: point.verdicts,
    counts: countVerdicts(point.verdicts),
    portrait: point.entries,
    anomalous: { ...point.anomalous, definition: ANOMALOUS_DEFINITION },
    sweeps: sweepRecords,
    diagnostics: loaded.warnings.map(recordDiagnostic),
    incident: null,
    budget: null,
  };
  return { record, timings: timing(stages) };
}
