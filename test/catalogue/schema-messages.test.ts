/**
 * The texts users see for schema violations. Each case breaks a valid document
 * in one place; the messages are pinned so that changes to them are deliberate.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { validateDocument } from '../../src/catalogue/schema-validation.ts';

const valid = () => JSON.parse(readFileSync('test/fixtures/valid/minimal-sheet.json', 'utf8'));

function issuesAfter(change: (doc: any) => void) {
  const doc = valid();
  change(doc);
  return validateDocument(doc).map((i) => [i.pointer, i.message, i.hint ?? '']);
}

describe('schema messages', () => {
  it('accepts the valid fixture', () => {
    expect(validateDocument(valid())).toEqual([]);
  });

  it('missing property, with the property description as hint', () => {
    expect(issuesAfter((d) => delete d.drive.period)).toMatchInlineSnapshot(`
      [
        [
          "/drive",
          "missing property "period"",
          "period: Period T > 0 (hbar = 1, so energies are in units of 1/T times whatever T is)",
        ],
      ]
    `);
  });

  it('wrong type', () => {
    expect(issuesAfter((d) => (d.lattice.orbitals = { A: [0, 0] }))).toMatchInlineSnapshot();
  });

  it('unknown property with a did-you-mean hint, and without one', () => {
    expect(issuesAfter((d) => { d.lattice.vector = d.lattice.vectors; delete d.lattice.vectors; })).toMatchInlineSnapshot();
    expect(issuesAfter((d) => (d.lattice.colour = 'red'))).toMatchInlineSnapshot();
  });

  it('enum with the allowed values', () => {
    expect(issuesAfter((d) => (d.claims.symmetryClass = 'AIIII'))).toMatchInlineSnapshot();
  });

  it('alternatives: numbers, expressions or complex objects', () => {
    expect(issuesAfter((d) => (d.drive.segments[0].hoppings[0].amplitude = [1, 0]))).toMatchInlineSnapshot();
    expect(issuesAfter((d) => (d.drive.segments[0].hoppings[0].amplitude = { re: 1 }))).toMatchInlineSnapshot();
    expect(issuesAfter((d) => (d.references = [{ note: 'no identifier' }]))).toMatchInlineSnapshot();
  });

  it('limits, patterns and formats', () => {
    expect(issuesAfter((d) => (d.drive.segments = []))).toMatchInlineSnapshot();
    expect(issuesAfter((d) => (d.numerics = { kGrid: [1, 24] }))).toMatchInlineSnapshot();
    expect(issuesAfter((d) => (d.parameters['2J'] = 1))).toMatchInlineSnapshot();
    expect(issuesAfter((d) => (d.summary = 'two\nlines'))).toMatchInlineSnapshot();
    expect(issuesAfter((d) => (d.formatVersion = 2))).toMatchInlineSnapshot();
    expect(issuesAfter((d) => (d.tags = ['a', 'a']))).toMatchInlineSnapshot();
  });
});
