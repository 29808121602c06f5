import { describe, expect, it } from 'vitest';
import { decimateRows, roundTo, strideFor, MAX_PLOT_MOMENTA } from '../../../src/catalogue/records/decimate.ts';
import { summarize } from '../../../src/catalogue/records/summary.ts';
import { invalidRecord } from '../../../src/catalogue/records/record-builder.ts';

describe('plot data decimation', () => {
  it('keeps every stride-th row and always the last one, so a periodic plot closes', () => {
    const rows = Array.from({ length: 200 }, (_, i) => i);
    const stride = strideFor(rows.length);
    expect(stride).toBe(Math.ceil(200 / MAX_PLOT_MOMENTA));
    const kept = decimateRows(rows, stride);
    expect(kept[0]).toBe(0);
    expect(kept.at(-1)).toBe(199);
    expect(kept.length).toBeLessThanOrEqual(MAX_PLOT_MOMENTA + 1);
    expect(kept.slice(0, -1).every((x) => x % stride === 0)).toBe(true);
    expect(decimateRows([1, 2, 3], 1)).toEqual([1, 2, 3]);
  });

  it('rounds to the given step without binary noise', () => {
    expect(roundTo(0.123456789, 1e-5)).toBe(0.12346);
    expect(roundTo(-0.0000049, 1e-5) === 0).toBe(true);
    expect(roundTo(0.1 + 0.2, 1e-3)).toBe(0.3);
  });
});

describe('catalogue summary', () => {
  it('sorts models by id in code-point order and counts each status', () => {
    const engine = { version: 'test', numericsHash: '0'.repeat(64) };
    const recs = ['b-model', 'a-model', 'B-model'].map((id) => invalidRecord(engine, id, `models/${id}.json`, []));
    const s = summarize(recs, engine, null);
    expect(s.models.map((m) => m.id)).toEqual(['B-model', 'a-model', 'b-model']);
    expect(s.counts.invalid).toBe(3);
    expect(s.counts.verified).toBe(0);
  });
});
