/**
 * A small pool of worker threads that runs one task per model.
 *
 * - Size defaults to os.availableParallelism(); size 0 runs tasks in the
 *   calling thread. A busy thread cannot be interrupted from inside, so when a
 *   time limit is given, size 0 becomes one worker thread: the limit always holds.
 * - Each task gets a time limit (one for all, or one per task) counted from
 *   the moment a ready worker takes it; on expiry the worker is terminated, the
 *   task is reported as timed out and a fresh worker takes the next task.
 * - A task that throws is reported with its message; a worker that dies
 *   (uncaught error, out of memory, process.exit) is reported as crashed for
 *   the task it was running, and replaced. The other tasks always finish.
 * - Outcomes come back in the order of the input, whatever order tasks ended
 *   in, so callers get the same results for any pool size.
 *
 * Worker paths are built from process.cwd(), not import.meta.url, because the
 * site build bundles this module and import.meta.url then points into dist/.
 */
import { Worker } from 'node:worker_threads';
import { availableParallelism } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';

export type TaskOutcome<R> =
  | { state: 'done'; result: R; elapsedMs: number }
  | { state: 'threw'; message: string; elapsedMs: number }
  | { state: 'timed-out'; message: string; elapsedMs: number }
  | { state: 'crashed'; message: string; elapsedMs: number };

export interface PoolOptions {
  /** Absolute path of the .ts (or .js) module exporting handleTask(task, report). */
  entry: string;
  /** Number of worker threads; 0 runs in the calling thread. Default os.availableParallelism(). */
  size?: number;
  /** Time limit in milliseconds, for every task or per task index; with a limit, size 0 runs one worker thread instead of the calling thread. */
  timeLimitMs?: number | ((index: number) => number);
  /**
   * Old-generation heap limit of each worker thread in MB (resourceLimits): a task whose
   * JavaScript heap grows past it ends its worker only, reported as crashed, instead of
   * taking the whole process down. Typed arrays live outside this heap.
   */
  heapLimitMb?: number;
  /** Called when a task starts and at each progress note it sends. */
  onProgress?: (index: number, step: string) => void;
  /** Called when a task ends, in completion order. */
  onSettled?: (index: number, outcome: TaskOutcome<unknown>) => void;
}

/** Path of the worker host script, relative to the working directory (see module comment). */
export function workerHostPath(): string {
  return join(process.cwd(), 'src', 'catalogue', 'workers', 'worker-host.mjs');
}

export function defaultPoolSize(): number {
  return Math.max(1, availableParallelism());
}

type Handler = (task: unknown, report: (step: string) => void) => unknown;

async function runInline<T, R>(tasks: T[], options: PoolOptions): Promise<TaskOutcome<R>[]> {
  const mod = (await import(pathToFileURL(options.entry).href)) as { handleTask?: Handler };
  if (typeof mod.handleTask !== 'function') throw new Error(`${options.entry} does not export handleTask(task, report)`);
  const outcomes: TaskOutcome<R>[] = [];
  for (let i = 0; i < tasks.length; i++) {
    const start = performance.now();
    options.onProgress?.(i, 'started');
    let outcome: TaskOutcome<R>;
    try {
      const result = (await mod.handleTask(tasks[i], (step) => options.onProgress?.(i, step))) as R;
      outcome = { state: 'done', result, elapsedMs: performance.now() - start };
    } catch (error) {
      const message = error instanceof Error ? `${error.name}: ${error.message}` : String(error);
      outcome = { state: 'threw', message, elapsedMs: performance.now() - start };
    }
    outcomes.push(outcome);
    options.onSettled?.(i, outcome);
  }
  return outcomes;
}

function limitOf(options: PoolOptions, index: number): number | undefined {
  const limit = typeof options.timeLimitMs === 'function' ? options.timeLimitMs(index) : options.timeLimitMs;
  return limit !== undefined && limit > 0 ? limit : undefined;
}

