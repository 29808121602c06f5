/**
 * Browse pages: the inventory grouped by symmetry class, lattice, drive kind
 * and tag; the anomalous phases; and what needs a reviewer's attention, with
 * the reason for every claim that is not confirmed.
 */
import { separateHint } from './verdict-hint.ts';
import type { ModelRecord } from '../catalogue/records/model-record.ts';
import { quantityName, STATUS_MEANING } from '../catalogue/vocabulary.ts';
import { inventoryRow } from './inventory.ts';
import { DRIVE_MEANING } from './model-kinds.ts';
import { facetSlug, type InventoryRow } from './render/inventory-row.ts';

export type FacetKey = 'class' | 'lattice' | 'drive' | 'tag';

export const FACET_TITLE: Record<FacetKey, string> = {
  class: 'Symmetry class',
  lattice: 'Lattice',
  drive: 'Drive',
  tag: 'Tag',
};

export interface FacetValue {
  value: string;
  slug: string;
  count: number;
  meaning: string | null;
}

const CLASS_MEANING: Record<string, string> = {
  A: 'no symmetry: Chern numbers and gap winding numbers W in 2D',
  AIII: 'chiral symmetry only: integer winding in 1D',
  BDI: 'chiral, time-reversal (Θ² = +1) and particle–hole symmetry: integer winding in 1D',
  D: 'particle–hole symmetry (P² = +1): Z₂ Majorana index in 1D, Chern number in 2D',
  DIII: 'time-reversal (Θ² = −1) and particle–hole symmetry',
  AII: 'time-reversal symmetry with Θ² = −1',
  AI: 'time-reversal symmetry with Θ² = +1',
  C: 'particle–hole symmetry with P² = −1',
  CI: 'time-reversal (Θ² = +1) and particle–hole symmetry (P² = −1)',
  CII: 'chiral symmetry with Θ² = P² = −1',
};

/** The value(s) of a facet for one model row. */
function facetValues(row: InventoryRow, key: FacetKey): string[] {
  switch (key) {
    case 'class':
      return [row.cls ?? 'not stated'];
    case 'lattice':
      return row.lattice ? [row.lattice] : [];
    case 'drive':
      return row.drives;
    case 'tag':
      return row.tags;
  }
}

export function facet(records: ModelRecord[], key: FacetKey): FacetValue[] {
  const counts = new Map<string, number>();
  for (const r of records) for (const v of facetValues(inventoryRow(r), key)) counts.set(v, (counts.get(v) ?? 0) + 1);
  return [...counts]
    .map(([value, count]) => ({ value, slug: facetSlug(value), count, meaning: key === 'class' ? (CLASS_MEANING[value] ?? null) : key === 'drive' ? (DRIVE_MEANING[value as keyof typeof DRIVE_MEANING] ?? null) : null }))
    .sort((a, b) => (key === 'tag' ? b.count - a.count : 0) || a.value.localeCompare(b.value));
}

/** Models with a given facet value (by slug), in inventory order. */
export function withFacet(records: ModelRecord[], key: FacetKey, slug: string): { value: string; records: ModelRecord[] } | null {
  const matching = records.filter((r) => facetValues(inventoryRow(r), key).some((v) => facetSlug(v) === slug));
  if (matching.length === 0) return null;
  const value = facetValues(inventoryRow(matching[0]), key).find((v) => facetSlug(v) === slug)!;
  return { value, records: matching };
}

export function anomalousRecords(records: ModelRecord[]): ModelRecord[] {
  return records.filter((r) => r.anomalous.classification === 'anomalous' || r.anomalous.classification === 'chern-trivial-anomalous');
}

export interface AttentionItem {
  row: InventoryRow;
  statusMeaning: string;
  reasons: { name: string; outcome: string; message: string; hint: string | null; anchor: string }[];
  /** For invalid and failed models: the located problems. */
  problems: string[];
}

const ATTENTION_ORDER = ['disputed', 'unsettled', 'invalid', 'failed'];

/** Disputed and unsettled models (then invalid and failed ones) with the reason per claim. */
export function attentionItems(records: ModelRecord[]): AttentionItem[] {
  return records
    .filter((r) => ATTENTION_ORDER.includes(r.status))
    .sort((a, b) => ATTENTION_ORDER.indexOf(a.status) - ATTENTION_ORDER.indexOf(b.status))
    .map((r) => ({
      row: inventoryRow(r),
      statusMeaning: STATUS_MEANING[r.status],
      reasons: r.claims
        .filter((v) => v.outcome !== 'confirmed')
        .map((v) => ({
          name: quantityName(v.claim, { symmetryClass: r.model?.symmetryClass, cut: v.kind === 'chern' ? v.gap : null }).words,
          outcome: v.outcome,
          message: v.message,
          hint: separateHint(v.message, v.hint),
          anchor: `claim-${v.claim.replace(/[^a-z0-9]+/gi, '-').replace(/^-|-$/g, '')}`,
        })),
      problems: r.status === 'invalid' ? r.diagnostics.filter((d) => d.severity === 'error').map((d) => `${d.file}:${d.line}:${d.column} ${d.pointer || '(document)'} ${d.message}${d.hint ? ` (${d.hint})` : ''}`) : r.status === 'failed' ? [r.incident?.message ?? r.statusReason] : [],
    }));
}
