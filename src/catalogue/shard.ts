/**
 * Deterministic sharding of the catalogue across CI jobs.
 *
 * A model belongs to shard (h mod n) + 1, h the first 48 bits of sha256(id).
 * The assignment depends only on the model id and n: not on file order, the
 * machine or which other models exist, so adding a model never moves the rest,
 * and the shards of one n partition any catalogue (every model in exactly one).
 */
import { createHash } from 'node:crypto';

export interface ShardSpec {
  /** 1-based shard index. */
  index: number;
  count: number;
}

export class ShardSpecError extends Error {}

/** Parses "i/n" (1 ≤ i ≤ n) as given to --shard. */
export function parseShard(text: string): ShardSpec {
  const match = /^\s*(\d+)\s*\/\s*(\d+)\s*$/.exec(text);
  if (!match) throw new ShardSpecError(`--shard expects "i/n" such as 1/4, got "${text}"`);
  const index = Number(match[1]);
  const count = Number(match[2]);
  if (count < 1) throw new ShardSpecError(`--shard ${text}: the number of shards must be at least 1`);
  if (index < 1 || index > count) {
    throw new ShardSpecError(`--shard ${text}: the shard index must lie between 1 and ${count} (shards are numbered from 1)`);
  }
  return { index, count };
}

/** 1-based shard that owns `id` among `count` shards. */
export function shardOf(id: string, count: number): number {
  if (!Number.isInteger(count) || count < 1) throw new RangeError(`shard count must be a positive integer, got ${count}`);
  const h = parseInt(createHash('sha256').update(id, 'utf8').digest('hex').slice(0, 12), 16);
  return (h % count) + 1;
}

export function inShard(id: string, shard: ShardSpec | undefined): boolean {
  return shard === undefined || shardOf(id, shard.count) === shard.index;
}

export function formatShard(shard: ShardSpec): string {
  return `${shard.index}/${shard.count}`;
}
