/**
 * The one way numbers are written in reports, certificates and messages
 * (tolerances, residuals, gaps, bounds), shared by the numerics and the catalogue.
 */

/** Drops trailing zeros of a fixed or exponential decimal ("1.50e-6" → "1.5e-6", "0.0450" → "0.045"). */
function trimZeros(text: string): string {
  const [mantissa, exponent] = text.split('e');
  const trimmed = mantissa.includes('.') ? mantissa.replace(/0+$/, '').replace(/\.$/, '') : mantissa;
  return exponent === undefined ? trimmed : `${trimmed}e${exponent.replace(/^\+/, '')}`;
}

/**
 * The one format for tolerances, residuals, gaps and bounds: three significant
 * digits, plain between 10⁻² and 10⁴, else in exponent form ("1e-6", "3.2e-4",
 * "0.045", "12.5"); never a signed zero.
 */
export function formatNumber(x: number): string {
  if (Number.isNaN(x)) return 'NaN';
  if (!Number.isFinite(x)) return x > 0 ? '∞' : '−∞';
  if (x === 0) return '0';
  const a = Math.abs(x);
  return trimZeros(a >= 1e-2 && a < 1e4 ? x.toPrecision(3) : x.toExponential(2));
}

/**
 * A computed value that should be an integer, with enough digits to see its
 * distance from the integer: seven decimals ("0.9999931", "-1.9999998"); a
 * value within 5·10⁻⁸ of zero is written in exponent form ("-4.3e-8"), never
 * as "-0.0000000".
 */
export function formatRawValue(x: number | null): string {
  if (x === null || Number.isNaN(x)) return '—';
  if (!Number.isFinite(x)) return formatNumber(x);
  const fixed = x.toFixed(7);
  if (/^-?0\.0+$/.test(fixed)) return x === 0 ? '0' : formatNumber(x);
  return fixed;
}