export async function runTasks<T, R>(tasks: T[], options: PoolOptions): Promise<TaskOutcome<R>[]> {
  const limited = tasks.some((_, i) => limitOf(options, i) !== undefined);
  const requested = options.size ?? defaultPoolSize();
  const size = Math.min(requested <= 0 && limited ? 1 : requested, tasks.length);
  if (tasks.length === 0) return [];
  if (size <= 0) return runInline<T, R>(tasks, options);

  const outcomes: (TaskOutcome<R> | undefined)[] = new Array(tasks.length);
  let next = 0;
  let remaining = tasks.length;

  return new Promise((resolveAll) => {
    const finish = (index: number, outcome: TaskOutcome<R>) => {
      if (outcomes[index] !== undefined) return;
      outcomes[index] = outcome;
      remaining--;
      options.onSettled?.(index, outcome as TaskOutcome<unknown>);
      if (remaining === 0) resolveAll(outcomes as TaskOutcome<R>[]);
    };

    const spawn = () => {
      const worker = new Worker(workerHostPath(), {
        workerData: { entry: options.entry },
        ...(options.heapLimitMb !== undefined ? { resourceLimits: { maxOldGenerationSizeMb: options.heapLimitMb } } : {}),
      });
      let current = -1;
      let started = 0;
      let timer: NodeJS.Timeout | undefined;
      let retired = false;

      const retire = () => {
        retired = true;
        if (timer) clearTimeout(timer);
        worker.removeAllListeners();
        worker.on('error', () => {});
        void worker.terminate();
      };

      const take = () => {
        if (next >= tasks.length) {
          retire();
          return;
        }
        current = next++;
        started = performance.now();
        options.onProgress?.(current, 'started');
        const limit = limitOf(options, current);
        if (limit !== undefined) {
          const index = current;
          timer = setTimeout(() => {
            retire();
            finish(index, {
              state: 'timed-out',
              message: `timed out after ${(limit / 1000).toFixed(limit % 1000 === 0 ? 0 : 1)} s`,
              elapsedMs: performance.now() - started,
            });
            if (next < tasks.length) spawn();
          }, limit);
        }
        worker.postMessage({ id: current, task: tasks[current] });
      };

      const died = (why: string) => {
        if (retired) return;
        retire();
        if (current >= 0 && outcomes[current] === undefined) {
          finish(current, { state: 'crashed', message: `worker crashed: ${why}`, elapsedMs: performance.now() - started });
          if (next < tasks.length) spawn();
        } else if (current < 0) {
          // The host failed before taking any task (e.g. the entry did not load): every
          // queued task would meet the same fate, so report it against the next one.
          const index = next++;
          if (index < tasks.length) {
            finish(index, { state: 'crashed', message: `worker could not start: ${why}`, elapsedMs: 0 });
            if (next < tasks.length) spawn();
          }
        }
      };

      worker.on('message', (message: { kind: string; id?: number; step?: string; result?: R; message?: string }) => {
        if (message.kind === 'ready') {
          take();
          return;
        }
        if (message.id !== current) return;
        if (message.kind === 'progress') {
          options.onProgress?.(current, message.step ?? '');
          return;
        }
        if (timer) clearTimeout(timer);
        const elapsedMs = performance.now() - started;
        if (message.kind === 'result') finish(current, { state: 'done', result: message.result as R, elapsedMs });
        else finish(current, { state: 'threw', message: message.message ?? 'unknown error', elapsedMs });
        take();
      });
      worker.on('error', (error) => {
        const code = (error as { code?: string }).code;
        if (code === 'ERR_WORKER_OUT_OF_MEMORY') died(`out of memory: its JavaScript heap reached the limit of ${options.heapLimitMb ?? 'the default'} MB (--memory-limit)`);
        else died(error instanceof Error ? error.message : String(error));
      });
      worker.on('exit', (code) => died(`exited with code ${code}`));
    };

    for (let i = 0; i < size; i++) spawn();
  });
}
