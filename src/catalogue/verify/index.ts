/**
 * Public entry points of verification for the CLI and the site build.
 * This file only re-exports; each piece lives in its own module.
 */
export { verifyCatalogue, modelCacheKey, type CatalogueReport, type ProgressEvent, type VerifyCatalogueOptions } from './catalogue.ts';
export { inspectModel, resolveModelPath, ModelNotFoundError, type InspectResult } from './inspect.ts';
export { runSweep, parseVary, SweepRequestError, type SweepVary } from '../sweep/run-sweep.ts';
export { SWEEP_QUANTITIES, type SweepQuantity } from '../sweep/sweep-grid.ts';
export { exitCodeFor, modelStatus } from './status.ts';
export { ANOMALOUS_DEFINITION } from './anomalous.ts';
export { DEFAULT_POLICY, type VerdictPolicy } from './policy.ts';
export type { Verdict, VerdictOutcome } from './verdict.ts';
export { writeResults } from '../records/write.ts';
export { mergeSummaries, MergeError } from '../records/summary.ts';
export { canonicalJson } from '../records/canonical-json.ts';
export type { CatalogueSummary, ModelRecord, ModelStatus, ModelTimings, SweepRecord } from '../records/model-record.ts';
export { parseShard, ShardSpecError, type ShardSpec } from '../shard.ts';
export { junitXml } from '../junit.ts';
