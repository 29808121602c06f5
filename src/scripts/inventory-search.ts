/**
 * Search and filters of the inventory page (the page works without this:
 * it then lists the models page by page, and the browse pages group them).
 *
 * Loads the search index and the inventory rows written at build time,
 * filters by words (MiniSearch), by invariant conditions typed into the same
 * box ("W ≠ 0 in the π gap", "C = 0 in every band", "ν_π = ±1"), and by the
 * facet menus; sorts by any column; keeps the whole state in the URL so a
 * filtered view can be reloaded, bookmarked and shared.
 */
import MiniSearch from 'minisearch';
import { STATUS_ORDER } from '../catalogue/vocabulary.ts';
import { rowHtml, type InventoryRow } from '../site/render/inventory-row.ts';
import { escapeHtml, symbolHtml } from '../site/render/escape.ts';
import { describeClause, matchesAll, parseInvariantQuery } from '../site/search/invariant-query.ts';
import { INDEX_OPTIONS, QUERY_OPTIONS, type SearchDocument } from '../site/search/search-options.ts';

type SortKey = 'title' | 'status' | 'class' | 'lattice' | 'drive';
const FILTERS = ['status', 'class', 'lattice', 'drive', 'dim', 'tag'] as const;
type FilterKey = (typeof FILTERS)[number];

interface State {
  q: string;
  filters: Record<FilterKey, string>;
  anomalous: boolean;
  sort: SortKey | null;
  descending: boolean;
}

const root = document.querySelector<HTMLElement>('[data-inventory]');
if (root) void start(root);

function control<T extends HTMLElement>(name: string): T {
  return document.querySelector<T>(`#search-panel [name="${name}"]`)!;
}

function readUrl(): State {
  const p = new URLSearchParams(location.search);
  const sort = p.get('sort');
  return {
    q: p.get('q') ?? '',
    filters: Object.fromEntries(FILTERS.map((k) => [k, p.get(k) ?? ''])) as Record<FilterKey, string>,
    anomalous: p.get('anomalous') === '1',
    sort: sort && ['title', 'status', 'class', 'lattice', 'drive'].includes(sort) ? (sort as SortKey) : null,
    descending: p.get('dir') === 'desc',
  };
}

function writeUrl(state: State): void {
  const p = new URLSearchParams();
  if (state.q) p.set('q', state.q);
  for (const k of FILTERS) if (state.filters[k]) p.set(k, state.filters[k]);
  if (state.anomalous) p.set('anomalous', '1');
  if (state.sort) p.set('sort', state.sort);
  if (state.sort && state.descending) p.set('dir', 'desc');
  const query = p.toString();
  history.replaceState(null, '', `${location.pathname}${query ? `?${query}` : ''}${location.hash}`);
}

function isDefault(state: State): boolean {
  return !state.q && FILTERS.every((k) => !state.filters[k]) && !state.anomalous && !state.sort;
}

function sortValue(row: InventoryRow, key: SortKey): string | number {
  switch (key) {
    case 'title':
      return row.title.toLowerCase();
    case 'status':
      return STATUS_ORDER.indexOf(row.status);
    case 'class':
      return row.cls ?? '~';
    case 'lattice':
      return row.lattice ?? '~';
    case 'drive':
      return row.drives.join(', ') || '~';
  }
}

