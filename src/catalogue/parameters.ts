/**
 * Named parameters of a model: each is a number or an expression over other
 * parameters. Evaluation order follows the dependencies (a topological order);
 * cycles and unknown names are reported with the path that causes them.
 */
import type { Parameter, Parameters, Quantity } from './model-types.generated.ts';
import { joinPointer, suggestName, type Issue } from './diagnostics.ts';
import { CONSTANTS, ExpressionError, FUNCTIONS, evaluateNode, parseExpression, referencedNames, type ExpressionNode } from './expressions.ts';

export interface ParameterTable {
  /** Values by name, in evaluation order. */
  values: Map<string, number>;
  issues: Issue[];
}

/** The number-or-expression of a parameter entry, and the pointer of that quantity. */
export function parameterQuantity(entry: Parameter, pointer: string): { quantity: Quantity; pointer: string } {
  return typeof entry === 'object' && entry !== null ? { quantity: entry.value, pointer: joinPointer(pointer, 'value') } : { quantity: entry, pointer };
}

/** Turns an ExpressionError into an Issue located inside the string at `pointer`. */
export function expressionIssue(error: ExpressionError, pointer: string, prefix = ''): Issue {
  const issue: Issue = { pointer, message: prefix + error.message, offsetInString: error.position };
  if (error.hint !== undefined) issue.hint = error.hint;
  return issue;
}

/**
 * Evaluates every parameter. `overrides` replace the given parameters' values
 * (their own expressions are skipped) and everything depending on them is
 * re-evaluated, as sweeps need.
 */
export function evaluateParameters(parameters: Parameters | undefined, overrides: Record<string, number> = {}, base = '/parameters'): ParameterTable {
  const issues: Issue[] = [];
  const values = new Map<string, number>();
  const entries = Object.entries(parameters ?? {}).filter((e): e is [string, Parameter] => e[1] !== undefined);
  const names = entries.map(([name]) => name);
  const parsed = new Map<string, { node?: ExpressionNode; value?: number; pointer: string }>();

  for (const [name, entry] of entries) {
    const { quantity, pointer } = parameterQuantity(entry, joinPointer(base, name));
    if (CONSTANTS.has(name) || FUNCTIONS.has(name)) {
      issues.push({ pointer: joinPointer(base, name), message: `"${name}" is a built-in ${CONSTANTS.has(name) ? 'constant' : 'function'} and cannot be a parameter name`, hint: 'rename the parameter', target: 'key' });
      continue;
    }
    if (Object.hasOwn(overrides, name)) {
      parsed.set(name, { value: overrides[name], pointer });
    } else if (typeof quantity === 'number') {
      parsed.set(name, { value: quantity, pointer });
    } else {
      try {
        parsed.set(name, { node: parseExpression(quantity), pointer });
      } catch (error) {
        if (!(error instanceof ExpressionError)) throw error;
        issues.push(expressionIssue(error, pointer));
      }
    }
  }

  // Depth-first evaluation with an explicit path, so a cycle can be printed as a → b → a.
  const state = new Map<string, 'visiting' | 'done' | 'failed'>();
  const visit = (name: string, path: string[]): boolean => {
    const s = state.get(name);
    if (s === 'done') return true;
    if (s === 'failed') return false;
    const item = parsed.get(name);
    if (!item) return false;
    if (s === 'visiting') {
      const cycle = [...path.slice(path.indexOf(name)), name];
      issues.push({ pointer: parsed.get(cycle[0])!.pointer, message: `cycle: ${cycle.join(' → ')}`, hint: 'give one of these parameters a number' });
      for (const n of cycle) state.set(n, 'failed');
      return false;
    }
    state.set(name, 'visiting');
    let ok = true;
    if (item.node) {
      for (const ref of referencedNames(item.node)) {
        if (!parsed.has(ref.name) && !names.includes(ref.name)) {
          issues.push({ pointer: item.pointer, message: `unknown parameter "${ref.name}"`, hint: suggestName(ref.name, names, 'parameters'), offsetInString: ref.position });
          ok = false;
        } else if (!visit(ref.name, [...path, name])) ok = false;
      }
    }
    if (state.get(name) === 'failed') return false;
    if (ok && item.node) {
      try {
        item.value = evaluateNode(item.node, values);
      } catch (error) {
        if (!(error instanceof ExpressionError)) throw error;
        issues.push(expressionIssue(error, item.pointer));
        ok = false;
      }
    }
    if (ok && item.value !== undefined && !Number.isFinite(item.value)) {
      issues.push({ pointer: item.pointer, message: `parameter "${name}" is not a finite number` });
      ok = false;
    }
    state.set(name, ok ? 'done' : 'failed');
    if (ok) values.set(name, item.value!);
    return ok;
  };
  for (const name of names) visit(name, []);
  return { values, issues };
}

/**
 * Evaluates a quantity (number or expression) found at `pointer`, using the
 * parameter values. Returns the number, or an Issue located in the string.
 */
export function evaluateQuantity(quantity: Quantity, scope: ReadonlyMap<string, number>, pointer: string): number | Issue {
  if (typeof quantity === 'number') {
    return Number.isFinite(quantity) ? quantity : { pointer, message: 'number is out of range' };
  }
  let node: ExpressionNode;
  try {
    node = parseExpression(quantity);
  } catch (error) {
    if (!(error instanceof ExpressionError)) throw error;
    return expressionIssue(error, pointer);
  }
  for (const ref of referencedNames(node)) {
    if (!scope.has(ref.name) && !FUNCTIONS.has(ref.name)) {
      return { pointer, message: `unknown parameter "${ref.name}"`, hint: suggestName(ref.name, [...scope.keys()], 'parameters'), offsetInString: ref.position };
    }
  }
  try {
    return evaluateNode(node, scope);
  } catch (error) {
    if (!(error instanceof ExpressionError)) throw error;
    return expressionIssue(error, pointer);
  }
}

/** Names of parameters a quantity refers to (empty for numbers and malformed expressions). */
export function quantityReferences(quantity: Quantity): string[] {
  if (typeof quantity === 'number') return [];
  try {
    return referencedNames(parseExpression(quantity)).map((r) => r.name);
  } catch {
    return [];
  }
}

export function isIssue(value: number | Issue): value is Issue {
  return typeof value !== 'number';
}
