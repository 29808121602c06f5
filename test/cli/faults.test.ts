// Faults: a run killed at random points keeps every model it reported, and
// nothing half-written; stopping `strobe site` stops its build child.
import { describe, expect, it } from 'vitest';
import { spawn, spawnSync } from 'node:child_process';
import { copyFileSync, existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { readRecordFile } from '../../src/catalogue/records/read-records.ts';
import { verifyCatalogue } from '../../src/catalogue/verify/catalogue.ts';
import { ResultCache } from '../../src/catalogue/cache/store.ts';
import { seededRandom } from '../support/random.ts';

const MODELS = ['verification/two-step-chain-correct', 'verification/two-step-chain-onsite', 'verification/two-step-chain-wrong-frame', 'invalid/unknown-orbital', 'invalid/trailing-comma'];

function inventory(): string {
  const dir = mkdtempSync(join(tmpdir(), 'strobe-fault-'));
  const models = join(dir, 'models');
  mkdirSync(models);
  for (const m of MODELS) copyFileSync(`test/fixtures/${m}.json`, join(models, `${m.split('/')[1]}.json`));
  return dir;
}

/** Runs strobe check, killing it (SIGKILL: no chance to clean up) after `killAfterMs`; returns what it printed. */
function killedRun(models: string, out: string, killAfterMs: number): Promise<string> {
  return new Promise((resolve) => {
    const child = spawn(process.execPath, ['bin/strobe.mjs', 'check', '--no-cache', '--workers', '1', '--out', out, models], { stdio: ['ignore', 'pipe', 'ignore'] });
    let stdout = '';
    child.stdout.on('data', (d) => (stdout += d));
    const timer = setTimeout(() => child.kill('SIGKILL'), killAfterMs);
    child.on('close', () => {
      clearTimeout(timer);
      resolve(stdout);
    });
  });
}

describe('a run killed at random points', () => {
  it('keeps a whole, valid record for every model it reported, with the status it reported', async () => {
    const random = seededRandom(31);
    const root = inventory();
    for (let run = 0; run < 2; run++) {
      const out = join(root, `results-${run}`);
      // Between about one and two models into the run (worker start-up included), varied by the seed.
      const stdout = await killedRun(join(root, 'models'), out, 1500 + Math.round(6000 * random()));
      const reported = [...stdout.matchAll(/^\[\d+\/\d+\] ([a-z0-9-]+): (verified|disputed|unsettled|portrait-only|invalid|failed) in /gm)].map((m) => [m[1], m[2]]);
      for (const [id, status] of reported) {
        const read = readRecordFile(join(out, 'models', `${id}.json`));
        expect('record' in read, `${id} was reported ${status} but its record is missing or damaged`).toBe(true);
        if ('record' in read) expect(read.record.status, id).toBe(status);
      }
      // Whatever else is there is whole: records are renamed into place, never written in place.
      for (const name of existsSync(join(out, 'models')) ? readdirSync(join(out, 'models')).filter((n) => n.endsWith('.json')) : []) {
        expect('record' in readRecordFile(join(out, 'models', name)), name).toBe(true);
      }
    }
  }, 120_000);

  it('hands each record over, and writes its cache entry, before the model is reported done', async () => {
    const cache = new ResultCache(mkdtempSync(join(tmpdir(), 'strobe-fault-cache-')));
    const handed = new Set<string>();
    const checked: string[] = [];
    await verifyCatalogue(['test/fixtures/verification/two-step-chain-correct.json', 'test/fixtures/verification/two-step-chain-onsite.json'], {
      workers: 1,
      cache,
      onRecord: (record) => handed.add(record.id),
      onProgress: (event) => {
        if (event.step !== 'done') return;
        expect(handed.has(event.id), event.id).toBe(true);
        checked.push(event.id);
        expect(cache.stats.writes).toBe(checked.length);
      },
    });
    expect(checked).toHaveLength(2);
  });
});

describe('stopping strobe site', () => {
  /** Starts `strobe site` on one invalid file and waits for its astro build child. */
  async function siteWithBuild(): Promise<{ root: string; site: ReturnType<typeof spawn>; build: number; distBefore: string | null }> {
    const root = mkdtempSync(join(tmpdir(), 'strobe-stop-'));
    const file = join(root, 'unknown-orbital.json');
    copyFileSync('test/fixtures/invalid/unknown-orbital.json', file);
    const out = join(root, 'results');
    expect(spawnSync(process.execPath, ['bin/strobe.mjs', 'check', '--no-cache', '--out', out, file]).status).toBe(1);
    const distBefore = existsSync('dist') ? readdirSync('dist').join() : null;
    const site = spawn(process.execPath, ['bin/strobe.mjs', 'site', '--skip-check', '--out', out, file], { stdio: 'ignore' });
    const childOf = (pid: number): number[] => {
      try {
        return readFileSync(`/proc/${pid}/task/${pid}/children`, 'utf8').trim().split(/\s+/).filter(Boolean).map(Number);
      } catch {
        return [];
      }
    };
    // The build child is the one running astro (the TypeScript loader has a child of its own).
    const isBuild = (pid: number) => {
      try {
        return readFileSync(`/proc/${pid}/cmdline`, 'utf8').includes('astro.js');
      } catch {
        return false;
      }
    };
    let build: number | undefined;
    for (let i = 0; i < 300 && build === undefined; i++) {
      await new Promise((r) => setTimeout(r, 50));
      build = childOf(site.pid!).find(isBuild);
    }
    expect(build, 'the build child never started').toBeDefined();
    return { root, site, build: build!, distBefore };
  }

  /** Whether a process still runs (a zombie waiting for a reaper counts as ended). */
  const running = (pid: number) => {
    try {
      return !/^State:\s+Z/m.test(readFileSync(`/proc/${pid}/status`, 'utf8'));
    } catch {
      return false;
    }
  };

  /** The build child ends within 5 s, its half-built folder is gone and dist/ is as it was. */
  async function expectBuildGone(sitePid: number, build: number, distBefore: string | null): Promise<void> {
    for (let i = 0; i < 100 && running(build); i++) await new Promise((r) => setTimeout(r, 50));
    expect(running(build)).toBe(false);
    expect(existsSync(`.dist-building-${sitePid}`)).toBe(false);
    expect(existsSync('dist') ? readdirSync('dist').join() : null).toBe(distBefore);
  }

  it('stops its build child and removes the half-built folder', async () => {
    const { root, site, build, distBefore } = await siteWithBuild();
    const exited = new Promise<number | null>((r) => site.on('exit', (code) => r(code)));
    site.kill('SIGTERM');
    expect(await exited).toBe(143);
    await expectBuildGone(site.pid!, build, distBefore);
    rmSync(root, { recursive: true, force: true });
  }, 60_000);

  it('ends the build child when strobe site is killed outright (SIGKILL), and removes its folder', async () => {
    const { root, site, build, distBefore } = await siteWithBuild();
    const exited = new Promise<NodeJS.Signals | null>((r) => site.on('exit', (_code, signal) => r(signal)));
    site.kill('SIGKILL');
    expect(await exited).toBe('SIGKILL');
    await expectBuildGone(site.pid!, build, distBefore);
    rmSync(root, { recursive: true, force: true });
  }, 60_000);
});
