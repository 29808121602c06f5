/**
 * The verification task run in a worker thread (or inline): check the model
 * source again (cheap, and keeps the task self-contained), then verify it.
 * The engines are fixed by the module, so a task module with stand-in engines
 * can be swapped in for tests of the pipeline.
 */
import { checkModelSource } from '../load.ts';
import type { EngineIdentity } from '../records/record-builder.ts';
import { invalidRecord } from '../records/record-builder.ts';
import type { EngineSet } from '../verify/engines.ts';
import type { VerdictPolicy } from '../verify/policy.ts';
import type { ModelOutcome } from '../verify/verify-model.ts';
import { verifyModel } from '../verify/verify-model.ts';
import { realEngines } from '../verify/real-engines.ts';

export interface VerifyTask {
  file: string;
  source: string;
  engine: EngineIdentity;
  policy: VerdictPolicy;
}

export function makeHandler(engines: EngineSet) {
  return (task: VerifyTask, report: (step: string) => void = () => {}): ModelOutcome => {
    const { model, diagnostics } = checkModelSource(task.file, task.source);
    if (!model) {
      const id = task.file.replace(/^.*\//, '').replace(/\.json$/, '');
      return { record: invalidRecord(task.engine, id, task.file, diagnostics), timings: { totalMs: 0, stages: {}, cached: false } };
    }
    return verifyModel(model, engines, task.engine, task.policy, report);
  };
}

export const handleTask = makeHandler(realEngines);
