/**
 * The limits one model is verified under, and the refusal of a model whose
 * estimated cost (work-estimate.ts) exceeds them.
 *
 * Time: a default limit per model (DEFAULT_TIME_LIMIT_SECONDS); a model file
 * may set its own with numerics.timeLimit (at most an hour, the schema says);
 * `strobe check --time-limit S` sets it for every model and wins over both.
 * The work budget is the time limit itself: a model whose estimated compute
 * time exceeds it is refused before anything is computed, and a model that
 * runs over it anyway (the estimate is a central one, not a bound) is stopped.
 * Memory: a budget per model (DEFAULT_MEMORY_LIMIT_BYTES, `--memory-limit MB`),
 * checked against the estimate only; a file cannot raise it.
 */
import type { Issue } from '../diagnostics.ts';
import type { ModelDocument } from '../model-types.generated.ts';
import type { CostDriver, StageEstimate, WorkEstimate } from './work-estimate.ts';

export const DEFAULT_TIME_LIMIT_SECONDS = 600;
export const DEFAULT_MEMORY_LIMIT_BYTES = 2e9;

export interface LimitOptions {
  /** From the command line: replaces the default and every file's numerics.timeLimit. */
  timeLimitSeconds?: number;
  memoryLimitBytes?: number;
}

export interface ModelLimits {
  timeLimitSeconds: number;
  timeLimitSource: 'default' | 'model file' | 'command line';
  memoryLimitBytes: number;
}

export function limitsFor(doc: ModelDocument | undefined, options: LimitOptions = {}): ModelLimits {
  const memoryLimitBytes = options.memoryLimitBytes ?? DEFAULT_MEMORY_LIMIT_BYTES;
  if (options.timeLimitSeconds !== undefined) return { timeLimitSeconds: options.timeLimitSeconds, timeLimitSource: 'command line', memoryLimitBytes };
  const own = doc?.numerics?.timeLimit;
  if (own !== undefined) return { timeLimitSeconds: own, timeLimitSource: 'model file', memoryLimitBytes };
  return { timeLimitSeconds: DEFAULT_TIME_LIMIT_SECONDS, timeLimitSource: 'default', memoryLimitBytes };
}

/** "3.4 s", "12 min", "2.3 h". */
export function durationText(seconds: number): string {
  if (seconds < 60) return `${Number(seconds.toPrecision(2))} s`;
  if (seconds < 3600) return `${Number((seconds / 60).toPrecision(2))} min`;
  if (seconds < 86400 * 3) return `${Number((seconds / 3600).toPrecision(2))} h`;
  return `${Number((seconds / 86400).toPrecision(2))} days`;
}

/** "512 MB", "4.1 GB". */
export function bytesText(bytes: number): string {
  if (bytes < 1e9) return `${Number((bytes / 1e6).toPrecision(2))} MB`;
  return `${Number((bytes / 1e9).toPrecision(2))} GB`;
}

/** A JSON pointer as a dotted field name for messages: /numerics/ribbon/width → numerics.ribbon.width. */
function fieldName(pointer: string): string {
  return pointer.slice(1).replace(/\/(\d+)(?=\/|$)/g, '[$1]').replaceAll('/', '.');
}

function blame(stage: StageEstimate): CostDriver {
  return stage.drivers.reduce((best, d) => (d.excess > best.excess ? d : best), stage.drivers[0]);
}

const FIELD_ADVICE: Record<string, string> = {
  '/numerics/kGrid': 'lower numerics.kGrid (default 24 per direction for sheets, 128 for chains; the Chern refinement doubles it up to 128)',
  '/numerics/ribbon/width': 'lower numerics.ribbon.width (default 24 cells; a few decay lengths suffice)',
  '/numerics/ribbon/momenta': 'lower numerics.ribbon.momenta (default 200)',
  '/numerics/chainLength': 'lower numerics.chainLength (by default 10 bulk decay lengths, at most 160 cells)',
  '/lattice/orbitals': 'a smaller unit cell costs less: the work grows with the cube of the states per cell',
  '/drive/segments': 'fewer segments, or fewer with time-dependent terms, cost less',
};

/**
 * The refusal of a model whose estimate exceeds its limits, located at the
 * field that most inflates the costliest stage; undefined when it fits.
 */
export function budgetIssue(estimate: WorkEstimate, limits: ModelLimits): Issue | undefined {
  const overTime = estimate.seconds > limits.timeLimitSeconds;
  const overMemory = estimate.memoryBytes > limits.memoryLimitBytes;
  if (!overTime && !overMemory) return undefined;
  const key = overTime ? (s: StageEstimate) => s.seconds : (s: StageEstimate) => s.memoryBytes;
  const stage = estimate.stages.reduce((best, s) => (key(s) > key(best) ? s : best), estimate.stages[0]);
  const driver = blame(stage);
  const needs = [overTime ? `about ${durationText(estimate.seconds)} of computing` : '', overMemory ? `about ${bytesText(estimate.memoryBytes)} of memory` : ''].filter(Boolean).join(' and ');
  const allowed = [
    `${durationText(limits.timeLimitSeconds)} (time limit: ${limits.timeLimitSource === 'default' ? 'the default' : `from the ${limits.timeLimitSource}`})`,
    `${bytesText(limits.memoryLimitBytes)} of memory`,
  ].join(' and ');
  const field = fieldName(driver.pointer);
  const advice = driver.pointer.startsWith('/sweeps/') ? `fewer sweep points (${field})` : (FIELD_ADVICE[driver.pointer] ?? `a smaller ${field}`);
  const raise = overTime ? 'raise the time limit with --time-limit or numerics.timeLimit' : 'raise the memory budget with --memory-limit';
  return {
    pointer: driver.pointer,
    message: `not computed: ${field} asks for ${driver.text}; verification would need ${needs} (estimate; ${stage.stage}: ${stage.detail}); this model may use ${allowed}`,
    hint: `${advice}; or ${raise}`,
  };
}
