/**
 * Workload: edge counts of a sheet whose edge states decay over a few hundred
 * cells, at default ribbon settings. Qi–Wu–Zhang model at m = 1.996 (T = 0.5):
 * the edge state of a ribbon finite along a₁ crossing ε = 0 at k_y = π decays as
 * |m + cos k_y|^j = 0.996^j (test/numerics/sheet/ribbon.test.ts derives it), a
 * decay length of about 250 cells (the gap at 0, 2|m − 2|T/π ≈ 0.0013 π/T, stays
 * above the gap tolerance 10⁻³). The engine starts at 24 cells and widens the
 * ribbon on its own; expected counts (C = +1): low −1, high +1 at ε = 0, none at π/T.
 */
import { analyseSheet } from '../../src/numerics/sheet/sheet-analysis.ts';
import { qwzDrive } from '../../test/support/drives/qwz.ts';
import { measure } from '../measure.ts';

await measure('slow-decay-sheet', () => {
  const p = analyseSheet(qwzDrive(1.996, 0.5), { grid: [48, 48], run: { chern: false, winding: false }, ribbon: { directions: [0] } });
  const r = p.ribbons[0];
  return {
    widths: r.widths,
    route: r.route,
    counts: r.counts.map((c) => ({ gap: c.gap, edge: c.edge, count: c.count, settled: c.settled, decayLength: c.decayLength, momentaEvaluated: c.momentaEvaluated })),
    edgeSeconds: p.timings.edges / 1000,
  };
});
