// Suggested citations: names reordered for BibTeX, special characters escaped so
// that a title or id cannot break the entry, DOI and arXiv links well formed.
import { describe, expect, it } from 'vitest';
import { bibtexEscape, citation, personName, referenceViews } from '../../src/site/citation.ts';
import type { ModelRecord } from '../../src/catalogue/records/model-record.ts';

const record = {
  id: 'demo-model',
  engine: { version: '0.5.0', numericsHash: 'a'.repeat(64) },
  model: {
    title: 'Spin_up & 100% {braces}',
    maintainers: ['Ines Varga-Holm (Lantern Lab, Ostvik University)', 'Amaru Quispe-Lindqvist'],
    dates: { created: '2024-02-12', updated: '2025-01-03' },
    references: [{ doi: '10.1103/PhysRevX.3.031005', arxiv: '1212.3324', citation: 'Phys. Rev. X 3, 031005 (2013)', note: 'the drive' }],
  },
} as unknown as ModelRecord;

describe('citations', () => {
  it('splits maintainers into given and family names, dropping affiliations', () => {
    expect(personName('Ines Varga-Holm (Lantern Lab, Ostvik University)')).toEqual({ given: 'Ines', family: 'Varga-Holm' });
  });

  it('escapes every BibTeX special character', () => {
    expect(bibtexEscape('a_b & 100% {x} #1 $y$ ^ ~ \\')).toBe('a\\_b \\& 100\\% \\{x\\} \\#1 \\$y\\$ \\^{} \\~{} \\textbackslash{}');
  });

  it('gives text and BibTeX with the year of the last change and the engine that checked it', () => {
    const c = citation(record, '2025-12-03')!;
    expect(c.text).toBe('I. Varga-Holm and A. Quispe-Lindqvist, “Spin_up & 100% {braces},” Strobe Atlas model demo-model (2025); claims checked by engine 0.5.0, numerics aaaaaaaaaaaa on 2025-12-03.');
    expect(c.bibtex).toContain('author       = {Varga-Holm, Ines and Quispe-Lindqvist, Amaru},');
    expect(c.bibtex).toContain('title        = {{Spin\\_up \\& 100\\% \\{braces\\}}},');
    expect(c.bibtex).toContain('year         = {2025},');
    // Braces balance, so the entry parses.
    const opens = (c.bibtex.match(/(?<!\\)\{/g) ?? []).length, closes = (c.bibtex.match(/(?<!\\)\}/g) ?? []).length;
    expect(opens).toBe(closes);
  });

  it('links DOIs and arXiv identifiers', () => {
    expect(referenceViews(record)[0]).toMatchObject({ doi: 'https://doi.org/10.1103/PhysRevX.3.031005', arxiv: 'https://arxiv.org/abs/1212.3324' });
  });
});
