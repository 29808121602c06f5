/**
 * The verification task run in a worker thread (or inline). The model arrives
 * already loaded and validated by the main thread (plain data, copied by
 * structured clone), so workers never compile the schema validator again.
 * The engines are fixed by the module, so a task module with stand-in engines
 * can be swapped in for tests of the pipeline.
 */
import type { LoadedModel } from '../load.ts';
import type { EngineIdentity } from '../records/record-builder.ts';
import type { EngineSet } from '../verify/engines.ts';
import type { VerdictPolicy } from '../verify/policy.ts';
import type { ModelOutcome } from '../verify/verify-model.ts';
import { verifyModel } from '../verify/verify-model.ts';
import { realEngines } from '../verify/real-engines.ts';
import { statusStep } from './status-step.ts';
import { ResultCache } from '../cache/store.ts';

export interface VerifyTask {
  model: LoadedModel;
  engine: EngineIdentity;
  policy: VerdictPolicy;
  /** Leave the declared sweeps out (a sharded run computes their points as parts). */
  deferSweeps?: boolean;
  /** Directory of the result cache, for single sweep points (absent: no cache). */
  cacheRoot?: string;
}

export function makeHandler(engines: EngineSet) {
  return (task: VerifyTask, report: (step: string) => void = () => {}): ModelOutcome => {
    const outcome = verifyModel(task.model, engines, task.engine, task.policy, report, {
      ...(task.deferSweeps ? { defer: true } : {}),
      ...(task.cacheRoot !== undefined ? { cache: new ResultCache(task.cacheRoot) } : {}),
    });
    report(statusStep(outcome.record.status));
    return outcome;
  };
}

export const handleTask = makeHandler(realEngines);
