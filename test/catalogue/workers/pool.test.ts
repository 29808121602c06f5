import { describe, expect, it } from 'vitest';
import { join } from 'node:path';
import { runTasks } from '../../../src/catalogue/workers/pool.ts';
import type { SampleTask } from './sample-tasks.ts';

const entry = join(process.cwd(), 'test', 'catalogue', 'workers', 'sample-tasks.ts');

describe('worker pool', () => {
  it('returns outcomes in input order for any pool size', async () => {
    const tasks: SampleTask[] = [1, 2, 3, 4, 5].map((x) => ({ kind: 'square', x }));
    for (const size of [0, 1, 2]) {
      const outcomes = await runTasks<SampleTask, number>(tasks, { entry, size });
      expect(outcomes.map((o) => (o.state === 'done' ? o.result : null))).toEqual([1, 4, 9, 16, 25]);
    }
  });

  it('terminates a task past its time limit, reports it and finishes the rest', async () => {
    const tasks: SampleTask[] = [{ kind: 'square', x: 3 }, { kind: 'hang' }, { kind: 'square', x: 5 }];
    const outcomes = await runTasks<SampleTask, number>(tasks, { entry, size: 1, timeLimitMs: 1500 });
    expect(outcomes[0]).toMatchObject({ state: 'done', result: 9 });
    expect(outcomes[1]).toMatchObject({ state: 'timed-out', message: 'timed out after 1.5 s' });
    expect(outcomes[2]).toMatchObject({ state: 'done', result: 25 });
  });

  it('enforces a time limit with size 0 too, by running the tasks in a worker thread', async () => {
    const tasks: SampleTask[] = [{ kind: 'hang' }, { kind: 'square', x: 4 }];
    const outcomes = await runTasks<SampleTask, number>(tasks, { entry, size: 0, timeLimitMs: 1500 });
    expect(outcomes[0]).toMatchObject({ state: 'timed-out', message: 'timed out after 1.5 s' });
    expect(outcomes[1]).toMatchObject({ state: 'done', result: 16 });
  });

  it('reports a worker that dies or a task that throws, and the rest still finish', async () => {
    const tasks: SampleTask[] = [{ kind: 'exit' }, { kind: 'square', x: 2 }, { kind: 'throw' }, { kind: 'square', x: 6 }];
    const progress: string[] = [];
    const outcomes = await runTasks<SampleTask, number>(tasks, {
      entry,
      size: 2,
      timeLimitMs: 20_000,
      onProgress: (i, step) => progress.push(`${i}:${step}`),
    });
    expect(outcomes[0].state).toBe('crashed');
    expect(outcomes[0].state === 'crashed' && outcomes[0].message).toContain('exited with code 7');
    expect(outcomes[1]).toMatchObject({ state: 'done', result: 4 });
    expect(outcomes[2]).toMatchObject({ state: 'threw', message: 'Error: model blew up on purpose' });
    expect(outcomes[3]).toMatchObject({ state: 'done', result: 36 });
    expect(progress).toContain('1:task square');
  });

  it('caps each worker heap: a task that outgrows it is reported as crashed, out of memory, and the rest finish', async () => {
    const tasks: SampleTask[] = [{ kind: 'square', x: 3 }, { kind: 'oom' }, { kind: 'square', x: 7 }];
    const outcomes = await runTasks<SampleTask, number>(tasks, { entry, size: 1, heapLimitMb: 48, timeLimitMs: 60_000 });
    expect(outcomes[0]).toMatchObject({ state: 'done', result: 9 });
    expect(outcomes[1]).toMatchObject({ state: 'crashed' });
    expect((outcomes[1] as { message: string }).message).toMatch(/out of memory: its JavaScript heap reached the limit of 48 MB/);
    expect(outcomes[2]).toMatchObject({ state: 'done', result: 49 });
  }, 60_000);
});
