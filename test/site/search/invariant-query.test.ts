// Search by invariant: the example queries a reader types, read into clauses and
// tested on invariant profiles written out by hand for known phases (the
// five-step checkerboard drive of Rudner et al., PRX 3, 031005 (2013): C = 0 in both
// bands and W = 1 in both gaps; the static Qi–Wu–Zhang sheet at m = 1 (PRB 74,
// 085308 (2006)): C = (1, −1), W_0 = 1, W_π = 0; a two-step chain with ν_0 = 1,
// ν_π = −1 (Asbóth–Obuse frames)).
import { describe, expect, it } from 'vitest';
import type { InvariantProfile } from '../../../src/site/invariants.ts';
import { describeClause, matchesAll, matchesClause, parseInvariantQuery } from '../../../src/site/search/invariant-query.ts';

const empty: InvariantProfile = { C: [], cut: null, W: [], nu: [], edge: [], end: [], z2: false };
const checkerboard: InvariantProfile = { ...empty, C: [0, 0], cut: 1, W: [[0, 1], [1, 1]] };
const qwz: InvariantProfile = { ...empty, C: [1, -1], cut: 1, W: [[0, 1], [1, 0]] };
const chain: InvariantProfile = { ...empty, nu: [[0, 1], [1, -1]] };
const unsettled: InvariantProfile = { ...empty, C: [null, 0], W: [[0, 1], [1, null]] };

const query = (text: string) => parseInvariantQuery(text).clauses;
const profiles = { checkerboard, qwz, chain, unsettled };
const matching = (text: string) => Object.entries(profiles).filter(([, p]) => matchesAll(p, query(text))).map(([name]) => name);

describe('reading invariant conditions', () => {
  it('reads the three example queries', () => {
    expect(query('W ≠ 0 in the π gap')).toMatchObject([{ quantity: 'W', gap: 1, relation: '≠', value: 0 }]);
    expect(query('C = 0 in every band')).toMatchObject([{ quantity: 'C', band: null, relation: '=', value: 0, quantifier: 'every' }]);
    expect(query('ν_π = ±1')).toMatchObject([{ quantity: 'ν', gap: 1, relation: '=', value: 1, eitherSign: true }]);
  });

  it('accepts ASCII spellings and subscripts in several forms', () => {
    for (const text of ['W_pi != 0', 'Wπ≠0', 'W(π) <> 0', 'W_{pi} != 0', 'W != 0 at π', 'W != 0 at ε = π/T']) {
      expect(query(text), text).toMatchObject([{ quantity: 'W', gap: 1, relation: '≠', value: 0 }]);
    }
    expect(query('nu0 = 1')).toMatchObject([{ quantity: 'ν', gap: 0 }]);
    expect(query('ν₀ = 1')).toMatchObject([{ quantity: 'ν', gap: 0 }]);
    expect(query('C₂ = -1')).toMatchObject([{ quantity: 'C', band: 2, value: -1 }]);
    expect(query('nu_pi = +-1')).toMatchObject([{ quantity: 'ν', gap: 1, eitherSign: true }]);
  });

  it('keeps the other words for the text search, and leaves words that only look like symbols alone', () => {
    expect(parseInvariantQuery('kagome W ≠ 0 in the π gap')).toMatchObject({ rest: 'kagome', clauses: [{ quantity: 'W' }] });
    expect(parseInvariantQuery('Walker = 1').clauses).toEqual([]);
    expect(parseInvariantQuery('ν_0 = 1 and ν_π = -1')).toMatchObject({ rest: '', clauses: [{ gap: 0 }, { gap: 1, value: -1 }] });
  });

  it('reads "=" without a gap or band as every one, "≠" as some one, and says so', () => {
    expect(describeClause(query('C = 0')[0])).toBe('C = 0 in every band');
    expect(describeClause(query('C ≠ 0')[0])).toBe('C ≠ 0 in some band');
    expect(describeClause(query('W = 1 in both gaps')[0])).toBe('W = 1 in every gap');
    expect(describeClause(query('W ≠ 0 in the π gap')[0])).toBe('W ≠ 0 in the π gap');
  });
});

describe('matching invariant profiles', () => {
  it('finds the anomalous drive by a nonzero π-gap winding, and not the static sheet', () => {
    expect(matching('W ≠ 0 in the π gap')).toEqual(['checkerboard']);
  });

  it('finds Chern-trivial models, and Chern insulators by a nonzero band', () => {
    expect(matching('C = 0 in every band')).toEqual(['checkerboard']);
    expect(matching('C ≠ 0')).toEqual(['qwz']);
    expect(matching('C_1 = 1')).toEqual(['qwz']);
  });

  it('finds chains with π modes of either sign', () => {
    expect(matching('ν_π = ±1')).toEqual(['chain']);
    expect(matching('ν_π = 1')).toEqual([]);
    expect(matching('ν_0 = 1 and ν_π = -1')).toEqual(['chain']);
  });

  it('never matches on an unsettled value', () => {
    expect(matchesClause(unsettled, query('W = 0 in the π gap')[0])).toBe(false);
    expect(matchesClause(unsettled, query('W ≠ 0 in the π gap')[0])).toBe(false);
    expect(matchesClause(unsettled, query('C = 0 in every band')[0])).toBe(false);
    // "some" still finds the settled band.
    expect(matchesClause(unsettled, query('C = 0 in some band')[0])).toBe(true);
  });

  it('needs the quantity to exist: a chain has no W, a sheet no ν', () => {
    expect(matchesClause(chain, query('W = 0')[0])).toBe(false);
    expect(matchesClause(checkerboard, query('ν = 0')[0])).toBe(false);
  });
});
