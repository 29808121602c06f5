/**
 * A suggested citation of a model entry, as text and as BibTeX, and the
 * references of the file with their DOI and arXiv links.
 */
import type { ModelRecord } from '../catalogue/records/model-record.ts';

export interface Citation {
  text: string;
  bibtex: string;
}

/** "Tomasz Brightwater (Lantern Lab, Ostvik University)" → { given: "Tomasz", family: "Brightwater" }. */
export function personName(maintainer: string): { given: string; family: string } {
  const name = maintainer.replace(/\s*\([^)]*\)\s*/g, ' ').trim();
  const parts = name.split(/\s+/);
  if (parts.length < 2) return { given: '', family: name };
  return { given: parts.slice(0, -1).join(' '), family: parts[parts.length - 1] };
}

/** Escapes BibTeX's special characters in a field value. */
export function bibtexEscape(text: string): string {
  return text.replace(/[\\{}%&$#_^~]/g, (c) => ({ '\\': '\\textbackslash{}', '{': '\\{', '}': '\\}', '%': '\\%', '&': '\\&', $: '\\$', '#': '\\#', _: '\\_', '^': '\\^{}', '~': '\\~{}' })[c]!);
}

export function citation(record: ModelRecord, checkedOn: string | null): Citation | null {
  const m = record.model;
  if (!m) return null;
  const people = m.maintainers.map(personName);
  const year = (m.dates.updated ?? m.dates.created).slice(0, 4);
  const initials = (given: string) => given.split(/[\s-]+/).filter(Boolean).map((g) => `${g[0]}.`).join(' ');
  const authors = people.map((p) => (p.given ? `${initials(p.given)} ${p.family}` : p.family));
  const authorText = authors.length <= 2 ? authors.join(' and ') : `${authors.slice(0, -1).join(', ')} and ${authors[authors.length - 1]}`;
  const engine = `engine ${record.engine.version}, numerics ${record.engine.numericsHash.slice(0, 12)}`;
  const checked = checkedOn ? ` on ${checkedOn}` : '';
  const text = `${authorText}, “${m.title},” Strobe Atlas model ${record.id} (${year}); claims checked by ${engine}${checked}.`;
  const key = `strobe-atlas:${record.id}`;
  const bibtex = [
    `@misc{${key},`,
    `  author       = {${people.map((p) => bibtexEscape(p.given ? `${p.family}, ${p.given}` : p.family)).join(' and ')}},`,
    `  title        = {{${bibtexEscape(m.title)}}},`,
    `  howpublished = {Strobe Atlas model \\texttt{${bibtexEscape(record.id)}}},`,
    `  year         = {${year}},`,
    `  note         = {Claims checked by ${bibtexEscape(engine)}${bibtexEscape(checked)}}`,
    '}',
  ].join('\n');
  return { text, bibtex };
}

export interface ReferenceView {
  text: string;
  doi: string | null;
  arxiv: string | null;
  note: string | null;
}

export function referenceViews(record: ModelRecord): ReferenceView[] {
  return (record.model?.references ?? []).map((r) => ({
    text: r.citation ?? (r.doi ? `doi:${r.doi}` : r.arxiv ? `arXiv:${r.arxiv}` : ''),
    doi: r.doi ? `https://doi.org/${encodeURI(r.doi)}` : null,
    arxiv: r.arxiv ? `https://arxiv.org/abs/${encodeURI(r.arxiv)}` : null,
    note: r.note,
  }));
}
