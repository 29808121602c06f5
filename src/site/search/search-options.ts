/**
 * Settings of the full-text index (MiniSearch), shared by the build that
 * writes the index and the browser that loads it: both must tokenise alike.
 */
import type { Options, SearchOptions } from 'minisearch';

const SEARCH_FIELDS = ['title', 'summary', 'tags', 'facets', 'invariants', 'parameters', 'maintainers', 'references'] as const;

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
}

/** Words too common to search by; leaving them out keeps the index small. */
const STOP_WORDS = new Set(['a', 'an', 'and', 'as', 'at', 'by', 'for', 'from', 'in', 'is', 'it', 'its', 'of', 'on', 'or', 'the', 'then', 'to', 'with', 'when', 'one', 'per']);

/** Lower case, accents folded ("Ostvik" finds "Östvik"), π kept as a letter, common words dropped. */
function processTerm(term: string): string | null {
  const t = term.normalize('NFKD').replace(/[\u0300-\u036f]/g, '').toLowerCase();
  return t.length > 0 && !STOP_WORDS.has(t) ? t : null;
}

const DOI = /^10\.\d{4,9}\/\S+$/i;

/** Words, and invariant tokens such as "wπ=1" or "ν0=1", stay whole; so do DOIs. */
export function tokenize(text: string): string[] {
  return text.split(/\s+/u).flatMap((chunk) => (DOI.test(chunk) ? [chunk.replace(/[.,;)]+$/, '')] : chunk.split(/[,;:()[\]{}"'!?.·—–/]+/u))).filter(Boolean);
}

export const INDEX_OPTIONS: Options<SearchDocument> = {
  fields: [...SEARCH_FIELDS],
  storeFields: [],
  processTerm,
  tokenize,
};

export const QUERY_OPTIONS: SearchOptions = {
  prefix: true,
  fuzzy: (term) => (term.length > 4 ? 0.2 : false),
  combineWith: 'AND',
  boost: { title: 3, tags: 2, summary: 1.5, facets: 1.5 },
};
