/**
 * Cache keys: sha256 of the model's canonical content, the parameter overrides
 * and the engine fingerprint. Canonical content means key order and number
 * formatting do not matter (see records/canonical-json.ts), so reformatting a
 * model file keeps its cached result, while any change of value does not.
 * Verification options that change results (grids, tolerances) go in too.
 */
import { createHash } from 'node:crypto';
import { canonicalJson } from '../records/canonical-json.ts';
import type { EngineFingerprint } from './engine-fingerprint.ts';

export interface CacheKeyInput {
  /** The model as parsed from its file (comments and formatting already gone). */
  content: unknown;
  overrides?: Record<string, number>;
  engine: EngineFingerprint;
  /** Options that change results, e.g. { quick: true }. */
  options?: Record<string, unknown>;
}

export function sha256Hex(text: string | Uint8Array): string {
  return createHash('sha256').update(text).digest('hex');
}

export function cacheKey(input: CacheKeyInput): string {
  return sha256Hex(
    canonicalJson(
      {
        content: input.content,
        overrides: input.overrides ?? {},
        engine: { version: input.engine.version, numericsHash: input.engine.numericsHash },
        options: input.options ?? {},
      },
      0,
    ),
  );
}
