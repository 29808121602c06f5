/**
 * A small, safe arithmetic evaluator for parameter expressions in model files.
 *
 * Grammar (recursive descent, one function per precedence level):
 *   sum     := product (("+" | "-") product)*
 *   product := unary (("*" | "/") unary)*
 *   unary   := ("+" | "-") unary | power
 *   power   := atom ("^" unary)?            right-associative; -2^2 = -(2^2) as in mathematics
 *   atom    := number | name | name "(" sum ("," sum)* ")" | "(" sum ")"
 *
 * Nothing here calls eval or Function, and names are looked up in Maps, never on
 * objects, so "constructor" or "__proto__" are just unknown names. Nesting depth
 * and expression length are bounded, and every intermediate result must be
 * finite, so hostile input ends in a located ExpressionError, never in a crash or
 * a silent NaN.
 */

export const MAX_EXPRESSION_LENGTH = 500;
export const MAX_NESTING_DEPTH = 64;

/** An error at a character position (0-based) of the expression text. */
export class ExpressionError extends Error {
  constructor(
    message: string,
    readonly position: number,
    readonly hint?: string,
  ) {
    super(message);
    this.name = 'ExpressionError';
  }
}

export type ExpressionNode =
  | { kind: 'number'; value: number; position: number }
  | { kind: 'name'; name: string; position: number }
  | { kind: 'unary'; operator: '-' | '+'; operand: ExpressionNode; position: number }
  | { kind: 'binary'; operator: '+' | '-' | '*' | '/' | '^'; left: ExpressionNode; right: ExpressionNode; position: number }
  | { kind: 'call'; name: string; args: ExpressionNode[]; position: number };

/** Built-in constants; parameters may not reuse these names. */
export const CONSTANTS: ReadonlyMap<string, number> = new Map([
  ['pi', Math.PI],
  ['e', Math.E],
]);

interface FunctionSpec {
  arity: number | [number, number];
  apply: (...args: number[]) => number;
}

/** Built-in functions, by name. Arity [min, max] for variadic ones. */
export const FUNCTIONS: ReadonlyMap<string, FunctionSpec> = new Map<string, FunctionSpec>([
  ['sqrt', { arity: 1, apply: Math.sqrt }],
  ['sin', { arity: 1, apply: Math.sin }],
  ['cos', { arity: 1, apply: Math.cos }],
  ['tan', { arity: 1, apply: Math.tan }],
  ['asin', { arity: 1, apply: Math.asin }],
  ['acos', { arity: 1, apply: Math.acos }],
  ['atan', { arity: 1, apply: Math.atan }],
  ['atan2', { arity: 2, apply: Math.atan2 }],
  ['sinh', { arity: 1, apply: Math.sinh }],
  ['cosh', { arity: 1, apply: Math.cosh }],
  ['tanh', { arity: 1, apply: Math.tanh }],
  ['exp', { arity: 1, apply: Math.exp }],
  ['log', { arity: 1, apply: Math.log }],
  ['log10', { arity: 1, apply: Math.log10 }],
  ['abs', { arity: 1, apply: Math.abs }],
  ['sign', { arity: 1, apply: Math.sign }],
  ['floor', { arity: 1, apply: Math.floor }],
  ['ceil', { arity: 1, apply: Math.ceil }],
  ['round', { arity: 1, apply: Math.round }],
  ['hypot', { arity: [1, 16], apply: Math.hypot }],
  ['min', { arity: [1, 16], apply: Math.min }],
  ['max', { arity: [1, 16], apply: Math.max }],
]);

type Token =
  | { kind: 'number'; value: number; position: number }
  | { kind: 'name'; name: string; position: number }
  | { kind: 'symbol'; symbol: string; position: number }
  | { kind: 'end'; position: number };

const NUMBER = /^(?:[0-9]+(?:\.[0-9]*)?|\.[0-9]+)(?:[eE][+-]?[0-9]+)?/;
const NAME = /^[A-Za-z_][A-Za-z0-9_]*/;

