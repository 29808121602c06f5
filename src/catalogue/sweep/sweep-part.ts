/**
 * Sweep parts: the points of a sweep that one shard computed, and their merge.
 *
 * A part names what it belongs to — the engine, the model (id, file and the
 * sha256 of its canonical content) and the sweep (name, title, axes,
 * quantities) — and carries its points with their indices. Parts merge into
 * the sweep record only when they belong to the same engine, model content and
 * sweep, and their indices cover every point exactly once; the result is the
 * record a single run writes, byte for byte (canonical JSON).
 */
import type { SweepPoint, SweepRecord } from '../records/model-record.ts';
import { RECORD_FORMAT } from '../records/model-record.ts';
import { canonicalJson } from '../records/canonical-json.ts';
import { sha256Hex } from '../cache/cache-key.ts';
import type { SweepSpec } from './sweep-grid.ts';
import { assembleSweep, sweepSize } from './sweep-grid.ts';
import type { ShardSpec } from '../shard.ts';
import { formatShard } from '../shard.ts';

export const SWEEP_PART_KIND = 'sweep-part';

export interface SweepPart {
  kind: typeof SWEEP_PART_KIND;
  recordFormat: number;
  engine: { version: string; numericsHash: string };
  model: { id: string; file: string; content: string };
  sweep: SweepSpec;
  /** Position of the sweep among the model's declared sweeps (0 for a sweep asked on the command line). */
  position: number;
  /** "i/n". */
  shard: string;
  /** Points of the whole sweep. */
  total: number;
  points: { index: number; point: SweepPoint }[];
}

export class SweepMergeError extends Error {}

/** sha256 of a model document's canonical JSON: what parts of one sweep must agree on. */
export function contentHash(document: unknown): string {
  return sha256Hex(canonicalJson(document, 0));
}

export function makeSweepPart(
  engine: SweepPart['engine'],
  model: { id: string; file: string; document: unknown },
  spec: SweepSpec,
  shard: ShardSpec,
  points: { index: number; point: SweepPoint }[],
  position = 0,
): SweepPart {
  return {
    kind: SWEEP_PART_KIND,
    recordFormat: RECORD_FORMAT,
    engine: { version: engine.version, numericsHash: engine.numericsHash },
    model: { id: model.id, file: model.file, content: contentHash(model.document) },
    sweep: spec,
    position,
    shard: formatShard(shard),
    total: sweepSize(spec),
    points,
  };
}

export function isSweepPart(value: unknown): value is SweepPart {
  return typeof value === 'object' && value !== null && (value as { kind?: unknown }).kind === SWEEP_PART_KIND;
}

/** Joins the parts of one sweep (see the file comment); `sources` name them in messages. */
export function mergeSweepParts(parts: { source: string; part: SweepPart }[]): SweepRecord {
  if (parts.length === 0) throw new SweepMergeError('nothing to merge: give at least one sweep part');
  const first = parts[0];
  const identity = (p: SweepPart) => canonicalJson({ engine: p.engine, content: p.model.content, sweep: p.sweep, position: p.position }, 0);
  for (const { source, part } of parts) {
    if (part.recordFormat !== RECORD_FORMAT) throw new SweepMergeError(`${source}: record format ${part.recordFormat}, expected ${RECORD_FORMAT}; re-run the shard with this version`);
    if (part.engine.version !== first.part.engine.version || part.engine.numericsHash !== first.part.engine.numericsHash) {
      throw new SweepMergeError(`${source}: computed by engine ${part.engine.version} (${part.engine.numericsHash.slice(0, 12)}), ${first.source} by ${first.part.engine.version} (${first.part.engine.numericsHash.slice(0, 12)}); run all shards from the same commit`);
    }
    if (part.model.content !== first.part.model.content) throw new SweepMergeError(`${source}: made from another version of model ${part.model.id} than ${first.source} (the file changed between the shards)`);
    if (identity(part) !== identity(first.part)) throw new SweepMergeError(`${source}: a different sweep (${part.sweep.name}) than ${first.source} (${first.part.sweep.name})`);
  }
  const total = first.part.total;
  const byIndex = new Map<number, { source: string; point: SweepPoint }>();
  for (const { source, part } of parts) {
    for (const { index, point } of part.points) {
      if (!(Number.isInteger(index) && index >= 0 && index < total)) throw new SweepMergeError(`${source}: point index ${index} outside 0…${total - 1}`);
      const before = byIndex.get(index);
      if (before !== undefined) throw new SweepMergeError(`point ${index} appears in both ${before.source} and ${source}; were the shards made with the same count n?`);
      byIndex.set(index, { source, point });
    }
  }
  const missing = Array.from({ length: total }, (_, i) => i).filter((i) => !byIndex.has(i));
  if (missing.length > 0) {
    const shards = [...new Set(parts.map((p) => p.part.shard))].sort().join(', ');
    throw new SweepMergeError(`${missing.length} of ${total} points are missing (first: ${missing.slice(0, 5).join(', ')}); merged shards: ${shards}. Is a shard's part absent?`);
  }
  return assembleSweep(first.part.sweep, Array.from({ length: total }, (_, i) => byIndex.get(i)!.point));
}
