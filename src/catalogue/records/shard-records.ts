/**
 * Files of sharded check runs and their reassembly.
 *
 * A shard of `strobe check --shard i/n --out DIR` writes the records of the
 * models it owns (DIR/models/<id>.json, without sweeps), its summary
 * (DIR/catalogue.shard-i-of-n.json) and its points of every declared sweep
 * (DIR/sweep-parts/shard-i-of-n/<id>.<position>.json). `strobe merge` joins the
 * summaries and puts each record's sweeps back from the parts of all shards
 * (sweep-part.ts), so the merged results equal those of one whole run.
 */
import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import type { ModelRecord, SweepRecord } from './model-record.ts';
import { canonicalJson } from './canonical-json.ts';
import { writeTextAtomic } from './write.ts';
import type { SweepPart } from '../sweep/sweep-part.ts';
import { isSweepPart, mergeSweepParts, SweepMergeError } from '../sweep/sweep-part.ts';

export const SWEEP_PARTS_DIR = 'sweep-parts';

/** Writes a shard's sweep parts under DIR/sweep-parts/shard-i-of-n/. */
export function writeSweepParts(outDir: string, parts: SweepPart[]): string[] {
  return parts.map((part) => {
    const file = join(outDir, SWEEP_PARTS_DIR, `shard-${part.shard.replace('/', '-of-')}`, `${part.model.id}.${part.position}.json`);
    writeTextAtomic(file, canonicalJson(part));
    return file;
  });
}

/** Every sweep part found under DIR/sweep-parts/ of the given directories. */
export function readSweepParts(dirs: string[]): { source: string; part: SweepPart }[] {
  const found: { source: string; part: SweepPart }[] = [];
  for (const dir of [...new Set(dirs)]) {
    const root = join(dir, SWEEP_PARTS_DIR);
    if (!existsSync(root)) continue;
    for (const shardDir of readdirSync(root).sort()) {
      const full = join(root, shardDir);
      if (!statSync(full).isDirectory()) continue;
      for (const name of readdirSync(full).sort()) {
        if (!name.endsWith('.json')) continue;
        const source = join(full, name);
        const value: unknown = JSON.parse(readFileSync(source, 'utf8'));
        if (!isSweepPart(value)) throw new SweepMergeError(`${source}: not a sweep part`);
        found.push({ source, part: value });
      }
    }
  }
  return found;
}

/**
 * The records of `ids`, read from the first of `dirs` that holds each, with
 * their sweeps rebuilt from `parts` (grouped by model and sweep position). A
 * model without a record file is skipped (a merge of summaries alone), unless
 * it has sweep parts: then its record is missing.
 */
export function completeRecords(ids: string[], dirs: string[], parts: { source: string; part: SweepPart }[]): ModelRecord[] {
  const byModel = new Map<string, Map<number, { source: string; part: SweepPart }[]>>();
  for (const p of parts) {
    const sweeps = byModel.get(p.part.model.id) ?? new Map();
    byModel.set(p.part.model.id, sweeps);
    const list = sweeps.get(p.part.position) ?? [];
    sweeps.set(p.part.position, list);
    list.push(p);
  }
  const records: ModelRecord[] = [];
  for (const id of ids) {
    const file = dirs.map((d) => join(d, 'models', `${id}.json`)).find((f) => existsSync(f));
    const sweeps = byModel.get(id);
    if (file === undefined) {
      if (sweeps !== undefined) throw new SweepMergeError(`sweep parts of model ${id} were found but not its record (models/${id}.json) in ${dirs.join(', ')}`);
      continue;
    }
    const record = JSON.parse(readFileSync(file, 'utf8')) as ModelRecord;
    if (sweeps !== undefined && record.status !== 'invalid' && record.status !== 'failed') {
      const rebuilt: SweepRecord[] = [...sweeps.keys()].sort((a, b) => a - b).map((position) => mergeSweepParts(sweeps.get(position)!));
      record.sweeps = rebuilt;
    }
    records.push(record);
  }
  return records;
}
