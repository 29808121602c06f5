/**
 * Deterministic JSON text for results records and cache keys.
 *
 * Two runs over the same inputs must give byte-identical files, whatever the
 * machine, the worker count or the order in which models finished. So:
 * - object keys are written in code-point order (JSON.stringify keeps insertion order);
 * - non-integer numbers are rounded to 12 significant digits, which hides the
 *   last-bit differences of floating-point sums that depend on evaluation order
 *   while keeping far more digits than any tolerance we report;
 * - −0 is written as 0 (the sign of a zero is an accident of arithmetic);
 * - NaN and ±Infinity, which JSON cannot carry, are written as null, and the
 *   schema says so wherever a number may be undefined;
 * - `undefined` properties are left out, as JSON.stringify does.
 */

export const SIGNIFICANT_DIGITS = 12;

/** Rounds a number the way records store it. */
export function canonicalNumber(x: number): number | null {
  if (!Number.isFinite(x)) return null;
  if (Object.is(x, -0) || x === 0) return 0;
  if (Number.isInteger(x) && Math.abs(x) < 1e15) return x;
  const rounded = Number(x.toPrecision(SIGNIFICANT_DIGITS));
  return rounded === 0 ? 0 : rounded;
}

/** Deep copy with sorted keys and canonical numbers; the value JSON.stringify then writes canonically. */
export function canonicalize(value: unknown, path = '$'): unknown {
  if (value === null) return null;
  switch (typeof value) {
    case 'number':
      return canonicalNumber(value);
    case 'string':
    case 'boolean':
      return value;
    case 'bigint':
      throw new TypeError(`canonical JSON: bigint at ${path} cannot be written; convert it to a number or string first`);
    case 'undefined':
    case 'function':
    case 'symbol':
      return undefined;
    default:
      break;
  }
  if (Array.isArray(value) || ArrayBuffer.isView(value)) {
    const items = Array.from(value as ArrayLike<unknown>);
    return items.map((item, i) => {
      const c = canonicalize(item, `${path}[${i}]`);
      return c === undefined ? null : c;
    });
  }
  if (value instanceof Map || value instanceof Set) {
    throw new TypeError(`canonical JSON: ${value.constructor.name} at ${path}; convert it to a plain object or array first`);
  }
  const source = value as Record<string, unknown>;
  const out: Record<string, unknown> = {};
  for (const key of Object.keys(source).sort(compareCodePoints)) {
    const c = canonicalize(source[key], `${path}.${key}`);
    if (c !== undefined) out[key] = c;
  }
  return out;
}

/** Code-point order, independent of locale (localeCompare is not). */
export function compareCodePoints(a: string, b: string): number {
  return a < b ? -1 : a > b ? 1 : 0;
}

/**
 * Canonical JSON text. `indent` 2 for files people read (results records),
 * 0 for hashing. Files end with a newline so that diffs stay clean.
 */
export function canonicalJson(value: unknown, indent = 2): string {
  const text = JSON.stringify(canonicalize(value), null, indent === 0 ? undefined : indent);
  if (text === undefined) throw new TypeError('canonical JSON: the value has no JSON form (undefined, function or symbol)');
  return indent === 0 ? text : `${text}\n`;
}