function tokenize(text: string): Token[] {
  const tokens: Token[] = [];
  let i = 0;
  while (i < text.length) {
    const c = text[i];
    if (c === ' ' || c === '\t') {
      i++;
      continue;
    }
    const rest = text.slice(i, i + 64);
    const number = NUMBER.exec(rest);
    if (number) {
      if (number[0].length === rest.length && rest.length === 64) throw new ExpressionError('number literal too long', i);
      const value = Number(number[0]);
      if (!Number.isFinite(value)) throw new ExpressionError(`number ${number[0]} is out of range`, i);
      tokens.push({ kind: 'number', value, position: i });
      i += number[0].length;
      continue;
    }
    const name = NAME.exec(rest);
    if (name) {
      if (name[0].length > 32) throw new ExpressionError('name longer than 32 characters', i);
      tokens.push({ kind: 'name', name: name[0], position: i });
      i += name[0].length;
      continue;
    }
    if ('+-*/^(),'.includes(c)) {
      if (c === '*' && text[i + 1] === '*') throw new ExpressionError('"**" is not an operator here', i, 'write powers with ^, e.g. J^2');
      tokens.push({ kind: 'symbol', symbol: c, position: i });
      i++;
      continue;
    }
    if (c === '.') throw new ExpressionError('unexpected "."', i, 'member access is not supported; names are plain parameters, constants (pi, e) and functions');
    throw new ExpressionError(`unexpected character "${c}"`, i, 'expressions use numbers, parameter names, + - * / ^, parentheses and functions such as sqrt(x)');
  }
  tokens.push({ kind: 'end', position: text.length });
  return tokens;
}

class Parser {
  private index = 0;
  private depth = 0;
  constructor(private readonly tokens: Token[]) {}

  private peek(): Token {
    return this.tokens[this.index];
  }
  private isSymbol(symbol: string): boolean {
    const t = this.peek();
    return t.kind === 'symbol' && t.symbol === symbol;
  }
  private enter(position: number): void {
    if (++this.depth > MAX_NESTING_DEPTH) {
      throw new ExpressionError(`expression nested deeper than ${MAX_NESTING_DEPTH} levels`, position, 'split it into several parameters');
    }
  }

  parseAll(): ExpressionNode {
    const node = this.sum();
    const t = this.peek();
    if (t.kind !== 'end') {
      if (t.kind === 'symbol' && t.symbol === ')') throw new ExpressionError('unmatched ")"', t.position);
      throw new ExpressionError(`missing operator before ${describe(t)}`, t.position, 'write products explicitly, e.g. 2*pi');
    }
    return node;
  }

  private sum(): ExpressionNode {
    let left = this.product();
    while (this.isSymbol('+') || this.isSymbol('-')) {
      const t = this.tokens[this.index++] as { symbol: '+' | '-'; position: number };
      left = { kind: 'binary', operator: t.symbol, left, right: this.product(), position: t.position };
    }
    return left;
  }

  private product(): ExpressionNode {
    let left = this.unary();
    while (this.isSymbol('*') || this.isSymbol('/')) {
      const t = this.tokens[this.index++] as { symbol: '*' | '/'; position: number };
      left = { kind: 'binary', operator: t.symbol, left, right: this.unary(), position: t.position };
    }
    return left;
  }

  private unary(): ExpressionNode {
    if (this.isSymbol('-') || this.isSymbol('+')) {
      const t = this.tokens[this.index++] as { symbol: '+' | '-'; position: number };
      this.enter(t.position);
      const operand = this.unary();
      this.depth--;
      return { kind: 'unary', operator: t.symbol, operand, position: t.position };
    }
    return this.power();
  }

  private power(): ExpressionNode {
    const base = this.atom();
    if (!this.isSymbol('^')) return base;
    const t = this.tokens[this.index++];
    this.enter(t.position);
    const exponent = this.unary();
    this.depth--;
    return { kind: 'binary', operator: '^', left: base, right: exponent, position: t.position };
  }

  private atom(): ExpressionNode {
    const t = this.tokens[this.index++];
    if (t.kind === 'number') return { kind: 'number', value: t.value, position: t.position };
    if (t.kind === 'name') {
      if (!this.isSymbol('(')) return { kind: 'name', name: t.name, position: t.position };
      const open = this.tokens[this.index++];
      this.enter(open.position);
      const args: ExpressionNode[] = [];
      if (!this.isSymbol(')')) {
        args.push(this.sum());
        while (this.isSymbol(',')) {
          this.index++;
          args.push(this.sum());
        }
      }
      this.expectClose(open.position);
      this.depth--;
      return { kind: 'call', name: t.name, args, position: t.position };
    }
    if (t.kind === 'symbol' && t.symbol === '(') {
      this.enter(t.position);
      const inner = this.sum();
      this.expectClose(t.position);
      this.depth--;
      return inner;
    }
    if (t.kind === 'end') throw new ExpressionError('expression ends too early', t.position, 'an operand is missing at the end');
    throw new ExpressionError(`unexpected ${describe(t)}`, t.position);
  }

