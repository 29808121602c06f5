/** Model status from its verdicts (definitions in records/model-record.ts). */
import type { ModelStatus } from '../records/model-record.ts';
import type { Verdict } from './verdict.ts';

export function countVerdicts(verdicts: Verdict[]): { confirmed: number; contradicted: number; unsettled: number } {
  const counts = { confirmed: 0, contradicted: 0, unsettled: 0 };
  for (const v of verdicts) counts[v.outcome]++;
  return counts;
}

export function modelStatus(verdicts: Verdict[]): { status: ModelStatus; reason: string } {
  const c = countVerdicts(verdicts);
  if (verdicts.length === 0) return { status: 'portrait-only', reason: 'the file makes no claims; the computed portrait is shown' };
  if (c.contradicted > 0) {
    const first = verdicts.find((v) => v.outcome === 'contradicted')!;
    return { status: 'disputed', reason: `${c.contradicted} of ${verdicts.length} claim(s) contradicted, first ${first.claim}` };
  }
  if (c.unsettled > 0) {
    const first = verdicts.find((v) => v.outcome === 'unsettled')!;
    return { status: 'unsettled', reason: `${c.unsettled} of ${verdicts.length} claim(s) unsettled, first ${first.claim}` };
  }
  return { status: 'verified', reason: `all ${verdicts.length} claim(s) confirmed` };
}

/** Exit code of a check run: 1 when any model is disputed, invalid or failed (or unsettled under strict). */
export function exitCodeFor(statuses: ModelStatus[], strict: boolean): 0 | 1 {
  const bad = statuses.some((s) => s === 'disputed' || s === 'invalid' || s === 'failed' || (strict && s === 'unsettled'));
  return bad ? 1 : 0;
}
