/**
 * Deterministic sharding of the catalogue and of sweeps across jobs (a CI job
 * matrix, or the tasks of an array job on a cluster).
 *
 * A model belongs to shard (h mod n) + 1, h the first 48 bits of sha256(id).
 * The assignment depends only on the model id and n: not on file order, the
 * machine or which other models exist, so adding a model never moves the rest,
 * and the shards of one n partition any catalogue (every model in exactly one).
 *
 * A sweep point with index p (first axis fastest) belongs to shard (p mod n) + 1:
 * neighbouring points go to different shards, so expensive regions of a phase
 * diagram (near transitions) are spread over all of them.
 *
 * The shard may be given as "i/n" (--shard) or read from the environment
 * (--shard-from VAR/n): array-job schedulers hand each task its index in a
 * variable, counted from 0 or from 1 depending on the scheduler and the job
 * (--shard-base).
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

/** 1-based shard that owns sweep point `index` among `count` shards. */
export function shardOfPoint(index: number, count: number): number {
  return (index % count) + 1;
}

/**
 * The shard given by `--shard-from VAR/n`: the index is read from environment
 * variable VAR (counted from `base`, 0 or 1), the count n is a number or the
 * name of another variable (e.g. CI_NODE_INDEX/CI_NODE_TOTAL).
 */
export function shardFromEnvironment(text: string, env: Record<string, string | undefined>, base = 1): ShardSpec {
  const match = /^\s*([A-Za-z_][A-Za-z0-9_]*)\s*\/\s*([A-Za-z_][A-Za-z0-9_]*|\d+)\s*$/.exec(text);
  if (!match) throw new ShardSpecError(`--shard-from expects VAR/n such as SLURM_ARRAY_TASK_ID/4 or CI_NODE_INDEX/CI_NODE_TOTAL, got "${text}"`);
  if (base !== 0 && base !== 1) throw new ShardSpecError(`--shard-base must be 0 or 1, got ${base}`);
  const read = (name: string): number => {
    const value = env[name];
    if (value === undefined || value.trim() === '') throw new ShardSpecError(`--shard-from ${text}: environment variable ${name} is not set (is this running as a task of an array job?)`);
    if (!/^\s*\d+\s*$/.test(value)) throw new ShardSpecError(`--shard-from ${text}: ${name}="${value}" is not a whole number`);
    return Number(value);
  };
  const index = read(match[1]) + (1 - base);
  const count = /^\d+$/.test(match[2]) ? Number(match[2]) : read(match[2]);
  try {
    return parseShard(`${index}/${count}`);
  } catch (e) {
    if (e instanceof ShardSpecError) {
      throw new ShardSpecError(`--shard-from ${text}: task index ${index - (1 - base)} (counted from ${base}) gives shard ${index} of ${count}, outside 1…${count}; check --shard-base`);
    }
    throw e;
  }
}

/** The shard of a run from its options (--shard wins over --shard-from); undefined for a whole run. */
export function resolveShard(options: { shard?: string; shardFrom?: string; shardBase?: string }, env: Record<string, string | undefined>): ShardSpec | undefined {
  if (options.shard !== undefined && options.shardFrom !== undefined) throw new ShardSpecError('give either --shard i/n or --shard-from VAR/n, not both');
  if (options.shard !== undefined) return parseShard(options.shard);
  if (options.shardFrom !== undefined) {
    const base = options.shardBase === undefined ? 1 : Number(options.shardBase);
    if (!(base === 0 || base === 1) || (options.shardBase !== undefined && !/^[01]$/.test(options.shardBase.trim()))) {
      throw new ShardSpecError(`--shard-base must be 0 or 1, got "${options.shardBase}"`);
    }
    return shardFromEnvironment(options.shardFrom, env, base);
  }
  if (options.shardBase !== undefined) throw new ShardSpecError('--shard-base needs --shard-from');
  return undefined;
}