  private expectClose(openPosition: number): void {
    if (this.isSymbol(')')) {
      this.index++;
      return;
    }
    const t = this.peek();
    if (t.kind === 'end') throw new ExpressionError('missing ")"', t.position, `the "(" at character ${openPosition + 1} is not closed`);
    throw new ExpressionError(`expected "," or ")" but found ${describe(t)}`, t.position);
  }
}

function describe(t: Token): string {
  switch (t.kind) {
    case 'number':
      return `number ${t.value}`;
    case 'name':
      return `"${t.name}"`;
    case 'symbol':
      return `"${t.symbol}"`;
    case 'end':
      return 'end of expression';
  }
}

/** Parses an expression; throws ExpressionError with a position on malformed input. */
export function parseExpression(text: string): ExpressionNode {
  if (text.length > MAX_EXPRESSION_LENGTH) {
    throw new ExpressionError(`expression longer than ${MAX_EXPRESSION_LENGTH} characters`, MAX_EXPRESSION_LENGTH, 'split it into several parameters');
  }
  if (text.trim() === '') throw new ExpressionError('empty expression', 0, 'write a number or an expression such as "pi/2"');
  return new Parser(tokenize(text)).parseAll();
}

/** Names of parameters an expression refers to (constants and functions excluded), in order of appearance. */
export function referencedNames(node: ExpressionNode): { name: string; position: number }[] {
  const out: { name: string; position: number }[] = [];
  const stack: ExpressionNode[] = [node];
  while (stack.length > 0) {
    const n = stack.pop()!;
    if (n.kind === 'name' && !CONSTANTS.has(n.name)) out.push({ name: n.name, position: n.position });
    else if (n.kind === 'unary') stack.push(n.operand);
    else if (n.kind === 'binary') stack.push(n.right, n.left);
    else if (n.kind === 'call') stack.push(...[...n.args].reverse());
  }
  return out.sort((a, b) => a.position - b.position);
}

/** Evaluates a parsed expression. `scope` holds parameter values by name. */
export function evaluateNode(node: ExpressionNode, scope: ReadonlyMap<string, number>): number {
  switch (node.kind) {
    case 'number':
      return node.value;
    case 'name': {
      const constant = CONSTANTS.get(node.name);
      if (constant !== undefined) return constant;
      const value = scope.get(node.name);
      if (value === undefined) {
        if (FUNCTIONS.has(node.name)) throw new ExpressionError(`"${node.name}" is a function`, node.position, `call it, e.g. ${node.name}(x)`);
        throw new ExpressionError(`unknown parameter "${node.name}"`, node.position);
      }
      return value;
    }
    case 'unary': {
      const v = evaluateNode(node.operand, scope);
      return node.operator === '-' ? -v : v;
    }
    case 'binary': {
      const a = evaluateNode(node.left, scope);
      const b = evaluateNode(node.right, scope);
      let r: number;
      switch (node.operator) {
        case '+': r = a + b; break;
        case '-': r = a - b; break;
        case '*': r = a * b; break;
        case '/':
          if (b === 0) throw new ExpressionError('division by zero', node.position);
          r = a / b;
          break;
        case '^': r = Math.pow(a, b); break;
      }
      return finite(r, node.position, node.operator === '^' ? `${a}^${b} is not a finite real number` : 'result is not a finite number');
    }
    case 'call': {
      const fn = FUNCTIONS.get(node.name);
      if (!fn) {
        throw new ExpressionError(`unknown function "${node.name}"`, node.position, `functions are ${[...FUNCTIONS.keys()].join(', ')}`);
      }
      const [min, max] = typeof fn.arity === 'number' ? [fn.arity, fn.arity] : fn.arity;
      if (node.args.length < min || node.args.length > max) {
        const expected = min === max ? `${min}` : `${min} to ${max}`;
        throw new ExpressionError(`${node.name}() takes ${expected} argument${max === 1 ? '' : 's'}, got ${node.args.length}`, node.position);
      }
      const args = node.args.map((a) => evaluateNode(a, scope));
      return finite(fn.apply(...args), node.position, `${node.name}(${args.join(', ')}) is not a finite real number`);
    }
  }
}

function finite(value: number, position: number, message: string): number {
  if (!Number.isFinite(value)) throw new ExpressionError(message, position);
  return value;
}

/** Parses and evaluates in one go. */
export function evaluateExpression(text: string, scope: ReadonlyMap<string, number> = new Map()): number {
  return evaluateNode(parseExpression(text), scope);
}
