/**
 * Settings of the full-text index (MiniSearch), shared by the build that
 * writes the index and the browser that loads it: both must tokenise alike.
 */
import type { Options, SearchOptions } from 'minisearch';

export const SEARCH_FIELDS = ['title', 'summary', 'tags', 'facets', 'invariants', 'parameters', 'maintainers', 'references', 'description'] as const;

export interface SearchDocument {
  id: string;
  title: string;
  summary: string;
  tags: string;
  /** Class, lattice, drive, dimension, status and anomalous flag in words. */
  facets: string;
  invariants: string;
  parameters: string;
  maintainers: string;
  references: string;
  description: string;
}

/** Lower case, accents folded ("Ostvik" finds "Östvik"), π kept as a letter. */
export function processTerm(term: string): string | null {
  const t = term.normalize('NFKD').replace(/[\u0300-\u036f]/g, '').toLowerCase();
  return t.length > 0 ? t : null;
}

export const INDEX_OPTIONS: Options<SearchDocument> = {
  fields: [...SEARCH_FIELDS],
  storeFields: [],
  processTerm,
  // Words, and invariant tokens such as "wπ=1" or "ν0=1", stay whole.
  tokenize: (text) => text.split(/[\s,;:()[\]{}"'!?.·—–/]+/u).filter(Boolean),
};

export const QUERY_OPTIONS: SearchOptions = {
  prefix: true,
  fuzzy: (term) => (term.length > 4 ? 0.2 : false),
  combineWith: 'AND',
  boost: { title: 3, tags: 2, summary: 1.5, facets: 1.5 },
};
