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

