// The project documents rendered as pages: no raw TeX, Markdown table syntax or
// lost subscripts may reach the HTML (the defect was "| --- |" printed as text,
// ∂_tV shown as ∂tV and raw ^{…} fragments). The rendered text is compared with
// the source: every table row of the source must become a table row.
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { renderDocument, scriptNodes, siteLink } from '../../src/site/documents.ts';

/** Visible text of rendered HTML, without KaTeX's own markup and code. */
function visibleText(html: string): string {
  return html
    .replace(/<span class="katex-mathml">[\s\S]*?<\/span><span class="katex-html"/g, '<span class="katex-html"')
    .replace(/<code>[\s\S]*?<\/code>/g, ' ')
    .replace(/<pre>[\s\S]*?<\/pre>/g, ' ')
    .replace(/<[^>]+>/g, '')
    .replace(/&amp;/g, '&');
}

for (const name of ['conventions', 'model-format', 'worked-example', 'writing-drives', 'sharding', 'benchmarks']) {
  describe(`docs/${name}.md as a page`, () => {
    const source = readFileSync(`docs/${name}.md`, 'utf8');
    const html = renderDocument(source, '/base');
    const text = visibleText(html);

    it('leaves no table syntax, raw TeX or script markers in the text', () => {
      expect(text).not.toMatch(/\|\s*:?-{3,}/);
      // A table row left as text starts with "| " and ends with " |"; a norm such as |W − n| or |M| does not.
      expect(text).not.toMatch(/^\s*\|\s.*\s\|\s*$/m);
      expect(text).not.toMatch(/[_^]\{/);
      expect(text).not.toMatch(/\\(frac|partial|sum|int|mathbf|left|right|begin)\b/);
      expect(text).not.toMatch(/\$[^$\s]/);
      expect(html).not.toContain('katex-error');
    });

    it('turns every Markdown table of the source into an HTML table with all its rows', () => {
      const sourceRows = source.split('\n').filter((l) => /^\|.*\|\s*$/.test(l) && !/^\|\s*:?-{3,}/.test(l)).length;
      const htmlRows = (html.match(/<tr>/g) ?? []).length;
      expect(htmlRows).toBe(sourceRows);
      expect((html.match(/<div class="table-scroll"><table>/g) ?? []).length).toBe((html.match(/<table>/g) ?? []).length);
    });

    it('gives headings ids and points links at the site', () => {
      expect(html).toMatch(/<h2 id="[a-z0-9-]+">/);
      expect(html).not.toMatch(/href="[^"]*\.md(#[^"]*)?"/);
    });
  });
}

describe('Unicode notation in documents', () => {
  it('keeps subscripts that Markdown would have taken for emphasis (∂_tV, H(s)_{ba})', () => {
    const html = renderDocument('Here V⁻¹∂_t V and H(s)_{ba} = Σ_n t_{a→b,n} e^{−2πi s·n}, and P_> with count_high.');
    expect(html).toContain('∂<sub>t</sub> V');
    expect(html).toContain('H(s)<sub>ba</sub>');
    expect(html).toContain('Σ<sub>n</sub>');
    expect(html).toContain('t<sub>a→b,n</sub>');
    expect(html).toContain('e<sup>−2πi s·n</sup>');
    expect(html).toMatch(/P<sub>(>|&gt;)<\/sub>/);
    expect(html).toContain('count<sub>high</sub>');
    expect(html).not.toContain('<em>');
  });

  it('nests notation inside a braced script and ends a run at a change of case', () => {
    expect(scriptNodes('e^{+iH_ε t}')).toMatchObject([{ type: 'text', value: 'e' }, { type: 'superscript', children: [{ value: '+iH' }, { type: 'subscript', children: [{ value: 'ε' }] }, { value: ' t' }] }]);
    expect(scriptNodes('∂_μV')).toMatchObject([{ value: '∂' }, { type: 'subscript', children: [{ value: 'μ' }] }, { value: 'V' }]);
  });

  it('still renders $…$ math, code spans and real emphasis written with *', () => {
    const html = renderDocument('Math $H_{ab}$, code `a_b`, and *stress*.');
    expect(html).toContain('class="katex"');
    expect(html).toContain('<code>a_b</code>');
    expect(html).toContain('<em>stress</em>');
  });

  it('maps links between documents, to schemas and to model files onto site pages', () => {
    expect(siteLink('conventions.md#orientation', '/b')).toBe('/b/docs/conventions/#orientation');
    expect(siteLink('../schemas/model.schema.json', '/b')).toBe('/b/schemas/model.schema.json');
    expect(siteLink('../models/two-step-chain.json', '/b')).toBe('/b/models/two-step-chain/');
    expect(siteLink('https://doi.org/10.1103/PhysRevX.3.031005', '/b')).toBe('https://doi.org/10.1103/PhysRevX.3.031005');
    expect(siteLink('../src/numerics/evolution/drive.ts', '/b')).toBeNull();
  });

  it('stays safe: raw HTML in a document is dropped', () => {
    const html = renderDocument('Text <script>alert(1)</script> <img src=x onerror="alert(2)">');
    expect(html).not.toMatch(/<script|onerror/i);
  });
});
