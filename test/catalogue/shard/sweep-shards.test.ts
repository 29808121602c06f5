/**
 * Sweeps split over jobs: the recipes of docs/sharding.md run end to end.
 * What must hold is a property of the recipe, not a number of ours: two shards
 * and a merge give byte for byte what one whole run gives (canonical JSON), and
 * a shared cache directory lets a later job reuse every point.
 */
import { describe, expect, it } from 'vitest';
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { capture, scratchDirectories } from '../../support/scratch.ts';
import { spawnSync } from 'node:child_process';
import { run as sweepCommand } from '../../../src/cli/commands/sweep.ts';
import { runMerge, runVerifiedCheck } from '../../../src/cli/commands/verify-summary.ts';
import { runSweep, runSweepShard } from '../../../src/catalogue/sweep/run-sweep.ts';
import { mergeSweepParts } from '../../../src/catalogue/sweep/sweep-part.ts';
import { ResultCache } from '../../../src/catalogue/cache/store.ts';
import { resolveShard, shardFromEnvironment, shardOfPoint } from '../../../src/catalogue/shard.ts';

const chain = 'test/fixtures/verification/two-step-chain-correct.json';
const vary = ['--vary', 'theta2=0.2:2.8:7'];
const scratch = scratchDirectories('strobe-sweep-shards-');

describe('shard indices', () => {
  it('assign sweep points round-robin, every point to exactly one shard', () => {
    for (const n of [1, 2, 3, 5]) {
      const owners = Array.from({ length: 23 }, (_, p) => shardOfPoint(p, n));
      for (let i = 1; i <= n; i++) expect(owners.filter((o) => o === i).length).toBeGreaterThanOrEqual(Math.floor(23 / n));
      expect(owners.every((o) => o >= 1 && o <= n)).toBe(true);
    }
  });

  it('read the task index of an array job from the environment, counted from 0 or 1', () => {
    expect(shardFromEnvironment('SLURM_ARRAY_TASK_ID/4', { SLURM_ARRAY_TASK_ID: '0' }, 0)).toEqual({ index: 1, count: 4 });
    expect(shardFromEnvironment('SGE_TASK_ID/4', { SGE_TASK_ID: '4' }, 1)).toEqual({ index: 4, count: 4 });
    expect(shardFromEnvironment('CI_NODE_INDEX/CI_NODE_TOTAL', { CI_NODE_INDEX: '2', CI_NODE_TOTAL: '3' })).toEqual({ index: 2, count: 3 });
    expect(() => shardFromEnvironment('PBS_ARRAY_INDEX/2', {})).toThrow('--shard-from PBS_ARRAY_INDEX/2: environment variable PBS_ARRAY_INDEX is not set (is this running as a task of an array job?)');
    expect(() => shardFromEnvironment('LSB_JOBINDEX/2', { LSB_JOBINDEX: '2' }, 0)).toThrow(/task index 2 \(counted from 0\) gives shard 3 of 2, outside 1…2; check --shard-base/);
    expect(() => shardFromEnvironment('T/2', { T: 'x' })).toThrow(/T="x" is not a whole number/);
    expect(() => resolveShard({ shard: '1/2', shardFrom: 'T/2' }, {})).toThrow(/not both/);
    expect(() => resolveShard({ shardFrom: 'T/2', shardBase: '2' }, { T: '1' })).toThrow(/--shard-base must be 0 or 1/);
  });
});

