/**
 * What the search box loads: a MiniSearch index over the words of every
 * published model, and the inventory rows (with invariant profiles for the
 * invariant filters). Built once per site build from the records.
 */
import MiniSearch from 'minisearch';
import type { ModelRecord } from '../../catalogue/records/model-record.ts';
import { ANOMALOUS_LABEL, STATUS_LABEL } from '../../catalogue/vocabulary.ts';
import { invariantSearchText } from '../invariants.ts';
import { inventoryRow } from '../inventory.ts';
import type { InventoryRow } from '../render/inventory-row.ts';
import { parameterSymbol } from '../symbols.ts';
import { INDEX_OPTIONS, type SearchDocument } from './search-options.ts';

function searchDocument(record: ModelRecord, row: InventoryRow): SearchDocument {
  const m = record.model;
  return {
    id: record.id,
    title: row.title,
    summary: row.summary,
    tags: row.tags.join(' '),
    facets: [row.cls ? `class ${row.cls}` : '', row.lattice ?? '', ...row.drives, row.dim === 1 ? 'chain 1D' : row.dim === 2 ? 'sheet 2D' : '', STATUS_LABEL[row.status], ANOMALOUS_LABEL[row.anomalous]].join(' '),
    invariants: invariantSearchText(row.inv),
    parameters: record.parameters.map((p) => `${p.name} ${parameterSymbol(p.name)} ${p.description ?? ''}`).join(' '),
    // Names only: an affiliation shared by a whole inventory would be a word every model has.
    maintainers: (m?.maintainers ?? []).map((name) => name.replace(/\s*\([^)]*\)/g, '')).join(' '),
    references: (m?.references ?? []).map((r) => [r.citation, r.doi, r.arxiv, r.note].filter(Boolean).join(' ')).join(' '),
  };
}

export interface SearchPayload {
  /** MiniSearch index as JSON text. */
  index: string;
  rows: InventoryRow[];
}

export function searchPayload(records: ModelRecord[]): SearchPayload {
  const search = new MiniSearch<SearchDocument>(INDEX_OPTIONS);
  const rows = records.map(inventoryRow);
  search.addAll(records.map((r, i) => searchDocument(r, rows[i])));
  return { index: JSON.stringify(search), rows };
}
