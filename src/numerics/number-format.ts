/**
 * The one way numbers are written in reports, certificates and messages
 * (tolerances, residuals, gaps, bounds), shared by the numerics and the catalogue.
 */

/** Drops trailing zeros of a decimal mantissa ("1.50" → "1.5", "0.0450" → "0.045"). */
function trimZeros(text: string): string {
  return text.includes('.') ? text.replace(/0+$/, '').replace(/\.$/, '') : text;
}

/** The typographic minus sign for negative numbers. */
const minus = (text: string) => text.replace(/^-/, '−');

const SUPERSCRIPT: Record<string, string> = { '-': '⁻', '0': '⁰', '1': '¹', '2': '²', '3': '³', '4': '⁴', '5': '⁵', '6': '⁶', '7': '⁷', '8': '⁸', '9': '⁹' };

/**
 * The one format for tolerances, residuals, gaps and bounds, in messages, the
 * command line and the site alike: three significant digits, plain between
 * 10⁻³ and 10⁵, else as a power of ten ("1×10⁻⁶", "3.2×10⁻⁴", "0.045", "12.5");
 * the typographic minus; never a signed zero.
 */
export function formatNumber(x: number): string {
  if (Number.isNaN(x)) return 'NaN';
  if (!Number.isFinite(x)) return x > 0 ? '∞' : '−∞';
  if (x === 0) return '0';
  const a = Math.abs(x);
  if (a >= 1e-3 && a < 1e5) return minus(trimZeros(x.toPrecision(3)));
  const [mantissa, exponent] = x.toExponential(2).split('e');
  return `${minus(trimZeros(mantissa))}×10${[...exponent.replace(/^\+/, '')].map((c) => SUPERSCRIPT[c] ?? c).join('')}`;
}

/**
 * A computed value that should be an integer, with enough digits to see its
 * distance from the integer: seven decimals ("0.9999931", "−1.9999998"); a
 * value within 5·10⁻⁸ of zero is written as a power of ten ("−4.3×10⁻⁸"), never
 * as "−0.0000000".
 */
export function formatRawValue(x: number | null): string {
  if (x === null || Number.isNaN(x)) return '—';
  if (!Number.isFinite(x)) return formatNumber(x);
  const fixed = x.toFixed(7);
  if (/^-?0\.0+$/.test(fixed)) return x === 0 ? '0' : formatNumber(x);
  return minus(fixed);
}
