// Task module for the pool tests: behaviours chosen by the task itself.
export interface SampleTask {
  kind: 'square' | 'hang' | 'exit' | 'throw' | 'oom';
  x?: number;
}

export async function handleTask(task: SampleTask, report: (step: string) => void): Promise<number> {
  report(`task ${task.kind}`);
  switch (task.kind) {
    case 'square':
      return (task.x ?? 0) * (task.x ?? 0);
    case 'hang':
      // Busy loop: a timer-based wait could be cut short, a busy one must be terminated.
      for (;;) {
        /* spin */
      }
    case 'exit':
      process.exit(7);
      return -1;
    case 'throw':
      throw new Error('model blew up on purpose');
    default:
      throw new Error(`unknown sample task ${task.kind}`);
  }
}
