import { afterEach, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, rmSync, writeFileSync, mkdirSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { createHash } from 'node:crypto';
import { ResultCache } from '../../../src/catalogue/cache/store.ts';
import { cacheKey } from '../../../src/catalogue/cache/cache-key.ts';
import { clearFingerprintMemo, ENGINE_VERSION, engineFingerprint, hashSourceTree } from '../../../src/catalogue/cache/engine-fingerprint.ts';

const dirs: string[] = [];
function scratch(): string {
  const d = mkdtempSync(join(tmpdir(), 'strobe-cache-test-'));
  dirs.push(d);
  return d;
}
afterEach(() => {
  for (const d of dirs.splice(0)) rmSync(d, { recursive: true, force: true });
  clearFingerprintMemo();
});

const engine = { version: ENGINE_VERSION, numericsHash: 'a'.repeat(64), files: 1 };

describe('cache keys', () => {
  it('are sha256 of the canonical content: key order and formatting do not matter, values do', () => {
    const k1 = cacheKey({ content: { id: 'm', parameters: { J: 1.5, T: 2 } }, engine });
    const k2 = cacheKey({ content: { parameters: { T: 2.0, J: 1.5 }, id: 'm' }, engine });
    const k3 = cacheKey({ content: { id: 'm', parameters: { J: 1.5000001, T: 2 } }, engine });
    expect(k1).toMatch(/^[0-9a-f]{64}$/);
    expect(k2).toBe(k1);
    expect(k3).not.toBe(k1);
    expect(cacheKey({ content: { id: 'm', parameters: { J: 1.5, T: 2 } }, overrides: { J: 1 }, engine })).not.toBe(k1);
    expect(cacheKey({ content: { id: 'm', parameters: { J: 1.5, T: 2 } }, engine: { ...engine, numericsHash: 'b'.repeat(64) } })).not.toBe(k1);
  });

  it('change when any numerics source changes', () => {
    const root = scratch();
    mkdirSync(join(root, 'linalg'));
    writeFileSync(join(root, 'a.ts'), 'export const a = 1;\n');
    writeFileSync(join(root, 'linalg', 'b.ts'), 'export const b = 2;\n');
    const before = engineFingerprint(root);
    expect(before.files).toBe(2);
    // The hash is sha256 over "path\0length\0content" records in path order; recompute it independently.
    const h = createHash('sha256');
    for (const [rel, body] of [['a.ts', 'export const a = 1;\n'], ['linalg/b.ts', 'export const b = 2;\n']]) {
      h.update(`${rel}\0${Buffer.byteLength(body)}\0`);
      h.update(body);
    }
    expect(before.numericsHash).toBe(h.digest('hex'));
    writeFileSync(join(root, 'linalg', 'b.ts'), 'export const b = 3;\n');
    expect(hashSourceTree(root).hash).not.toBe(before.numericsHash);
  });
});

describe('result cache', () => {
  const key = 'c'.repeat(64);

  it('misses, then hits with the stored value', () => {
    const cache = new ResultCache(scratch());
    expect(cache.read(key)).toEqual({ state: 'miss' });
    cache.write(key, { status: 'verified', x: [1, 2] });
    expect(cache.read(key)).toEqual({ state: 'hit', value: { status: 'verified', x: [1, 2] } });
    expect(cache.stats).toEqual({ hits: 1, misses: 1, corrupt: 0, writes: 1 });
  });

  it('detects a truncated entry and an edited payload, removes them and reports a miss afterwards', () => {
    const cache = new ResultCache(scratch());
    cache.write(key, { status: 'verified' });
    const file = cache.pathFor(key);
    const text = readFileSync(file, 'utf8');
    writeFileSync(file, text.slice(0, Math.floor(text.length / 2)));
    const torn = cache.read(key);
    expect(torn.state).toBe('corrupt');
    expect(torn.state === 'corrupt' && torn.reason).toMatch(/not valid JSON/);
    expect(cache.read(key).state).toBe('miss');

    cache.write(key, { status: 'verified' });
    writeFileSync(file, readFileSync(file, 'utf8').replace('verified', 'disputed'));
    const edited = cache.read(key);
    expect(edited.state === 'corrupt' && edited.reason).toMatch(/checksum mismatch/);
  });

  it('leaves no temporary files behind and rejects malformed keys', () => {
    const root = scratch();
    const cache = new ResultCache(root);
    cache.write(key, 1);
    const dir = join(root, 'results', key.slice(0, 2));
    expect(readFileSync(join(dir, `${key}.json`), 'utf8')).toContain('"checksum"');
    expect(() => cache.pathFor('../etc')).toThrow(/64 hex digits/);
  });
});
