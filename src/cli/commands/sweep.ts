/**
 * strobe sweep <id|file> --vary NAME=start:stop:count [--vary …] [--quantity Q …] [--out FILE]
 *              [--shard i/n | --shard-from VAR/n [--shard-base 0|1]] [--cache-dir DIR] [--no-cache]
 * Maps invariants and gaps over a one- or two-parameter grid; with a shard,
 * computes that shard's points and writes them as a part for `strobe merge`.
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { dirname } from 'node:path';
import { canonicalJson } from '../../catalogue/records/canonical-json.ts';
import { ModelNotFoundError } from '../../catalogue/verify/inspect.ts';
import { parseVary, runSweep, runSweepShard, SweepRequestError, type SweepVary } from '../../catalogue/sweep/run-sweep.ts';
import { resolveShard, ShardSpecError, formatShard } from '../../catalogue/shard.ts';
import { cacheRoot, ResultCache } from '../../catalogue/cache/store.ts';
import { SWEEP_QUANTITIES, type SweepQuantity } from '../../catalogue/sweep/sweep-grid.ts';
import type { SweepRecord } from '../../catalogue/records/model-record.ts';
import type { CliIO } from './verify-summary.ts';

export const describe = `strobe sweep <id | file> --vary NAME=start:stop:count [--vary …] [--quantity Q …] [--out FILE] [--shard i/n | --shard-from VAR/n [--shard-base 0|1]] [--cache-dir DIR] [--no-cache]
  Recomputes the model over a grid of one or two parameters (count points from start to stop,
  inclusive) and maps the quantities: ${SWEEP_QUANTITIES.join(', ')} (default: minimalGap and the
  invariants of the model's dimension: chern and winding for sheets, invariant for chains). Values are settled integers or "·" when unsettled.
  --out FILE writes the result as JSON; otherwise a table is printed.
  --shard i/n computes only the points of shard i of n (point p belongs to shard (p mod n) + 1) and
  writes them as a part to --out; "strobe merge part-1.json … part-n.json --out sweep.json" joins the
  parts into the sweep a single run writes. --shard-from VAR/n reads the shard index from environment
  variable VAR (the task index of an array job, e.g. SLURM_ARRAY_TASK_ID, PBS_ARRAY_INDEX, SGE_TASK_ID,
  LSB_JOBINDEX, CI_NODE_INDEX; n may name a variable too, e.g. CI_NODE_INDEX/CI_NODE_TOTAL), counted
  from 1, or from 0 with --shard-base 0.
  --cache-dir DIR (or $STROBE_CACHE_DIR) keeps the result cache there instead of .strobe-cache/: every
  point is cached on its own, so jobs sharing the directory never compute a point twice.`;

export function formatSweep(s: SweepRecord): string {
  const keys = [...new Set(s.points.flatMap((p) => Object.keys(p.values)))].sort();
  const header = [...s.axes.map((a) => a.parameter), ...keys];
  const rows = s.points.map((p) => [
    ...s.axes.map((a) => String(Number(p.parameters[a.parameter].toPrecision(6)))),
    ...keys.map((k) => {
      if (p.error) return 'error';
      const v = p.values[k];
      return v === null || v === undefined ? '·' : Number.isInteger(v) ? String(v) : v.toPrecision(3);
    }),
  ]);
  const widths = header.map((h, c) => Math.max(h.length, ...rows.map((r) => r[c].length)));
  const lines = [header, ...rows].map((r) => r.map((cell, c) => cell.padStart(widths[c])).join('  '));
  const errors = s.points.filter((p) => p.error).map((p) => `  at ${JSON.stringify(p.parameters)}: ${p.error}`);
  return [...lines, ...(errors.length > 0 ? ['', 'points that could not be computed:', ...errors] : [])].join('\n') + '\n';
}

export async function run(argv: string[], io: CliIO, env: Record<string, string | undefined> = process.env): Promise<number> {
  const vary: SweepVary[] = [];
  const quantities: SweepQuantity[] = [];
  let out: string | undefined;
  let cache = true;
  let cacheDir: string | undefined;
  const shardOptions: { shard?: string; shardFrom?: string; shardBase?: string } = {};
  const positional: string[] = [];
  let shard;
  try {
    for (let i = 0; i < argv.length; i++) {
      const a = argv[i];
      const next = () => {
        const v = argv[++i];
        if (v === undefined) throw new SweepRequestError(`${a} needs a value`);
        return v;
      };
      if (a === '--vary') vary.push(parseVary(next()));
      else if (a.startsWith('--vary=')) vary.push(parseVary(a.slice(7)));
      else if (a === '--quantity') quantities.push(next() as SweepQuantity);
      else if (a === '--out') out = next();
      else if (a === '--no-cache') cache = false;
      else if (a === '--cache-dir') cacheDir = next();
      else if (a === '--shard') shardOptions.shard = next();
      else if (a === '--shard-from') shardOptions.shardFrom = next();
      else if (a === '--shard-base') shardOptions.shardBase = next();
      else if (a.startsWith('--')) throw new SweepRequestError(`unknown option ${a}`);
      else positional.push(a);
    }
    if (positional.length !== 1) throw new SweepRequestError('give exactly one model id or file');
    if (vary.length === 0) throw new SweepRequestError('give at least one --vary NAME=start:stop:count');
    shard = resolveShard(shardOptions, env);
    if (shard !== undefined && out === undefined) throw new SweepRequestError('a sharded sweep writes its part to a file: give --out FILE');
  } catch (e) {
    if (e instanceof SweepRequestError || e instanceof ShardSpecError) {
      io.stderr.write(`strobe sweep: ${e.message}\n${describe}\n`);
      return 2;
    }
    throw e;
  }
  const tty = io.stdout.isTTY === true;
  const store = cache ? new ResultCache(cacheRoot(cacheDir, env)) : false;
  const onProgress = (done: number, total: number) => {
    if (tty) io.stdout.write(`\rpoint ${done}/${total}`);
  };
  try {
    if (shard !== undefined) {
      const part = await runSweepShard(positional[0], vary, quantities, shard, { cache: store, onProgress });
      if (tty) io.stdout.write('\r\x1b[K');
      mkdirSync(dirname(out!), { recursive: true });
      writeFileSync(out!, canonicalJson(part));
      io.stdout.write(`shard ${formatShard(shard)}: ${part.points.length} of ${part.total} point(s) written to ${out}; join the parts with strobe merge\n`);
      return part.points.some((p) => p.point.error) ? 1 : 0;
    }
    const result = await runSweep(positional[0], vary, quantities, { cache: store, onProgress });
    if (tty) io.stdout.write('\r\x1b[K');
    if (out) {
      mkdirSync(dirname(out), { recursive: true });
      writeFileSync(out, canonicalJson(result));
      io.stdout.write(`${result.points.length} point(s) written to ${out}\n`);
    } else io.stdout.write(formatSweep(result));
    return result.points.some((p) => p.error) ? 1 : 0;
  } catch (e) {
    if (e instanceof SweepRequestError || e instanceof ModelNotFoundError) {
      io.stderr.write(`strobe sweep: ${e.message}\n`);
      return 2;
    }
    throw e;
  }
}
