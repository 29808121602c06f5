// Model descriptions are untrusted Markdown: hostile HTML must not survive,
// and math must match what KaTeX itself renders (the reference library).
import { describe, expect, it } from 'vitest';
import katex from 'katex';
import { renderMarkdown } from '../../src/site/markdown.ts';

describe('renderMarkdown', () => {
  it('drops script tags, event handlers and javascript: links', () => {
    const html = renderMarkdown(
      'Hello <script>alert(1)</script> <img src=x onerror="alert(2)"> [click](javascript:alert(3)) <a href="#" onclick="x()">a</a>',
    );
    expect(html).not.toMatch(/<script/i);
    expect(html).not.toMatch(/onerror/i);
    expect(html).not.toMatch(/onclick/i);
    expect(html).not.toMatch(/javascript:/i);
    expect(html).toContain('Hello');
  });

  it('renders inline math exactly as KaTeX renders the same TeX', () => {
    const tex = '\\varepsilon \\in (-\\pi/T, \\pi/T]';
    const html = renderMarkdown(`Quasienergy $${tex}$ here.`);
    const expected = katex.renderToString(tex, { throwOnError: false, displayMode: false });
    expect(html).toContain(expected);
  });

  it('renders display math in display mode', () => {
    const tex = 'W = \\frac{1}{8\\pi^2}\\int dt\\, d^2k';
    const html = renderMarkdown(`Text\n\n$$\n${tex}\n$$\n`);
    expect(html).toContain('katex-display');
    expect(html).toContain(katex.renderToString(tex, { throwOnError: false, displayMode: true }));
  });

  it('keeps invalid TeX as a visible error instead of failing the page', () => {
    const html = renderMarkdown('Broken $\\frac{1}{$ math');
    expect(html).toContain('katex-error');
  });

  it('keeps ordinary Markdown structure', () => {
    const html = renderMarkdown('# Title\n\n- one\n- two\n\n**bold**');
    expect(html).toMatch(/<h1[^>]*>Title<\/h1>/);
    expect(html).toContain('<li>one</li>');
    expect(html).toContain('<strong>bold</strong>');
  });
});