describe('strobe sweep over shards', () => {
  it('two shards (index from an array-job variable) and a merge write the file of one whole run', async () => {
    const d = scratch();
    const whole = capture();
    expect(await sweepCommand([chain, ...vary, '--no-cache', '--out', join(d, 'whole.json')], whole.io)).toBe(0);
    for (const task of ['0', '1']) {
      const c = capture();
      // A Slurm-style array job --array=0-1 hands each task its index in SLURM_ARRAY_TASK_ID.
      const code = await sweepCommand([chain, ...vary, '--no-cache', '--shard-from', 'SLURM_ARRAY_TASK_ID/2', '--shard-base', '0', '--out', join(d, `part-${task}.json`)], c.io, { SLURM_ARRAY_TASK_ID: task });
      expect(code, c.err.join('')).toBe(0);
      expect(c.out.join('')).toContain(`shard ${Number(task) + 1}/2: ${task === '0' ? 4 : 3} of 7 point(s) written`);
    }
    const merged = capture();
    expect(await runMerge([join(d, 'part-0.json'), join(d, 'part-1.json'), '--out', join(d, 'merged.json')], merged.io)).toBe(0);
    expect(readFileSync(join(d, 'merged.json'), 'utf8')).toBe(readFileSync(join(d, 'whole.json'), 'utf8'));
  });

  it('refuses to merge when a shard is missing or the parts belong to different sweeps', async () => {
    const spec = [{ name: 'theta2', start: 0.2, stop: 2.8, count: 7 }];
    const one = await runSweepShard(chain, spec, [], { index: 1, count: 2 }, { cache: false });
    expect(() => mergeSweepParts([{ source: 'part-1.json', part: one }])).toThrow('3 of 7 points are missing (first: 1, 3, 5); merged shards: 1/2. Is a shard\'s part absent?');
    const other = await runSweepShard(chain, [{ name: 'theta2', start: 0.2, stop: 2.8, count: 8 }], [], { index: 2, count: 2 }, { cache: false });
    expect(() => mergeSweepParts([{ source: 'a.json', part: one }, { source: 'b.json', part: other }])).toThrow(/b\.json: a different sweep/);
    expect(() => mergeSweepParts([{ source: 'a.json', part: one }, { source: 'a-again.json', part: one }])).toThrow('point 0 appears in both a.json and a-again.json; were the shards made with the same count n?');
  });

  it('share points through a cache directory: a whole run after the shards computes nothing', async () => {
    const d = scratch();
    const spec = [{ name: 'theta2', start: 0.2, stop: 2.8, count: 5 }];
    for (const index of [1, 2]) await runSweepShard(chain, spec, [], { index, count: 2 }, { cache: new ResultCache(d) });
    const cache = new ResultCache(d);
    const whole = await runSweep(chain, spec, [], { cache });
    expect(whole.points).toHaveLength(5);
    // Every point read from the shards' entries; only the whole sweep's own entry is written.
    expect(cache.stats.hits).toBe(5);
    expect(cache.stats.writes).toBe(1);
  });

  it('runs as an array job of the command itself: separate processes, the index from the environment', () => {
    const d = scratch();
    const strobe = (args: string[], env: Record<string, string> = {}) =>
      spawnSync(process.execPath, ['bin/strobe.mjs', ...args], { encoding: 'utf8', env: { ...process.env, ...env, STROBE_CACHE_DIR: join(d, 'cache') } });
    for (const task of ['1', '2']) {
      const r = strobe(['sweep', chain, '--vary', 'theta2=0.3:2.7:4', '--shard-from', 'SGE_TASK_ID/2', '--out', join(d, `p${task}.json`)], { SGE_TASK_ID: task });
      expect(r.status, r.stderr).toBe(0);
    }
    const merge = strobe(['merge', join(d, 'p1.json'), join(d, 'p2.json'), '--out', join(d, 'sweep.json')]);
    expect(merge.status, merge.stderr).toBe(0);
    const whole = strobe(['sweep', chain, '--vary', 'theta2=0.3:2.7:4', '--no-cache', '--out', join(d, 'whole.json')]);
    expect(whole.status, whole.stderr).toBe(0);
    expect(readFileSync(join(d, 'sweep.json'), 'utf8')).toBe(readFileSync(join(d, 'whole.json'), 'utf8'));
  }, 120_000);
});

describe('strobe check over shards', () => {
  it('spreads the points of declared sweeps over the shards; merging the shard directories gives the records of one whole run', async () => {
    const whole = scratch(), a = scratch(), b = scratch(), merged = scratch();
    const fixtures = [chain, 'test/fixtures/verification/qwz-sign-error.json'];
    const check = async (args: string[], env: Record<string, string> = {}) => runVerifiedCheck([...fixtures, '--workers', '0', '--no-cache', ...args], capture().io, env);
    await check(['--out', whole]);
    // A CI job matrix: the shard index comes from the matrix, here as CI_NODE_INDEX/CI_NODE_TOTAL.
    await check(['--shard-from', 'CI_NODE_INDEX/CI_NODE_TOTAL', '--out', a], { CI_NODE_INDEX: '1', CI_NODE_TOTAL: '2' });
    await check(['--shard', '2/2', '--out', b]);
    // Both shards computed points of the chain's sweep, whichever owns the model.
    const partFiles = [a, b].map((dir) => readdirSync(join(dir, 'sweep-parts')).flatMap((s) => readdirSync(join(dir, 'sweep-parts', s))));
    expect(partFiles).toEqual([['two-step-chain-correct.0.json'], ['two-step-chain-correct.0.json']]);
    const m = capture();
    expect(await runMerge([a, b, '--out', join(merged, 'catalogue.json')], m.io)).toBe(1); // qwz-sign-error is disputed
    expect(m.out.join('')).toContain('with the sweeps of 2 sweep parts');
    expect(readFileSync(join(merged, 'catalogue.json'), 'utf8')).toBe(readFileSync(join(whole, 'catalogue.json'), 'utf8'));
    for (const id of ['two-step-chain-correct', 'qwz-sign-error']) {
      expect(readFileSync(join(merged, 'models', `${id}.json`), 'utf8'), id).toBe(readFileSync(join(whole, 'models', `${id}.json`), 'utf8'));
    }
    const record = JSON.parse(readFileSync(join(merged, 'models', 'two-step-chain-correct.json'), 'utf8'));
    expect(record.sweeps[0].points).toHaveLength(5);
  }, 300_000);
});
