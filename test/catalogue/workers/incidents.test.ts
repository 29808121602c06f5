import { describe, expect, it, vi } from 'vitest';
import { join } from 'node:path';
import { verifyCatalogue, type ProgressEvent } from '../../../src/catalogue/verify/catalogue.ts';
import { reportProblems } from '../../../src/catalogue/records/report-validation.ts';
import { canonicalJson } from '../../../src/catalogue/records/canonical-json.ts';
import { progressReporter, summaryTable } from '../../../src/cli/commands/verify-summary.ts';
import { statusStep } from '../../../src/catalogue/workers/status-step.ts';

const files = ['two-step-chain-correct', 'two-step-chain-wrong-frame', 'qwz-sign-error'].map((id) => `test/fixtures/verification/${id}.json`);

describe('models that hang or crash', () => {
  it('are reported as failed with the reason, and the other models finish', async () => {
    const events: ProgressEvent[] = [];
    const report = await verifyCatalogue(files, {
      workers: 2,
      cache: false,
      // Generous, so that the well-behaved model finishes even on a loaded machine.
      timeLimitSeconds: 10,
      taskModule: join(process.cwd(), 'test', 'catalogue', 'workers', 'misbehaving-task.ts'),
      onProgress: (e) => events.push(e),
    });
    const byId = Object.fromEntries(report.records.map((r) => [r.id, r]));
    expect(byId['two-step-chain-wrong-frame']).toMatchObject({ status: 'failed', incident: { kind: 'timed-out', message: 'timed out after 10 s' } });
    expect(byId['qwz-sign-error'].status).toBe('failed');
    expect(byId['qwz-sign-error'].incident).toMatchObject({ kind: 'crashed', message: 'worker crashed: exited with code 3' });
    expect(byId['two-step-chain-correct'].status).toBe('verified');
    expect(report.summary.counts.failed).toBe(2);
    for (const r of report.records) expect(reportProblems(JSON.parse(canonicalJson(r))), r.id).toEqual([]);
    expect(events.filter((e) => e.step === 'timed-out').map((e) => e.id)).toEqual(['two-step-chain-wrong-frame']);
    // The table names every model with its status.
    const table = summaryTable(report);
    expect(table).toMatch(/two-step-chain-wrong-frame\s+failed/);
    expect(table).toMatch(/3 models: 2 failed, 1 verified/);
  });
});

describe('progress lines', () => {
  const event = (step: string, id = 'm-1'): ProgressEvent => ({ id, index: 0, total: 2, step, elapsedMs: 1500 });
  it('are plain lines per finished model, naming its status, when not on a terminal', () => {
    const out: string[] = [];
    const p = progressReporter({ stdout: { write: (t: string) => out.push(t) }, stderr: { write: () => {} } });
    p.onProgress(event('started'));
    p.onProgress(event('analysing'));
    p.onProgress(event(statusStep('unsettled')));
    p.onProgress(event('done'));
    p.onProgress(event('cached', 'm-2'));
    p.finish();
    expect(out).toEqual(['[1/2] m-1: unsettled in 1.5 s\n', '[2/2] m-2: cached (unchanged)\n']);
  });

  it('say "done" for a finished task that reported no status, never "verified"', () => {
    const out: string[] = [];
    const p = progressReporter({ stdout: { write: (t: string) => out.push(t) }, stderr: { write: () => {} } });
    p.onProgress(event('done'));
    p.finish();
    expect(out).toEqual(['[1/2] m-1: done in 1.5 s\n']);
  });
  it('rewrite one line on a terminal with model, step and elapsed time', () => {
    const out: string[] = [];
    const p = progressReporter({ stdout: { write: (t: string) => out.push(t), isTTY: true }, stderr: { write: () => {} } }, 0);
    p.onProgress(event('analysing'));
    p.onProgress(event('done'));
    p.finish();
    expect(out[0]).toBe('\r[0/2] m-1: analysing 1.5 s');
    // The shorter line is padded to cover the previous one.
    expect(out[1]).toBe('\r' + '[1/2] m-1: done 1.5 s'.padEnd('[0/2] m-1: analysing 1.5 s'.length));
    expect(out[2]).toMatch(/^\r +\r$/);
  });

  it('refresh the elapsed time on a terminal while a model runs', () => {
    // A fake clock: the refresh is driven by timers, so the test does not depend on wall time.
    vi.useFakeTimers({ toFake: ['setInterval', 'clearInterval', 'performance'] });
    try {
      const out: string[] = [];
      const p = progressReporter({ stdout: { write: (t: string) => out.push(t), isTTY: true }, stderr: { write: () => {} } }, 20);
      p.onProgress({ id: 'slow', index: 0, total: 1, step: 'analysing', elapsedMs: 0 });
      vi.advanceTimersByTime(300);
      p.finish();
      const frames = out.filter((t) => t.includes('slow: analysing'));
      // One frame at the start and one per 20 ms tick.
      expect(frames.length).toBe(1 + 300 / 20);
      expect(frames.at(-1)).toContain('slow: analysing 0.3 s');
    } finally {
      vi.useRealTimers();
    }
  });
});
