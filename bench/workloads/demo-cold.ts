/**
 * Workload: the cold check of the demo inventory, as a newcomer's `npm start`
 * runs it on a fresh clone: `strobe check` on models/ with no cache, in a child
 * process (worker threads, sweeps and records included; the Astro build that
 * `npm start` adds afterwards is not timed). Target on a 2-core machine:
 * ≤ 180 s wall. Prints the statuses and the five slowest models, whose compute
 * times come from the run's timings.json.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { measure } from '../measure.ts';

const TARGET_S = 180;

await measure('demo-cold', () => {
  const out = mkdtempSync(join(tmpdir(), 'strobe-bench-demo-'));
  try {
    const t0 = performance.now();
    const run = spawnSync(process.execPath, ['bin/strobe.mjs', 'check', '--no-cache', '--json', '--out', out, 'models'], { encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 });
    const seconds = (performance.now() - t0) / 1000;
    // Exit status 1 is expected: the collaborator's model is disputed on purpose.
    if (run.status !== 0 && run.status !== 1) throw new Error(`strobe check exited with ${run.status}: ${run.stderr.slice(-2000)}`);
    const summary = JSON.parse(run.stdout);
    const timings = JSON.parse(readFileSync(join(out, 'timings.json'), 'utf8')).models as Record<string, { totalMs: number }>;
    const computeSeconds = Object.values(timings).reduce((s, t) => s + t.totalMs, 0) / 1000;
    return {
      models: summary.models.length,
      counts: summary.counts,
      seconds,
      targetSeconds: TARGET_S,
      withinTarget: seconds <= TARGET_S,
      computeSecondsSummedOverModels: computeSeconds,
      slowest: Object.entries(timings)
        .sort((a, b) => b[1].totalMs - a[1].totalMs)
        .slice(0, 5)
        .map(([id, t]) => ({ id, seconds: t.totalMs / 1000 })),
    };
  } finally {
    rmSync(out, { recursive: true, force: true });
  }
});
