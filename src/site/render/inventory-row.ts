/**
 * One model as a row of the inventory table. The same function renders the
 * rows of the static pages at build time and the rows the search script
 * shows, so a model looks the same with and without JavaScript.
 */
import type { ModelStatus } from '../../catalogue/records/model-record.ts';
import type { AnomalousClass } from '../../catalogue/verify/anomalous.ts';
import { ANOMALOUS_LABEL } from '../../catalogue/vocabulary.ts';
import { invariantLines, type InvariantProfile } from '../invariants.ts';
import { statusBadgeHtml } from './badge.ts';
import { escapeHtml, symbolHtml } from './escape.ts';

export interface InventoryRow {
  id: string;
  title: string;
  summary: string;
  status: ModelStatus;
  /** Claimed Altland–Zirnbauer class, null when the file states none. */
  cls: string | null;
  lattice: string | null;
  drives: string[];
  dim: number | null;
  anomalous: AnomalousClass;
  tags: string[];
  /** Claims confirmed, contradicted, unsettled. */
  claims: [number, number, number];
  inv: InvariantProfile;
}

/** URL slug of a facet value ("centred rectangular" → "centred-rectangular"). */
export function facetSlug(text: string): string {
  return text.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-+|-+$/g, '') || 'other';
}

function link(base: string, path: string, text: string, className = ''): string {
  return `<a${className ? ` class="${className}"` : ''} href="${escapeHtml(`${base}/${path}/`)}">${escapeHtml(text)}</a>`;
}

export function rowHtml(row: InventoryRow, base: string): string {
  const tags = row.tags.map((t) => link(base, `browse/tag/${facetSlug(t)}`, t, 'tag')).join(' ');
  const lines = invariantLines(row.inv);
  const invariants = lines.length > 0 ? `<ul class="inv">${lines.map((l) => `<li>${symbolHtml(l)}</li>`).join('')}</ul>` : '<span class="muted">—</span>';
  const anomalous = row.anomalous === 'anomalous' || row.anomalous === 'chern-trivial-anomalous' ? `<div class="flag-anomalous">${escapeHtml(ANOMALOUS_LABEL[row.anomalous])}</div>` : '';
  const [confirmed, contradicted, unsettled] = row.claims;
  const total = confirmed + contradicted + unsettled;
  const claims = total > 0 ? `<div class="claim-counts" title="claims confirmed / contradicted / unsettled">${confirmed} ✓ · ${contradicted} ✗ · ${unsettled} ?</div>` : '';
  return (
    `<tr data-id="${escapeHtml(row.id)}" data-status="${row.status}">` +
    `<td class="c-model" data-label="model">${link(base, `models/${row.id}`, row.title, 'model-link')}<p class="row-summary">${escapeHtml(row.summary)}</p>${tags ? `<p class="row-tags">${tags}</p>` : ''}</td>` +
    `<td class="c-status" data-label="status">${statusBadgeHtml(row.status)}${claims}</td>` +
    `<td class="c-inv" data-label="invariants">${invariants}${anomalous}</td>` +
    `<td class="c-class" data-label="class">${row.cls ? link(base, `browse/class/${facetSlug(row.cls)}`, row.cls) : '<span class="muted">not stated</span>'}</td>` +
    `<td class="c-lattice" data-label="lattice">${row.lattice ? link(base, `browse/lattice/${facetSlug(row.lattice)}`, row.lattice) : '—'}</td>` +
    `<td class="c-drive" data-label="drive">${row.drives.map((d) => link(base, `browse/drive/${facetSlug(d)}`, d)).join(', ') || '—'}</td>` +
    `</tr>`
  );
}