async function start(root: HTMLElement): Promise<void> {
  const base = root.dataset.base ?? '';
  const panel = document.getElementById('search-panel')!;
  panel.hidden = false;
  const tbody = root.querySelector('tbody')!;
  const shown = document.getElementById('inventory-shown')!;
  const empty = document.getElementById('inventory-empty')!;
  const pager = document.querySelector<HTMLElement>('.pager');
  const serverRows = tbody.innerHTML;
  const total = Number(root.dataset.total ?? '0');
  const input = control<HTMLInputElement>('q');
  const anomalous = control<HTMLInputElement>('anomalous');
  const selects = Object.fromEntries(FILTERS.map((k) => [k, control<HTMLSelectElement>(k)])) as Record<FilterKey, HTMLSelectElement>;

  let rows: InventoryRow[] = [];
  let search: MiniSearch<SearchDocument> | null = null;
  try {
    const [rowsResponse, indexResponse] = await Promise.all([fetch(`${base}/search/rows.json`), fetch(`${base}/search/index.json`)]);
    rows = (await rowsResponse.json()) as InventoryRow[];
    search = MiniSearch.loadJSON<SearchDocument>(await indexResponse.text(), INDEX_OPTIONS);
  } catch {
    shown.textContent = 'Search is unavailable (the index did not load); browse by class, lattice, drive or tag instead.';
    return;
  }

  let state = readUrl();
  input.value = state.q;
  anomalous.checked = state.anomalous;
  for (const k of FILTERS) selects[k].value = state.filters[k];

  const headers = [...root.querySelectorAll<HTMLButtonElement>('th button[data-sort]')];
  const apply = () => {
    writeUrl(state);
    for (const b of headers) {
      const th = b.closest('th')!;
      th.setAttribute('aria-sort', b.dataset.sort === state.sort ? (state.descending ? 'descending' : 'ascending') : 'none');
    }
    if (isDefault(state)) {
      tbody.innerHTML = serverRows;
      if (pager) pager.hidden = false;
      empty.hidden = true;
      shown.textContent = '';
      return;
    }
    const { clauses, rest } = parseInvariantQuery(state.q);
    let relevance: Map<string, number> | null = null;
    if (rest && search) relevance = new Map(search.search(rest, QUERY_OPTIONS).map((r) => [String(r.id), r.score]));
    const f = state.filters;
    let matches = rows.filter(
      (r) =>
        (!relevance || relevance.has(r.id)) &&
        (!f.status || r.status === f.status) &&
        (!f.class || (r.cls ?? 'not stated') === f.class) &&
        (!f.lattice || r.lattice === f.lattice) &&
        (!f.drive || r.drives.includes(f.drive)) &&
        (!f.dim || String(r.dim) === f.dim) &&
        (!f.tag || r.tags.includes(f.tag)) &&
        (!state.anomalous || r.anomalous === 'anomalous' || r.anomalous === 'chern-trivial-anomalous') &&
        matchesAll(r.inv, clauses),
    );
    if (state.sort) {
      const key = state.sort;
      const sign = state.descending ? -1 : 1;
      matches = [...matches].sort((a, b) => {
        const x = sortValue(a, key), y = sortValue(b, key);
        return (x < y ? -1 : x > y ? 1 : 0) * sign || a.title.localeCompare(b.title);
      });
    } else if (relevance) {
      matches = [...matches].sort((a, b) => relevance!.get(b.id)! - relevance!.get(a.id)!);
    }
    tbody.innerHTML = matches.map((r) => rowHtml(r, base)).join('');
    if (pager) pager.hidden = true;
    const reading = clauses.map((c) => describeClause(c));
    const words = rest ? `matching “${escapeHtml(rest)}”` : '';
    const conditions = reading.length > 0 ? `where ${reading.map((r) => symbolHtml(r)).join(' and ')}` : '';
    shown.innerHTML = `${matches.length} of ${total} models ${[words, conditions].filter(Boolean).join(', ')}`.trim();
    empty.hidden = matches.length > 0;
  };

  let timer: number | undefined;
  const update = () => {
    state = { ...state, q: input.value.trim(), anomalous: anomalous.checked, filters: Object.fromEntries(FILTERS.map((k) => [k, selects[k].value])) as Record<FilterKey, string> };
    apply();
  };
  input.addEventListener('input', () => {
    window.clearTimeout(timer);
    timer = window.setTimeout(update, 120);
  });
  panel.querySelector('form')!.addEventListener('submit', (e) => {
    e.preventDefault();
    update();
  });
  for (const el of [anomalous, ...Object.values(selects)]) el.addEventListener('change', update);
  for (const b of headers) {
    b.addEventListener('click', () => {
      const key = b.dataset.sort as SortKey;
      state = { ...state, descending: state.sort === key ? !state.descending : false, sort: key };
      apply();
    });
  }
  for (const example of document.querySelectorAll<HTMLAnchorElement>('[data-example]')) {
    example.addEventListener('click', (e) => {
      e.preventDefault();
      input.value = example.dataset.example ?? '';
      update();
    });
  }
  document.getElementById('search-clear')?.addEventListener('click', () => {
    input.value = '';
    anomalous.checked = false;
    for (const k of FILTERS) selects[k].value = '';
    state = { ...state, sort: null, descending: false };
    update();
  });
  if (!isDefault(state)) apply();
}
