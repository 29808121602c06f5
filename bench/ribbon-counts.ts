/**
 * Shared body of the ribbon-counts workloads (bench/workloads/ribbon-counts-*.ts;
 * kept outside workloads/ because run.mjs runs every file there). Gaps come
 * from the bulk analysis, then the counts at a fixed width (no widening) by the
 * route the engine takes for that width.
 */
import { analyseSheet, bulkDecayLength } from '../src/numerics/sheet/sheet-analysis.ts';
import { ribbonEdgeCounts } from '../src/numerics/sheet/ribbon-edge-counts.ts';
import { FloquetSampler, sampleQuasienergyGrid } from '../src/numerics/quasienergy-bands.ts';
import { threeStepHoneycombDrive } from '../test/support/drives/honeycomb.ts';
import { measure } from './measure.ts';

export async function ribbonCountsWorkload(name: string, width: number): Promise<void> {
  const drive = threeStepHoneycombDrive({ hopping: 0.45 * Math.PI, stepDuration: 1, mass: 0.3 });
  const bulk = analyseSheet(drive, { run: { chern: false, winding: false, edges: false } });
  const data = sampleQuasienergyGrid(new FloquetSampler(drive), bulk.grid);
  const gaps = bulk.gaps.filter((g) => g.open).map((arc) => ({ arc, bulkDecayLength: bulkDecayLength(data, arc, 1) }));
  await measure(name, () => {
    const r = ribbonEdgeCounts(drive, gaps, { finiteDirection: 1, width, maxWidth: width });
    return {
      width: r.width,
      states: 2 * r.width,
      route: r.route,
      baseMomenta: r.momenta,
      counts: r.counts.map((c) => ({ gap: c.gap, edge: c.edge, count: c.count, settled: c.settled, momentaEvaluated: c.momentaEvaluated, decayLength: c.decayLength })),
    };
  });
}
