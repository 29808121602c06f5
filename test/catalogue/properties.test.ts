// Property-based tests (fast-check 4.10.2, seeded so that a failure repeats):
// generated hostile inputs for the expression parser, the loader and the
// Markdown renderer. Each property says what must hold for every input, not
// what one input gives: no input throws past the API, every error is located
// inside the text it came from, and no output runs code.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { evaluate as mathjsEvaluate } from 'mathjs';
import { readFileSync } from 'node:fs';
import { ExpressionError, evaluateExpression, MAX_EXPRESSION_LENGTH } from '../../src/catalogue/expressions.ts';
import { checkModelSource } from '../../src/catalogue/load.ts';
import { renderDescription } from '../../src/catalogue/description/render.ts';

const SEED = 20240601;
const runs = (numRuns: number) => ({ seed: SEED, numRuns });

const hostileCharacters = fc.constantFrom(...'0123456789.+-*/^(),e pi_xJTabcdefghijklmnopqrstuvwxyz\\"\'`$[]{}<>!#%&|~?;:@'.split(''), '__proto__', 'constructor', 'pi', 'sqrt(', 'exp(', '10^', '1e308', 'NaN', 'Infinity');

describe('expression parser', () => {
  const scope = new Map([['J', 1.5], ['T', 2], ['x', -0.25]]);

  it('either returns a finite number or throws an ExpressionError located inside the text', () => {
    fc.assert(
      fc.property(fc.array(hostileCharacters, { maxLength: 120 }).map((parts) => parts.join('')), (text) => {
        try {
          expect(Number.isFinite(evaluateExpression(text, scope))).toBe(true);
        } catch (error) {
          expect(error).toBeInstanceOf(ExpressionError);
          const position = (error as ExpressionError).position;
          expect(position).toBeGreaterThanOrEqual(0);
          expect(position).toBeLessThanOrEqual(Math.max(text.length, MAX_EXPRESSION_LENGTH));
        }
      }),
      runs(3000),
    );
  });

  it('agrees with mathjs on generated arithmetic (the reference library)', () => {
    const leaf = fc.oneof(fc.integer({ min: 1, max: 9 }).map(String), fc.constantFrom('J', 'T', 'x'));
    const expression: fc.Arbitrary<string> = fc.letrec<{ e: string }>((tie) => ({
      e: fc.oneof(
        { depthSize: 'small', withCrossShrink: true },
        leaf,
        fc.tuple(tie('e'), fc.constantFrom('+', '-', '*'), tie('e')).map(([a, op, b]) => `(${a} ${op} ${b})`),
        tie('e').map((a) => `sqrt(abs(${a}))`),
      ),
    })).e;
    fc.assert(
      fc.property(expression, (text) => {
        const ours = evaluateExpression(text, scope);
        const theirs = mathjsEvaluate(text, { J: 1.5, T: 2, x: -0.25 }) as number;
        // Relative 1e-12: a few dozen roundings at most in expressions of this size (common practice).
        expect(Math.abs(ours - theirs)).toBeLessThanOrEqual(1e-12 * Math.max(1, Math.abs(theirs)));
      }),
      runs(500),
    );
  });
});

