/**
 * Workload: the cost model of src/catalogue/budget/work-estimate.ts against
 * measured stage times, on synthetic models (test/support/synthetic-models.ts)
 * of growing size: stacks of coupled Qi–Wu–Zhang sheets (constant and
 * harmonically driven segments, ribbons of several widths) and of dimer chains
 * (open chains of several lengths, a sweep). For every stage it reports the
 * estimate, the measured time and their ratio; the constants of the cost model
 * are tuned so that the ratios stay within a factor of about 2.5 either way.
 * Models run in this process, one after another, with the real engines.
 */
import { checkModelSource } from '../../src/catalogue/load.ts';
import { verifyModel } from '../../src/catalogue/verify/verify-model.ts';
import { realEngines } from '../../src/catalogue/verify/real-engines.ts';
import { estimateWork } from '../../src/catalogue/budget/work-estimate.ts';
import { chainDocument, sheetDocument } from '../../test/support/synthetic-models.ts';
import { measure } from '../measure.ts';

const ribbon = (width: number) => ({ ribbon: { width, momenta: 60 } });
const cases: Record<string, unknown>[] = [
  sheetDocument({ id: 'sheet-2-1', orbitals: 2, segments: 1, numerics: ribbon(24) }),
  sheetDocument({ id: 'sheet-2-3', orbitals: 2, segments: 3, numerics: ribbon(24) }),
  sheetDocument({ id: 'sheet-4-1', orbitals: 4, segments: 1, numerics: ribbon(16) }),
  sheetDocument({ id: 'sheet-4-3', orbitals: 4, segments: 3, numerics: ribbon(16) }),
  sheetDocument({ id: 'sheet-8-2', orbitals: 8, segments: 2, numerics: ribbon(8) }),
  sheetDocument({ id: 'sheet-2-1-wide', orbitals: 2, segments: 1, numerics: ribbon(64) }),
  sheetDocument({ id: 'sheet-2-2-wide', orbitals: 2, segments: 2, numerics: ribbon(48) }),
  sheetDocument({ id: 'driven-2', orbitals: 2, segments: 1, driven: true, numerics: ribbon(12) }),
  chainDocument({ id: 'chain-2-40', orbitals: 2, numerics: { chainLength: 40 } }),
  chainDocument({ id: 'chain-2-160', orbitals: 2, numerics: { chainLength: 160 } }),
  chainDocument({ id: 'chain-8-80', orbitals: 8, numerics: { chainLength: 80 } }),
  chainDocument({ id: 'chain-16-40', orbitals: 16, numerics: { chainLength: 40 } }),
  chainDocument({
    id: 'chain-sweep',
    orbitals: 2,
    numerics: { chainLength: 40 },
    sweeps: [{ name: 'period', axes: [{ parameter: 'T', start: 0.8, stop: 1.2, count: 21 }], quantities: ['invariant', 'minimalGap'] }],
  }),
];

/** Measured milliseconds per estimated stage, from the engine's stage timings. */
function measuredStages(dimension: number, stages: Record<string, number>): Record<string, number> {
  const engineParts = Object.entries(stages).filter(([k]) => k.startsWith('engine.')).reduce((s, [, v]) => s + v, 0);
  // The second system size (1.5× ribbon width or chain length) runs inside "engine" but outside its stages.
  const second = Math.max(0, (stages.engine ?? 0) - engineParts);
  const g = (k: string) => stages[`engine.${k}`] ?? 0;
  if (dimension === 1) {
    return { 'gap scan': g('gaps') + g('symmetries') + g('chiral') + g('majorana') + g('determinant-winding'), 'open chain': g('open-chain') + second };
  }
  return { 'band grid': g('bands') + g('gaps'), 'Chern numbers': g('chern'), 'gap winding numbers': g('winding'), 'ribbon spectra': g('edges') + second };
}

await measure('work-estimate', () => {
  const rows: Record<string, unknown>[] = [];
  for (const doc of cases) {
    const { model, diagnostics } = checkModelSource(`${doc.id as string}.json`, JSON.stringify(doc));
    if (!model) throw new Error(`${doc.id as string}: ${diagnostics[0]?.message}`);
    const estimate = estimateWork(model.document);
    const outcome = verifyModel(model, realEngines, { version: 'bench', numericsHash: '0'.repeat(64) });
    const measured = measuredStages(model.document.lattice.dimension, outcome.timings.stages);
    for (const stage of estimate.stages) {
      const ms = stage.stage.startsWith('sweep') ? outcome.timings.stages.sweeps ?? 0 : measured[stage.stage] ?? 0;
      const row = { model: model.id, stage: stage.stage, estimatedMs: Math.round(stage.seconds * 1000), measuredMs: Math.round(ms), ratio: ms > 0 ? Number((stage.seconds * 1000 / ms).toFixed(2)) : null };
      rows.push(row);
      process.stderr.write(`${JSON.stringify(row)}\n`);
    }
    const total = { model: model.id, stage: 'total', estimatedMs: Math.round(estimate.seconds * 1000), measuredMs: Math.round(outcome.timings.totalMs), ratio: Number((estimate.seconds * 1000 / outcome.timings.totalMs).toFixed(2)) };
    rows.push(total);
    process.stderr.write(`${JSON.stringify(total)}\n`);
  }
  const ratios = rows.filter((r) => r.stage === 'total').map((r) => r.ratio as number);
  return { rows, totalRatioRange: [Math.min(...ratios), Math.max(...ratios)] };
});
