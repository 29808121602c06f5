/**
 * The progress step with which a verification task names the status of the
 * model it finished ("status unsettled"), sent just before its result, so
 * that progress lines can say how a model ended, not only that it did. Kept
 * apart from the task module so that the command line can read it without
 * loading the engines.
 */
const STATUS_STEP = 'status ';

export function statusStep(status: string): string {
  return STATUS_STEP + status;
}

/** The status named by a progress step made by statusStep, else undefined. */
export function modelStatusOfStep(step: string): string | undefined {
  return step.startsWith(STATUS_STEP) ? step.slice(STATUS_STEP.length) : undefined;
}
