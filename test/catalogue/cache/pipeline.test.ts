import { afterEach, describe, expect, it } from 'vitest';
import { copyFileSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync, mkdirSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { verifyCatalogue } from '../../../src/catalogue/verify/catalogue.ts';
import { ResultCache } from '../../../src/catalogue/cache/store.ts';
import { canonicalJson } from '../../../src/catalogue/records/canonical-json.ts';

const dirs: string[] = [];
afterEach(() => {
  for (const d of dirs.splice(0)) rmSync(d, { recursive: true, force: true });
});

function setup() {
  const root = mkdtempSync(join(tmpdir(), 'strobe-pipeline-'));
  dirs.push(root);
  const models = join(root, 'models');
  mkdirSync(models);
  for (const id of ['two-step-chain-correct', 'two-step-chain-wrong-frame']) copyFileSync(`test/fixtures/verification/${id}.json`, join(models, `${id}.json`));
  return { models, cacheDir: join(root, 'cache') };
}

const text = (records: unknown[]) => records.map((r) => canonicalJson(r)).join('');

describe('verification cache', () => {
  it('computes on a miss, reuses unchanged models, recomputes a changed one', async () => {
    const { models, cacheDir } = setup();
    const cold = await verifyCatalogue([models], { workers: 0, cache: new ResultCache(cacheDir) });
    expect(cold.cache).toEqual({ hits: 0, misses: 2, corrupt: 0, writes: 2 });
    expect(Object.values(cold.timings).every((t) => !t.cached)).toBe(true);

    const warm = await verifyCatalogue([models], { workers: 0, cache: new ResultCache(cacheDir) });
    expect(warm.cache).toEqual({ hits: 2, misses: 0, corrupt: 0, writes: 0 });
    expect(text(warm.records)).toBe(text(cold.records));

    // Reformatting a file (same content) keeps the cache; changing a value does not.
    const file = join(models, 'two-step-chain-correct.json');
    const doc = JSON.parse(readFileSync(file, 'utf8'));
    writeFileSync(file, JSON.stringify(doc));
    const reformatted = await verifyCatalogue([models], { workers: 0, cache: new ResultCache(cacheDir) });
    expect(reformatted.cache?.hits).toBe(2);
    doc.parameters.theta1.value = '0.3*pi';
    writeFileSync(file, JSON.stringify(doc, null, 2));
    const changed = await verifyCatalogue([models], { workers: 0, cache: new ResultCache(cacheDir) });
    expect(changed.cache).toEqual({ hits: 1, misses: 1, corrupt: 0, writes: 1 });
    expect(changed.timings['two-step-chain-correct'].cached).toBe(false);
    expect(changed.timings['two-step-chain-wrong-frame'].cached).toBe(true);
  });

  it('detects a corrupt entry, reports it, recomputes and gives the same record', async () => {
    const { models, cacheDir } = setup();
    const cold = await verifyCatalogue([models], { workers: 0, cache: new ResultCache(cacheDir) });
    const bucketRoot = join(cacheDir, 'results');
    // A model's entry (the cache also holds single sweep points, which carry no record).
    const entries = readdirSync(bucketRoot).flatMap((bucket) => readdirSync(join(bucketRoot, bucket)).map((name) => join(bucketRoot, bucket, name)));
    const entry = entries.find((file) => readFileSync(file, 'utf8').includes('\\"record\\"'))!;
    expect(entry).toBeDefined();
    // Edit the stored payload the way a stray write would: still valid JSON, different bytes.
    const original = readFileSync(entry, 'utf8');
    const edited = original.replace('"payloadText":"{', '"payloadText":"{ ');
    expect(edited).not.toBe(original);
    writeFileSync(entry, edited);
    const again = await verifyCatalogue([models], { workers: 0, cache: new ResultCache(cacheDir) });
    expect(again.cache?.corrupt).toBe(1);
    expect(again.cacheProblems[0]).toMatch(/checksum mismatch/);
    expect(text(again.records)).toBe(text(cold.records));
  });
});
