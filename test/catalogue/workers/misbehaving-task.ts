// Verification task module for tests: hangs or dies on chosen files, verifies the rest for real.
import { handleTask as realHandleTask, type VerifyTask } from '../../../src/catalogue/workers/verify-task.ts';

export function handleTask(task: VerifyTask, report: (step: string) => void) {
  if (task.model.file.includes('wrong-frame')) {
    for (;;) {
      /* never returns: the pool must terminate this worker */
    }
  }
  if (task.model.file.includes('qwz-sign-error')) process.exit(3);
  return realHandleTask(task, report);
}
