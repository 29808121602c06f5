/**
 * Plot data for the site: spectra are decimated to at most MAX_PLOT_MOMENTA
 * momenta and rounded (quasienergies to 1e-5 π/T, weights to 1e-3), far below
 * what a plot can show, so records stay small.
 */
export const MAX_PLOT_MOMENTA = 64;

export function roundTo(x: number, step: number): number {
  if (!Number.isFinite(x)) return x;
  const r = Math.round(x / step) * step;
  return Number(r.toFixed(Math.max(0, Math.ceil(-Math.log10(step)))));
}

export function strideFor(count: number, max = MAX_PLOT_MOMENTA): number {
  return Math.max(1, Math.ceil(count / max));
}

/** Keeps every stride-th row, always including the last one so periodic plots close. */
export function decimateRows<T>(rows: T[], stride: number): T[] {
  if (stride <= 1) return rows.slice();
  const kept: T[] = [];
  for (let i = 0; i < rows.length; i += stride) kept.push(rows[i]);
  if (rows.length > 0 && (rows.length - 1) % stride !== 0) kept.push(rows[rows.length - 1]);
  return kept;
}

export function roundRows(rows: number[][], step: number): number[][] {
  return rows.map((row) => row.map((x) => roundTo(x, step)));
}
