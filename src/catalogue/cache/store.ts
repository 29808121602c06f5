/**
 * On-disk result cache under .strobe-cache/ (gitignored).
 *
 * Entry layout: .strobe-cache/results/<key[0..2]>/<key>.json holding
 *   { "format": 1, "key": …, "checksum": sha256(payloadText), "payloadText": … }
 * The payload travels as text so that the checksum covers exactly the bytes
 * we wrote. Writes go to a temporary file in the same directory followed by a
 * rename, which is atomic on one file system: a reader sees the old entry, the
 * new one, or nothing, never half a file. A torn or edited entry fails its
 * checksum on read, is reported as corrupt, removed, and recomputed.
 */
import { mkdirSync, readFileSync, renameSync, rmSync, writeFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { randomBytes } from 'node:crypto';
import { sha256Hex } from './cache-key.ts';

export const CACHE_FORMAT = 1;

/** Environment variable naming the cache directory (shared between jobs, restored and saved by CI). */
export const CACHE_DIR_VARIABLE = 'STROBE_CACHE_DIR';

/**
 * The cache directory: the command-line option, else $STROBE_CACHE_DIR, else
 * .strobe-cache/ in the working directory. Entries are content-addressed
 * (cache-key.ts) and written atomically, so jobs running at the same time, on
 * one machine or sharing a directory, never see half an entry.
 */
export function cacheRoot(option?: string, env: Record<string, string | undefined> = process.env): string {
  const chosen = option ?? env[CACHE_DIR_VARIABLE];
  return chosen !== undefined && chosen.trim() !== '' ? resolve(chosen) : join(process.cwd(), '.strobe-cache');
}

export type CacheLookup<T> =
  | { state: 'hit'; value: T }
  | { state: 'miss' }
  | { state: 'corrupt'; reason: string };

export interface CacheStats {
  hits: number;
  misses: number;
  corrupt: number;
  writes: number;
}

export class ResultCache {
  readonly root: string;
  readonly stats: CacheStats = { hits: 0, misses: 0, corrupt: 0, writes: 0 };

  constructor(root: string = cacheRoot()) {
    this.root = root;
  }

  pathFor(key: string): string {
    if (!/^[0-9a-f]{64}$/.test(key)) throw new RangeError(`cache key must be 64 hex digits, got "${key}"`);
    return join(this.root, 'results', key.slice(0, 2), `${key}.json`);
  }

  read<T>(key: string): CacheLookup<T> {
    const file = this.pathFor(key);
    let text: string;
    try {
      text = readFileSync(file, 'utf8');
    } catch {
      this.stats.misses++;
      return { state: 'miss' };
    }
    const reason = checkEntry(text, key);
    if (typeof reason === 'string') {
      this.stats.corrupt++;
      rmSync(file, { force: true });
      return { state: 'corrupt', reason: `${file}: ${reason}` };
    }
    this.stats.hits++;
    return { state: 'hit', value: reason.value as T };
  }

  write(key: string, value: unknown): void {
    const file = this.pathFor(key);
    mkdirSync(dirname(file), { recursive: true });
    const payloadText = JSON.stringify(value);
    const entry = JSON.stringify({ format: CACHE_FORMAT, key, checksum: sha256Hex(payloadText), payloadText });
    const temp = `${file}.${process.pid}.${randomBytes(6).toString('hex')}.tmp`;
    writeFileSync(temp, entry);
    renameSync(temp, file);
    this.stats.writes++;
  }
}

function checkEntry(text: string, key: string): string | { value: unknown } {
  let entry: { format?: unknown; key?: unknown; checksum?: unknown; payloadText?: unknown };
  try {
    entry = JSON.parse(text);
  } catch {
    return 'not valid JSON (partial write?)';
  }
  if (entry === null || typeof entry !== 'object') return 'not an object';
  if (entry.format !== CACHE_FORMAT) return `format ${String(entry.format)}, expected ${CACHE_FORMAT}`;
  if (entry.key !== key) return 'entry belongs to another key';
  if (typeof entry.payloadText !== 'string' || typeof entry.checksum !== 'string') return 'missing payload or checksum';
  if (sha256Hex(entry.payloadText) !== entry.checksum) return 'checksum mismatch';
  try {
    return { value: JSON.parse(entry.payloadText) };
  } catch {
    return 'payload is not valid JSON';
  }
}
