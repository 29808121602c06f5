import { describe, expect, it } from 'vitest';
import { closestName, editDistance, escapePointerToken, formatDiagnostic, joinPointer, splitPointer } from '../../src/catalogue/diagnostics.ts';

describe('JSON pointers (RFC 6901)', () => {
  it('escapes ~ and / as ~0 and ~1 and splits back', () => {
    // RFC 6901 §3: "~" is encoded as "~0" and "/" as "~1"
    expect(escapePointerToken('a/b~c')).toBe('a~1b~0c');
    expect(joinPointer('/parameters', 'a/b', 3)).toBe('/parameters/a~1b/3');
    expect(splitPointer('/parameters/a~1b~0c/3')).toEqual(['parameters', 'a/b~c', '3']);
    expect(splitPointer('')).toEqual([]);
  });
});

describe('edit distance', () => {
  it.each([
    ['kitten', 'sitting', 3], // the textbook Levenshtein example
    ['check', 'chekc', 1], // one adjacent transposition
    ['', 'abc', 3],
    ['same', 'same', 0],
  ])('%s ↔ %s = %d', (a, b, d) => {
    expect(editDistance(a, b)).toBe(d);
    expect(editDistance(b, a)).toBe(d);
  });

  it('suggests close names and truncated ones, not distant ones', () => {
    expect(closestName('hopings', ['onsite', 'hoppings', 'pairings'])).toBe('hoppings');
    expect(closestName('descr', ['value', 'description'])).toBe('description');
    expect(closestName('colour', ['dimension', 'vectors', 'orbitals'])).toBeUndefined();
  });
});

describe('formatDiagnostic', () => {
  it('prints file:line:column, pointer, message and hint', () => {
    expect(formatDiagnostic({ file: 'models/a.json', line: 3, column: 7, pointer: '/id', message: 'bad id', hint: 'fix it', severity: 'error' })).toBe('models/a.json:3:7  /id  bad id  (fix it)');
    expect(formatDiagnostic({ file: 'a.json', line: 1, column: 1, pointer: '', message: 'unused', severity: 'warning' })).toBe('warning: a.json:1:1  (document)  unused');
  });
});
