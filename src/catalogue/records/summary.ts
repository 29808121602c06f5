/** The catalogue summary (results/catalogue.json) and the merge of shard summaries. */
import type { CatalogueSummary, ModelRecord, ModelStatus } from './model-record.ts';
import { RECORD_FORMAT } from './model-record.ts';
import { compareCodePoints } from './canonical-json.ts';

const STATUSES: ModelStatus[] = ['verified', 'disputed', 'unsettled', 'portrait-only', 'invalid', 'failed'];

function emptyCounts(): Record<ModelStatus, number> {
  return Object.fromEntries(STATUSES.map((s) => [s, 0])) as Record<ModelStatus, number>;
}

export function summarize(records: ModelRecord[], engine: CatalogueSummary['engine'], shard: string | null): CatalogueSummary {
  const counts = emptyCounts();
  const models = [...records]
    .sort((a, b) => compareCodePoints(a.id, b.id) || compareCodePoints(a.file, b.file))
    .map((r) => {
      counts[r.status]++;
      return {
        id: r.id,
        file: r.file,
        title: r.model?.title ?? null,
        summary: r.model?.summary ?? null,
        tags: r.model?.tags ?? [],
        dimension: r.model?.dimension ?? null,
        status: r.status,
        statusReason: r.statusReason,
        anomalous: r.anomalous.classification,
        claims: { ...r.counts },
        draft: r.model?.draft ?? false,
      };
    });
  return { recordFormat: RECORD_FORMAT, engine, shard, counts, models };
}

export class MergeError extends Error {}

/**
 * Joins shard summaries into one. Refuses summaries from different engines
 * (their verdicts are not comparable) and models that appear in two shards
 * (the shards were not cut from the same catalogue with the same n).
 */
export function mergeSummaries(parts: { source: string; summary: CatalogueSummary }[]): CatalogueSummary {
  if (parts.length === 0) throw new MergeError('nothing to merge: give at least one catalogue summary');
  const engine = parts[0].summary.engine;
  const seen = new Map<string, string>();
  const models: CatalogueSummary['models'] = [];
  for (const { source, summary } of parts) {
    if (summary.recordFormat !== RECORD_FORMAT) {
      throw new MergeError(`${source}: record format ${summary.recordFormat}, expected ${RECORD_FORMAT}; re-run the shard with this version`);
    }
    if (summary.engine.version !== engine.version || summary.engine.numericsHash !== engine.numericsHash) {
      throw new MergeError(
        `${source}: produced by engine ${summary.engine.version} (${summary.engine.numericsHash.slice(0, 12)}), but ${parts[0].source} by ${engine.version} (${engine.numericsHash.slice(0, 12)}); re-run all shards from the same commit`,
      );
    }
    for (const m of summary.models) {
      const before = seen.get(m.id);
      if (before !== undefined) throw new MergeError(`model ${m.id} appears in both ${before} and ${source}; were the shards made with the same --shard i/n count?`);
      seen.set(m.id, source);
      models.push(m);
    }
  }
  models.sort((a, b) => compareCodePoints(a.id, b.id));
  const counts = emptyCounts();
  for (const m of models) counts[m.status]++;
  return { recordFormat: RECORD_FORMAT, engine, shard: null, counts, models };
}
