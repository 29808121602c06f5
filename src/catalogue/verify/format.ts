/** Words and numbers in verdict messages, written one way everywhere. */

/** A quasienergy in units of π/T as people say it: "ε = 0", "ε = π/T", "ε = 0.5 π/T". */
export function formatQuasienergy(label: number): string {
  const x = Math.abs(label) < 1e-12 ? 0 : label;
  if (x === 0) return 'ε = 0';
  if (Math.abs(Math.abs(x) - 1) < 1e-12) return 'ε = π/T';
  return `ε = ${Number(x.toPrecision(4))} π/T`;
}