describe('loader', () => {
  const valid = readFileSync('test/fixtures/valid/minimal-chain.json', 'utf8');

  const checkLocated = (text: string) => {
    const { model, diagnostics } = checkModelSource('minimal-chain.json', text);
    // The loader counts \r\n, \r and \n as line ends, as editors do.
    const lines = text.split(/\r\n|\r|\n/);
    for (const d of diagnostics) {
      expect(d.line).toBeGreaterThanOrEqual(1);
      expect(d.line).toBeLessThanOrEqual(lines.length);
      expect(d.column).toBeGreaterThanOrEqual(1);
      expect(d.column).toBeLessThanOrEqual(lines[d.line - 1].length + 2);
      expect(d.message.length).toBeGreaterThan(0);
    }
    if (!model) expect(diagnostics.some((d) => d.severity === 'error')).toBe(true);
  };

  it('never throws on arbitrary text, and locates every problem inside it', () => {
    fc.assert(fc.property(fc.string({ maxLength: 400, unit: 'binary' }), (text) => checkLocated(text)), runs(500));
  });

  it('never throws on a valid model with one value replaced by anything JSON can hold', () => {
    const base = JSON.parse(valid);
    const paths: string[][] = [];
    const walk = (v: unknown, path: string[]) => {
      paths.push(path);
      if (v && typeof v === 'object') for (const [k, c] of Object.entries(v)) walk(c, [...path, k]);
    };
    walk(base, []);
    fc.assert(
      fc.property(fc.constantFrom(...paths.filter((p) => p.length > 0)), fc.jsonValue({ maxDepth: 3 }), (path, replacement) => {
        const copy = JSON.parse(valid);
        let target = copy;
        for (const key of path.slice(0, -1)) target = target[key];
        target[path[path.length - 1]] = replacement;
        checkLocated(JSON.stringify(copy, null, 2));
      }),
      runs(400),
    );
  });

  it('never throws on a valid model with a character deleted or inserted', () => {
    fc.assert(
      fc.property(fc.nat({ max: valid.length - 1 }), fc.constantFrom('', '"', '{', '}', '[', ']', ',', ':', '\\', '\u0000', '\u2028', '-', 'e'), (at, insert) => {
        checkLocated(valid.slice(0, at) + insert + valid.slice(at + 1));
      }),
      runs(400),
    );
  });
});

describe('Markdown renderer', () => {
  const markdownPiece = fc.constantFrom(
    '*', '_', '**', '`', '[', ']', '(', ')', '>', '> ', '- ', '1. ', '#', '$', '$$\n', '\n', '\n\n', '  ', '\t', '<', '>', '&',
    '<script>', '<img src=x onerror=alert(1)>', 'javascript:', '[a](javascript:alert(1))', '\\href{javascript:x}{y}', '\\def\\x{y}', '\\htmlId{a}{b}',
    '\\frac{', '}', '{', 'x', 'word ', '```\n', '```math\n', '~~~', '---', '===', '|', '\\', 'http://a.b', '<!--', ']]>',
  );
  const hostileMarkdown = fc.array(markdownPiece, { maxLength: 300 }).map((p) => p.join(''));

  it('never throws, and what it renders holds no script, handler or javascript: link', () => {
    fc.assert(
      fc.property(hostileMarkdown, (markdown) => {
        const result = renderDescription(markdown);
        if (!result.ok) {
          expect(result.problem.message.length).toBeGreaterThan(0);
          if (result.problem.offset !== undefined) expect(result.problem.offset).toBeLessThanOrEqual(markdown.length);
          return;
        }
        // Every element and attribute the HTML has (quoted values and escaped text start none).
        const markup = result.html.replace(/"[^"]*"/g, '""');
        for (const [, name, attributes] of markup.matchAll(/<([a-zA-Z][\w-]*)([^>]*)>/g)) {
          expect(['script', 'img', 'iframe', 'object', 'embed', 'form', 'style', 'link', 'meta', 'base']).not.toContain(name.toLowerCase());
          for (const [attribute] of attributes.matchAll(/[^\s=]+(?==)/g)) expect(attribute.toLowerCase()).not.toMatch(/^on/);
        }
        expect(result.html).not.toMatch(/href="\s*javascript:/i);
        expect(Buffer.byteLength(result.html)).toBeLessThanOrEqual(200_000);
      }),
      runs(400),
    );
  });

  it('refuses long runs of structure before parsing them', () => {
    fc.assert(
      fc.property(fc.constantFrom('>', '> - ', '*a', '_a', '[', '`a', '$a$ '), fc.integer({ min: 5000, max: 20000 }), (unit, count) => {
        const markdown = unit.repeat(Math.ceil(count / unit.length));
        expect(renderDescription(markdown).ok).toBe(false);
      }),
      runs(40),
    );
  });
});
