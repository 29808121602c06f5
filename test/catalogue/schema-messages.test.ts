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
    expect(issuesAfter((d) => (d.lattice.orbitals = { A: [0, 0] }))).toMatchInlineSnapshot(`
      [
        [
          "/lattice/orbitals",
          "expected a list; found an object",
          "",
        ],
      ]
    `);
  });

  it('unknown property with a did-you-mean hint, and without one', () => {
    expect(issuesAfter((d) => { d.lattice.vector = d.lattice.vectors; delete d.lattice.vectors; })).toMatchInlineSnapshot(`
      [
        [
          "/lattice",
          "missing property "vectors"",
          "vectors: Bravais vectors a1 (and a2) in Cartesian coordinates",
        ],
        [
          "/lattice/vector",
          "unknown property "vector"",
          "did you mean 'vectors'?",
        ],
      ]
    `);
    expect(issuesAfter((d) => (d.lattice.colour = 'red'))).toMatchInlineSnapshot(`
      [
        [
          "/lattice/colour",
          "unknown property "colour"",
          "allowed properties are dimension, vectors, orbitals",
        ],
      ]
    `);
  });

  it('enum with the allowed values', () => {
    expect(issuesAfter((d) => (d.claims.symmetryClass = 'AIIII'))).toMatchInlineSnapshot(`
      [
        [
          "/claims/symmetryClass",
          "expected one of "A", "AIII", "AI", "AII", "BDI", "CII", "D", "DIII", "C", "CI"; found "AIIII"",
          "",
        ],
      ]
    `);
  });

  it('alternatives: numbers, expressions or complex objects', () => {
    expect(issuesAfter((d) => (d.drive.segments[0].hoppings[0].amplitude = [1, 0]))).toMatchInlineSnapshot(`
      [
        [
          "/drive/segments/0/hoppings/0/amplitude",
          "expected a number or an expression string, or an object with "magnitude" and "phase", or an object with "re" and "im"; found a list",
          "",
        ],
      ]
    `);
    expect(issuesAfter((d) => (d.drive.segments[0].hoppings[0].amplitude = { re: 1 }))).toMatchInlineSnapshot(`
      [
        [
          "/drive/segments/0/hoppings/0/amplitude",
          "missing property "im"",
          "im: Imaginary part",
        ],
      ]
    `);
    expect(issuesAfter((d) => (d.references = [{ note: 'no identifier' }]))).toMatchInlineSnapshot(`
      [
        [
          "/references/0",
          "needs at least one of "doi", "arxiv", "citation"",
          "",
        ],
      ]
    `);
  });

  it('limits, patterns and formats', () => {
    expect(issuesAfter((d) => (d.drive.segments = []))).toMatchInlineSnapshot(`
      [
        [
          "/drive/segments",
          "needs at least 1 entry; found 0",
          "",
        ],
      ]
    `);
    expect(issuesAfter((d) => (d.numerics = { kGrid: [1, 24] }))).toMatchInlineSnapshot(`
      [
        [
          "/numerics/kGrid/0",
          "must be ≥ 2; found 1",
          "",
        ],
      ]
    `);
    expect(issuesAfter((d) => (d.parameters['2J'] = 1))).toMatchInlineSnapshot(`
      [
        [
          "/parameters/2J",
          "name "2J" is not allowed here",
          "names start with a letter, followed by letters, digits or underscores",
        ],
      ]
    `);
    expect(issuesAfter((d) => (d.summary = 'two\nlines'))).toMatchInlineSnapshot(`
      [
        [
          "/summary",
          ""two\\nlines" is not in the expected form",
          "One line, no line breaks",
        ],
      ]
    `);
    expect(issuesAfter((d) => (d.formatVersion = 2))).toMatchInlineSnapshot(`
      [
        [
          "/formatVersion",
          "must be 1; found 2",
          "",
        ],
      ]
    `);
    expect(issuesAfter((d) => (d.tags = ['a', 'a']))).toMatchInlineSnapshot(`
      [
        [
          "/tags",
          "entries 0 and 1 are identical",
          "remove the duplicate",
        ],
      ]
    `);
  });
});
