/**
 * Expressions of a model file (catalogue/expressions.ts grammar) written as
 * TeX: "pi/(2*tau)" → \frac{\pi}{2\tau}, "2*theta1/T" → \frac{2\theta_{1}}{T}.
 * Parameter names become symbols (symbols.ts); the expression's characters
 * are limited by its grammar, so the TeX holds only what is built here.
 */
import { parseExpression, type ExpressionNode } from '../../catalogue/expressions.ts';
import type { Quantity } from '../../catalogue/model-types.generated.ts';
import { parameterTex } from '../symbols.ts';

const PRECEDENCE = { sum: 1, product: 2, unary: 3, power: 4, atom: 5 } as const;

function precedence(node: ExpressionNode): number {
  if (node.kind === 'binary') return node.operator === '+' || node.operator === '-' ? PRECEDENCE.sum : node.operator === '^' ? PRECEDENCE.power : PRECEDENCE.product;
  if (node.kind === 'unary') return PRECEDENCE.unary;
  return PRECEDENCE.atom;
}

/** A number as TeX: 0.5, 3, 1.2 \times 10^{-3}. */
export function numberTex(value: number): string {
  if (!Number.isFinite(value)) return '\\text{—}';
  if (Number.isInteger(value) && Math.abs(value) < 1e6) return String(value);
  const abs = Math.abs(value);
  if (abs !== 0 && (abs < 1e-3 || abs >= 1e6)) {
    const [mantissa, exponent] = value.toExponential(3).split('e');
    return `${Number(mantissa)} \\times 10^{${Number(exponent)}}`;
  }
  return String(Number(value.toPrecision(6)));
}

const FUNCTION_TEX: Record<string, string> = {
  sin: '\\sin', cos: '\\cos', tan: '\\tan', sinh: '\\sinh', cosh: '\\cosh', tanh: '\\tanh',
  asin: '\\arcsin', acos: '\\arccos', atan: '\\arctan', exp: '\\exp', log: '\\ln', log10: '\\log_{10}',
  min: '\\min', max: '\\max', sign: '\\operatorname{sgn}', round: '\\operatorname{round}', hypot: '\\operatorname{hypot}', atan2: '\\operatorname{atan2}',
};

const paren = (tex: string) => `\\left(${tex}\\right)`;
const startsWithDigit = (tex: string) => /^[0-9.]/.test(tex);

function wrap(node: ExpressionNode, minimum: number): string {
  const tex = toTex(node);
  return precedence(node) < minimum ? paren(tex) : tex;
}

function toTex(node: ExpressionNode): string {
  switch (node.kind) {
    case 'number':
      return numberTex(node.value);
    case 'name':
      return node.name === 'pi' ? '\\pi' : node.name === 'e' ? 'e' : parameterTex(node.name);
    case 'unary':
      return node.operator === '-' ? `-${wrap(node.operand, PRECEDENCE.power)}` : toTex(node.operand);
    case 'call': {
      const args = node.args.map(toTex);
      if (node.name === 'sqrt') return `\\sqrt{${args[0]}}`;
      if (node.name === 'abs') return `\\left|${args[0]}\\right|`;
      if (node.name === 'floor') return `\\left\\lfloor ${args[0]}\\right\\rfloor`;
      if (node.name === 'ceil') return `\\left\\lceil ${args[0]}\\right\\rceil`;
      return `${FUNCTION_TEX[node.name] ?? `\\operatorname{${node.name}}`}${paren(args.join(',\\, '))}`;
    }
    case 'binary': {
      const { operator, left, right } = node;
      if (operator === '+') return `${toTex(left)} + ${wrap(right, PRECEDENCE.sum)}`;
      if (operator === '-') return `${toTex(left)} - ${wrap(right, PRECEDENCE.product)}`;
      if (operator === '/') return `\\frac{${toTex(left)}}{${toTex(right)}}`;
      if (operator === '^') return `{${wrap(left, PRECEDENCE.atom)}}^{${toTex(right)}}`;
      const l = wrap(left, PRECEDENCE.product);
      const r = wrap(right, PRECEDENCE.power);
      return startsWithDigit(r) || r.startsWith('-') ? `${l} \\cdot ${r}` : `${l} ${r}`;
    }
  }
}

/** TeX of a number-or-expression of a model file. */
export function quantityTex(quantity: Quantity): string {
  if (typeof quantity === 'number') return numberTex(quantity);
  try {
    return toTex(parseExpression(quantity));
  } catch {
    // The loader accepted the file, so this does not happen; show the text inertly if it does.
    return `\\texttt{${quantity.replace(/[^A-Za-z0-9 +\-*/^().,]/g, '?')}}`;
  }
}

/** Whether TeX for a factor needs brackets before another factor (it is a sum or difference). */
export function isCompound(quantity: Quantity): boolean {
  if (typeof quantity === 'number') return quantity < 0;
  try {
    const node = parseExpression(quantity);
    return precedence(node) <= PRECEDENCE.unary;
  } catch {
    return true;
  }
}
