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
    case 'oom': {
      // Ordinary objects until the heap is exhausted (typed arrays would live outside it).
      const hoard: object[] = [];
      for (;;) hoard.push({ a: [1, 2, 3, 4, 5, 6, 7, 8], b: `${hoard.length}` });
    }
    default:
      throw new Error(`unknown sample task ${task.kind}`);
  }
}
