/**
 * The engine fingerprint that every cache key includes: a constant version that
 * the team bumps when results change meaning, plus a hash of the numerics
 * sources read at run time, so that editing any file under src/numerics or
 * src/catalogue/verify invalidates every cached result without anyone remembering to bump a number.
 */
import { createHash } from 'node:crypto';
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative, sep } from 'node:path';

/** Bump when the meaning or layout of verification results changes outside src/numerics. */
export const ENGINE_VERSION = '0.6.0';

export interface EngineFingerprint {
  version: string;
  /** sha256 over the sorted (path, content) pairs of the numerics sources. */
  numericsHash: string;
  /** Number of source files hashed (a sanity figure for reports). */
  files: number;
}

function listFiles(dir: string): string[] {
  const out: string[] = [];
  for (const name of readdirSync(dir).sort()) {
    const full = join(dir, name);
    const info = statSync(full);
    if (info.isDirectory()) out.push(...listFiles(full));
    else if (/\.(ts|mts|js|mjs)$/.test(name)) out.push(full);
  }
  return out;
}

/** Hashes a source tree (paths relative to it, '/'-separated so the hash is the same on every OS). */
export function hashSourceTree(root: string): { hash: string; files: number } {
  const hash = createHash('sha256');
  const files = listFiles(root);
  for (const file of files) {
    const rel = relative(root, file).split(sep).join('/');
    const body = readFileSync(file);
    hash.update(`${rel}\0${body.length}\0`);
    hash.update(body);
  }
  return { hash: hash.digest('hex'), files: files.length };
}

const memo = new Map<string, EngineFingerprint>();

/**
 * Fingerprint of the sources under `root`; by default src/numerics together with
 * src/catalogue/verify of the working directory, since the verdicts, their
 * messages and remedies are cached with the numbers and must not outlive a
 * change of the code that writes them.
 */
export function engineFingerprint(root?: string): EngineFingerprint {
  const key = root ?? '';
  const hit = memo.get(key);
  if (hit) return hit;
  let fingerprint: EngineFingerprint;
  if (root !== undefined) {
    const { hash, files } = hashSourceTree(root);
    fingerprint = { version: ENGINE_VERSION, numericsHash: hash, files };
  } else {
    const trees = [join(process.cwd(), 'src', 'numerics'), join(process.cwd(), 'src', 'catalogue', 'verify')].map(hashSourceTree);
    const combined = createHash('sha256');
    for (const t of trees) combined.update(`${t.hash}\0`);
    fingerprint = { version: ENGINE_VERSION, numericsHash: combined.digest('hex'), files: trees.reduce((n, t) => n + t.files, 0) };
  }
  memo.set(key, fingerprint);
  return fingerprint;
}

/** Forgets memoised fingerprints (tests that edit a source tree). */
export function clearFingerprintMemo(): void {
  memo.clear();
}
