/** Words and numbers in verdict messages, written one way everywhere. */
import { formatNumber, formatRawValue } from '../../numerics/number-format.ts';

export { formatNumber, formatRawValue };

/** A quasienergy in units of π/T as people say it: "ε = 0", "ε = π/T", "ε = 0.5 π/T". */
export function formatQuasienergy(label: number): string {
  const x = Math.abs(label) < 1e-12 ? 0 : label;
  if (x === 0) return 'ε = 0';
  if (Math.abs(Math.abs(x) - 1) < 1e-12) return 'ε = π/T';
  return `ε = ${Number(x.toPrecision(4))} π/T`;
}

/** A grid as people write it: [24, 24] → "24²", [24, 24, 96] → "24²×96", [128] → "128". */
export function formatGrid(grid: readonly number[]): string {
  if (grid.length >= 2 && grid[0] === grid[1]) return [`${grid[0]}²`, ...grid.slice(2).map(String)].join('×');
  return grid.map(String).join('×');
}

/** One refinement level as one item: "24² → 0.9999931" (a label, when given, replaces the grid). */
export function formatRefinementStep(step: { grid: readonly number[]; value: number | null; label?: string }): string {
  return `${step.label ?? formatGrid(step.grid)} → ${formatRawValue(step.value)}`;
}

/** A refinement history, coarsest first, one level per item: "24² → 0.9999931, 48² → 0.9999999". */
export function formatRefinement(steps: readonly { grid: readonly number[]; value: number | null; label?: string }[]): string {
  return steps.map(formatRefinementStep).join(', ');
}
