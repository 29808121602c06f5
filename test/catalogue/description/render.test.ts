// Descriptions are rendered at check time by the renderer the site uses, within
// limits; a description it refuses is a located error of the model file.
import { describe, expect, it } from 'vitest';
import katex from 'katex';
import { readFileSync } from 'node:fs';
import { DESCRIPTION_LIMITS, renderDescription, renderMarkdown } from '../../../src/catalogue/description/render.ts';
import { rawOffsetInString } from '../../../src/catalogue/description/check.ts';
import { checkModelSource } from '../../../src/catalogue/load.ts';

const refusal = (markdown: string) => {
  const result = renderDescription(markdown);
  expect(result.ok, markdown.slice(0, 40)).toBe(false);
  return result.ok ? '' : result.problem.message;
};

describe('renderDescription limits', () => {
  it('refuse each kind of input that once hung or crashed the site build, naming the limit', () => {
    expect(refusal('x'.repeat(DESCRIPTION_LIMITS.maxCharacters + 1))).toBe(`is ${DESCRIPTION_LIMITS.maxCharacters + 1} characters long; at most ${DESCRIPTION_LIMITS.maxCharacters} are allowed`);
    expect(refusal('>'.repeat(5000) + ' x')).toMatch(/nests block quotes or lists too deeply/);
    expect(refusal('> '.repeat(7) + 'x')).toBe('nests block quotes or lists 7 levels deep; at most 6 are allowed');
    expect(refusal('*a'.repeat(2500))).toMatch(/has 2500 emphasis, code and link delimiters/);
    expect(refusal('$a$ '.repeat(201))).toBe('has more than 200 formulas');
    expect(refusal(`$${'x'.repeat(1001)}$`)).toMatch(/formula of 1001 characters/);
    expect(refusal('$\\newcommand{\\a}{b}\\a$')).toMatch(/defines a macro \(\\newcommand\)/);
    expect(refusal('```math\n\\gdef\\a{b}\n```')).toMatch(/defines a macro \(\\gdef\)/);
    expect(refusal(`$${'{'.repeat(40)}x${'}'.repeat(40)}$`)).toMatch(/braces nested more than 32 levels/);
    expect(refusal('a\n'.repeat(DESCRIPTION_LIMITS.maxLines))).toMatch(/has 501 lines; at most 500/);
  });

  it('typesets math exactly as KaTeX does with trust off and bounded sizes (the reference library)', () => {
    const tex = 'U(T) = \\mathcal{T} e^{-i\\int_0^T H(t)\\,dt}';
    const result = renderDescription(`Floquet operator $${tex}$.`);
    expect(result.ok && result.html).toContain(katex.renderToString(tex, { trust: false, maxSize: 20, maxExpand: 500, strict: 'ignore' }));
  });

  it('renders the demo descriptions', () => {
    for (const id of ['qwz-sheet', 'checkerboard-five-step', 'two-step-chain']) {
      expect(renderDescription(JSON.parse(readFileSync(`models/${id}.json`, 'utf8')).description).ok, id).toBe(true);
    }
  });

  it('give pages a visible note instead of the description', () => {
    expect(renderMarkdown('$a$ '.repeat(201))).toBe('<p class="render-error">This text was not rendered: it has more than 200 formulas (keep the key formulas on the page and cite references for derivations).</p>');
  });
});

describe('a refused description in a model file', () => {
  it('is a located error at the formula that breaks the limit', () => {
    const doc = JSON.parse(readFileSync('test/fixtures/valid/minimal-chain.json', 'utf8'));
    doc.description = 'The chain.\n\nA "quoted" word, then $\\def\\x{y}\\x$.';
    const text = JSON.stringify(doc, null, 2);
    const { model, diagnostics } = checkModelSource('minimal-chain.json', text);
    expect(model).toBeUndefined();
    const d = diagnostics.find((x) => x.pointer === '/description')!;
    expect(d.message).toBe('the description defines a macro (\\def) in a formula; definitions are not allowed in descriptions');
    // The column of the "$" that opens the formula, counted in the raw JSON text (escapes included).
    const line = text.split('\n')[d.line - 1];
    expect(line.slice(d.column - 1).startsWith('$\\\\def')).toBe(true);
  });

  it('maps decoded offsets to raw JSON offsets across escapes', () => {
    expect(rawOffsetInString('a\\nb\\u00e9c', 3)).toBe(4); // a, \n, b: 1 + 2 + 1 raw characters
    expect(rawOffsetInString('a\\nb\\u00e9c', 4)).toBe(10); // then é written as \u00e9: 6 more
    expect(rawOffsetInString('plain', 3)).toBe(3);
  });
});
