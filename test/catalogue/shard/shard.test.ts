import { describe, expect, it } from 'vitest';
import { parseShard, shardOf, ShardSpecError } from '../../../src/catalogue/shard.ts';

const ids = Array.from({ length: 600 }, (_, i) => `model-${i}-${(i * 7919) % 1013}`);

describe('shard partition', () => {
  it('puts every model in exactly one shard, for n = 1 … 6', () => {
    for (let n = 1; n <= 6; n++) {
      const seen = new Map<string, number>();
      for (let i = 1; i <= n; i++) {
        for (const id of ids) if (shardOf(id, n) === i) seen.set(id, (seen.get(id) ?? 0) + 1);
      }
      expect(seen.size).toBe(ids.length);
      expect([...seen.values()].every((c) => c === 1)).toBe(true);
    }
  });

  it('spreads models evenly: each of 4 shards within ±30 % of 150 for 600 ids', () => {
    // A uniform hash gives counts ~ Binomial(600, 1/4): mean 150, sd ≈ 10.6, so ±45 is over 4 sd.
    const counts = [0, 0, 0, 0];
    for (const id of ids) counts[shardOf(id, 4) - 1]++;
    for (const c of counts) expect(Math.abs(c - 150)).toBeLessThanOrEqual(45);
  });

  it('depends only on the id, not on the other models', () => {
    const alone = shardOf('two-step-chain', 3);
    expect(ids.concat('two-step-chain').map((id) => shardOf(id, 3)).at(-1)).toBe(alone);
  });

  it('parses i/n and rejects malformed or out-of-range specs with a plain message', () => {
    expect(parseShard('2/3')).toEqual({ index: 2, count: 3 });
    expect(parseShard(' 1 / 1 ')).toEqual({ index: 1, count: 1 });
    expect(() => parseShard('0/3')).toThrow(ShardSpecError);
    expect(() => parseShard('0/3')).toThrow('--shard 0/3: the shard index must lie between 1 and 3 (shards are numbered from 1)');
    expect(() => parseShard('4/3')).toThrow(/between 1 and 3/);
    expect(() => parseShard('a/b')).toThrow('--shard expects "i/n" such as 1/4, got "a/b"');
    expect(() => parseShard('1/0')).toThrow(/at least 1/);
  });
});
