/**
 * The inventory as the site lists it: one row per published model with its
 * invariants, class, lattice and drive, the counts by status, and the pages
 * the list is split into so that no page grows past a reader's patience (or
 * 300 KB) however large the inventory.
 */
import type { ModelRecord, ModelStatus } from '../catalogue/records/model-record.ts';
import { STATUS_ORDER } from '../catalogue/vocabulary.ts';
import { invariantProfile } from './invariants.ts';
import { driveKinds, latticeKind } from './model-kinds.ts';
import { modelSource } from './model-source.ts';
import type { InventoryRow } from './render/inventory-row.ts';

/** Rows per page of a static list (inventory and browse pages). */
const PAGE_SIZE = 100;

const rowCache = new Map<string, InventoryRow>();

export function inventoryRow(record: ModelRecord): InventoryRow {
  const hit = rowCache.get(record.id);
  if (hit) return hit;
  const source = modelSource(record);
  const cut = record.analysis?.kind === 'sheet' ? (record.analysis.facts.cut ?? null) : null;
  const row: InventoryRow = {
    id: record.id,
    title: record.model?.title ?? record.id,
    summary: record.model?.summary ?? record.statusReason,
    status: record.status,
    cls: record.model?.symmetryClass ?? null,
    lattice: source ? latticeKind(source) : null,
    drives: source ? driveKinds(source) : [],
    dim: record.model?.dimension ?? null,
    anomalous: record.anomalous.classification,
    tags: record.model?.tags ?? [],
    claims: [record.counts.confirmed, record.counts.contradicted, record.counts.unsettled],
    inv: invariantProfile(record.portrait, { cut, symmetryClass: record.model?.symmetryClass }),
  };
  rowCache.set(record.id, row);
  return row;
}

/** Number of models per status, in the order a reviewer reads them (zero counts left out). */
export function statusCounts(records: Pick<ModelRecord, 'status'>[]): { status: ModelStatus; count: number }[] {
  return STATUS_ORDER.map((status) => ({ status, count: records.filter((r) => r.status === status).length })).filter((c) => c.count > 0);
}

export interface ListPage<T> {
  items: T[];
  /** 1-based page number and count. */
  page: number;
  pages: number;
}

/** Splits a list into pages of PAGE_SIZE (always at least one page, possibly empty). */
export function paginate<T>(items: T[], size = PAGE_SIZE): ListPage<T>[] {
  const pages = Math.max(1, Math.ceil(items.length / size));
  return Array.from({ length: pages }, (_, i) => ({ items: items.slice(i * size, (i + 1) * size), page: i + 1, pages }));
}
