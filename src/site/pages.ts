/**
 * Route data: one function per kind of page, so page files only call one of
 * these and place the result.
 */
import type { ModelRecord, ModelStatus } from '../catalogue/records/model-record.ts';
import { anomalousRecords, attentionItems, facet, FACET_TITLE, withFacet, type FacetKey, type FacetValue } from './browse.ts';
import { documentMarkdown, loadSiteData, publishedRecords, type SkippedModel } from './data.ts';
import { documentOutline, renderDocument } from './documents.ts';
import { inventoryRow, paginate, statusCounts, type ListPage } from './inventory.ts';
import type { InventoryRow } from './render/inventory-row.ts';

export interface InventoryPageData {
  page: ListPage<InventoryRow>;
  total: number;
  counts: { status: ModelStatus; count: number }[];
  facets: { statuses: ModelStatus[]; classes: FacetValue[]; lattices: FacetValue[]; drives: FacetValue[]; tags: FacetValue[] };
  /** Model files of the inventory left out because their records are missing or out of date. */
  skipped: SkippedModel[];
}

export function inventoryPages(): InventoryPageData[] {
  const records = publishedRecords();
  const rows = records.map(inventoryRow);
  const counts = statusCounts(records);
  const facets = {
    statuses: counts.map((c) => c.status),
    classes: facet(records, 'class'),
    lattices: facet(records, 'lattice'),
    drives: facet(records, 'drive'),
    tags: facet(records, 'tag'),
  };
  const { skipped } = loadSiteData();
  return paginate(rows).map((page) => ({ page, total: rows.length, counts, facets, skipped }));
}

const FACET_KEYS: FacetKey[] = ['class', 'lattice', 'drive', 'tag'];

export function browseIndex(): { facets: { key: FacetKey; title: string; values: FacetValue[] }[]; anomalous: number; attention: number; total: number } {
  const records = publishedRecords();
  return {
    facets: FACET_KEYS.map((key) => ({ key, title: FACET_TITLE[key], values: facet(records, key) })),
    anomalous: anomalousRecords(records).length,
    attention: attentionItems(records).length,
    total: records.length,
  };
}

export interface FacetPage {
  key: FacetKey;
  title: string;
  value: string;
  meaning: string | null;
  slug: string;
  page: ListPage<InventoryRow>;
}

/** Every browse page of every facet value, split into pages. */
export function facetPages(): FacetPage[] {
  const records = publishedRecords();
  const out: FacetPage[] = [];
  for (const key of FACET_KEYS) {
    for (const v of facet(records, key)) {
      const group = withFacet(records, key, v.slug);
      if (!group) continue;
      for (const page of paginate(group.records.map(inventoryRow))) out.push({ key, title: FACET_TITLE[key], value: group.value, meaning: v.meaning, slug: v.slug, page });
    }
  }
  return out;
}

export function anomalousPages(): ListPage<InventoryRow>[] {
  return paginate(anomalousRecords(publishedRecords()).map(inventoryRow));
}

export function attentionPage() {
  return attentionItems(publishedRecords());
}

/** The published record of a model id (drafts are not published). */
export function publishedModels(): ModelRecord[] {
  return publishedRecords();
}

/** The documents under docs/ published as pages, with their titles. */
export const DOCUMENT_TITLES = {
  conventions: 'Physics conventions',
  'model-format': 'Model file format',
  'worked-example': 'Worked example: from the file to every number',
  'writing-drives': 'Writing drives',
  sharding: 'Sweeps and checks across machines',
  benchmarks: 'Benchmarks',
} as const;
export type DocumentName = keyof typeof DOCUMENT_TITLES;

export function documentPage(name: DocumentName, base: string): { title: string; heading: string; body: string; outline: { id: string; text: string }[] } {
  const html = renderDocument(documentMarkdown(name), base);
  // The title (the document's h1) comes before its table of contents.
  const end = html.indexOf('</h1>');
  const [heading, body] = end >= 0 ? [html.slice(0, end + 5), html.slice(end + 5)] : ['', html];
  return { title: DOCUMENT_TITLES[name], heading, body, outline: documentOutline(html) };
}
