/**
 * The physics must not depend on the handedness of the lattice basis. The
 * Qi–Wu–Zhang demo model (models/qwz-sheet.json, a₁ = x̂, a₂ = ŷ) is rewritten in
 * the left-handed basis a₁ = ŷ, a₂ = x̂: the lattice vectors swap, and so do the
 * components of every hopping offset (offsets count lattice vectors; positions
 * are Cartesian and stay). Both copies run through the real engines.
 *
 * Expected values, not taken from our output:
 *  - Qi, Wu, Zhang, PRB 74, 085308 (2006), from memory: at m = 1 the lower band has
 *    C = +1 for a₁ = x̂, a₂ = ŷ (the sign anchor of docs/conventions.md); C and W are
 *    reported in the Cartesian orientation, so the left-handed copy has the same C, and
 *    W(0) = C(lower band) (static limit, derived in docs/conventions.md).
 *  - Edge counts follow the table of docs/conventions.md with o = sign det(a₁, a₂):
 *    finite along a₁: low −o·W, high +o·W; along a₂: low +o·W, high −o·W.
 *  - A ribbon finite along a₂ of the left-handed copy is the ribbon finite along a₁ of
 *    the right-handed one (both finite along x̂, k∥ along ŷ): the same physical edge,
 *    so the same counts.
 */
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { verifyCatalogue, type CatalogueReport } from '../../../src/catalogue/verify/catalogue.ts';
import type { ModelRecord } from '../../../src/catalogue/records/model-record.ts';

const W0 = 1; // winding of the gap at 0: C of the lower QWZ band at m = 1 (published sign, see above)

/** Edge counts of the gap at 0 per docs/conventions.md. */
function tableCount(finiteAlong: 0 | 1, end: 'low' | 'high', o: 1 | -1): number {
  const low = (finiteAlong === 0 ? -1 : 1) * o * W0;
  return end === 'low' ? low : -low;
}

/** Parsed model JSON, rewritten in place. */
type Json = any;

function copy(id: string, leftHanded: boolean): Json {
  const doc: Json = JSON.parse(readFileSync('models/qwz-sheet.json', 'utf8'));
  delete doc.$schema;
  delete doc.sweeps;
  doc.id = id;
  if (leftHanded) {
    doc.lattice.vectors = [doc.lattice.vectors[1], doc.lattice.vectors[0]];
    for (const segment of doc.drive.segments) for (const term of [...(segment.hoppings ?? []), ...(segment.pairings ?? [])]) term.offset = [term.offset[1], term.offset[0]];
  }
  const o = leftHanded ? -1 : 1;
  const gap0 = doc.claims.gaps.find((g: Json) => g.quasienergy === 0);
  gap0.edgeModes = ([0, 1] as const).flatMap((f) => (['low', 'high'] as const).map((end) => ({ finiteAlong: f, end, count: tableCount(f, end, o) })));
  // Narrow ribbons keep the test fast: the QWZ edge states at m = 1 decay within about one cell.
  doc.numerics = { ...doc.numerics, ribbon: { width: 16, momenta: 48 } };
  return doc;
}

let report: CatalogueReport;
const record = (id: string): ModelRecord => report.records.find((r) => r.id === id)!;
const value = (r: ModelRecord, id: string) => r.portrait.find((e) => e.id === id)?.value;

beforeAll(async () => {
  const dir = mkdtempSync(path.join(tmpdir(), 'strobe-handedness-'));
  for (const [id, left] of [['qwz-right', false], ['qwz-left', true]] as const) writeFileSync(path.join(dir, `${id}.json`), JSON.stringify(copy(id, left), null, 2));
  report = await verifyCatalogue([dir], { workers: 0, cache: false });
}, 120_000);

describe('a left-handed copy of the Qi–Wu–Zhang model', () => {
  it('loads with the handedness warning and confirms the same C and W as the right-handed one', () => {
    const left = record('qwz-left');
    const right = record('qwz-right');
    expect(left.drive?.handedness).toBe('left');
    expect(left.diagnostics.map((d) => [d.severity, d.pointer])).toEqual([['warning', '/lattice/vectors']]);
    for (const r of [left, right]) {
      const chern = r.claims.filter((v) => v.kind === 'chern' || v.kind === 'winding');
      expect(chern.length).toBeGreaterThanOrEqual(4);
      for (const v of chern) expect(v, `${r.id} ${v.claim}: ${v.message}`).toMatchObject({ outcome: 'confirmed' });
    }
    expect(value(left, 'gap-0/winding')).toBe(W0);
    for (const id of ['gap-0/winding', 'gap-1/winding', 'band-0/chern', 'band-1/chern']) expect(value(left, id), id).toBe(value(right, id));
  });

  it('gives edge counts that follow the table of docs/conventions.md, and the same counts on the same physical edge', () => {
    const left = record('qwz-left');
    const right = record('qwz-right');
    for (const r of [left, right]) {
      const edges = r.claims.filter((v) => v.kind === 'edge-modes');
      expect(edges).toHaveLength(4);
      for (const v of edges) expect(v, `${r.id} ${v.claim}: ${v.message}`).toMatchObject({ outcome: 'confirmed' });
    }
    for (const end of ['low', 'high']) {
      expect(value(left, `gap-0/edge-1-${end}`)).toBe(value(right, `gap-0/edge-0-${end}`));
      expect(value(left, `gap-0/edge-0-${end}`)).toBe(value(right, `gap-0/edge-1-${end}`));
    }
    expect(left.status).toBe('verified');
    expect(right.status).toBe('verified');
  });
});
