// Phase diagrams: one map per sweep coloured by the tuple of invariants, compact
// (equal cells merged into runs), each region labelled, unsettled points hatched,
// the model's own point marked. The test map is a 41 × 41 scan of a square of
// angles split into four phases by the two diagonals, with the diagonals
// themselves unsettled (as gap closings are) — the shape of the two-step chain's
// phase diagram, whose 41 × 41 map used to be 6,734 SVG cells and 1 MB of page.
import { describe, expect, it } from 'vitest';
import type { SweepRecord } from '../../../src/catalogue/records/model-record.ts';
import { sweepData } from '../../../src/site/sweeps.ts';
import { gapHeatMapPlot, labelCells, phaseMapPlot, scaleMaximum } from '../../../src/site/plots/phase-map.ts';
import { sweepStepsPlot } from '../../../src/site/plots/sweep-steps.ts';
import { parameterTicks, piTicks } from '../../../src/site/plots/svg.ts';

const n = 41;
const angles = Array.from({ length: n }, (_, i) => (Math.PI * i) / (n - 1));

function diagonalSweep(): SweepRecord {
  const points: SweepRecord['points'] = [];
  for (const t2 of angles) {
    for (const t1 of angles) {
      const onBoundary = Math.abs(t1 - t2) < 1e-9 || Math.abs(t1 + t2 - Math.PI) < 1e-9;
      const nu0 = t1 + t2 < Math.PI ? 0 : 1;
      const nuPi = t2 > t1 ? -1 : 0;
      points.push({
        parameters: { theta1: t1, theta2: t2 },
        values: onBoundary ? { 'gap-0/invariant': null, 'gap-1/invariant': null, 'gap-0/minimal-gap': 0 } : { 'gap-0/invariant': nu0, 'gap-1/invariant': nuPi, 'gap-0/minimal-gap': Math.abs(Math.sin(t1 - t2)) },
        error: null,
      });
    }
  }
  return { name: 'angles', title: 'Invariants over the two angles', axes: [{ parameter: 'theta1', values: angles }, { parameter: 'theta2', values: angles }], quantities: ['invariant', 'minimalGap'], points };
}

const record = { model: null, parameters: [{ name: 'theta1', value: 0.35 * Math.PI, expression: null, description: null }, { name: 'theta2', value: 0.85 * Math.PI, expression: null, description: null }] };

describe('phase map of a 41 × 41 sweep', () => {
  const data = sweepData(diagonalSweep(), record);
  const map = phaseMapPlot(data, 'test');

  it('names phases by the tuple (ν_0, ν_π) and lists each with unsettled last', () => {
    expect(map.tuple).toBe('(ν_0, ν_π)');
    expect(map.legend.map((e) => e.key)).toEqual(['(0, 0)', '(0, −1)', '(1, 0)', '(1, −1)', 'unsettled']);
    expect(new Set(map.legend.map((e) => e.hatch)).size).toBe(map.legend.length);
  });

  it('is compact: runs instead of cells, far below the 300 KB a page may weigh', () => {
    expect(map.svg.length).toBeLessThan(40_000);
    expect((map.svg.match(/<rect/g) ?? []).length).toBeLessThan(10);
  });

  it('labels every region once with its values, and marks the model at (0.35π, 0.85π)', () => {
    for (const key of ['(0, 0)', '(0, −1)', '(1, 0)', '(1, −1)']) expect(map.svg.split(`>${key}</text>`).length - 1).toBe(1);
    expect(map.svg).toContain('this model');
    expect(data.modelPoint).toEqual([0.35 * Math.PI, 0.85 * Math.PI]);
  });

  it('uses π ticks for angles and symbols for axis titles', () => {
    expect(map.svg).toContain('>π/2<');
    expect(map.svg).toContain('θ₁');
    expect(map.svg).not.toContain('theta1');
  });

  it('draws the smallest gap as a separate heat map with a scale bar in units of π/T', () => {
    const heat = gapHeatMapPlot(data, 0, 'heat');
    expect(heat).toContain('(units of π/T)');
    expect(heat.length).toBeLessThan(60_000);
  });
});

describe('label placement', () => {
  it('puts a label in the middle of each region, deepest inside it', () => {
    const keys = Array.from({ length: 10 * 6 }, (_, c) => ((c % 10) < 5 ? 'a' : 'b'));
    const cells = labelCells(keys, 10, 6, 3);
    expect(cells.map((c) => c.key)).toEqual(['a', 'b']);
    const [a, b] = cells.map((c) => [c.cell % 10, Math.floor(c.cell / 10)]);
    expect(a[0]).toBeGreaterThanOrEqual(1);
    expect(a[0]).toBeLessThanOrEqual(3);
    expect(b[0]).toBeGreaterThanOrEqual(6);
    expect(b[0]).toBeLessThanOrEqual(8);
    expect(a[1]).toBeGreaterThanOrEqual(2);
    expect(a[1]).toBeLessThanOrEqual(3);
  });

  it('leaves regions smaller than the minimum unlabelled', () => {
    const keys = ['a', 'a', 'a', 'b', 'a', 'a', 'a', 'a', 'a'];
    expect(labelCells(keys, 3, 3, 2).map((c) => c.key)).toEqual(['a']);
  });
});

describe('one-parameter sweeps', () => {
  it('draws each invariant as a step plot and the gap beneath, marking unsettled points', () => {
    const values = Array.from({ length: 21 }, (_, i) => i / 10);
    const sweep: SweepRecord = {
      name: 'mass', title: 'Chern numbers against the mass', axes: [{ parameter: 'm', values }], quantities: ['chern', 'minimalGap'],
      points: values.map((m) => ({ parameters: { m }, values: Math.abs(m - 1) < 1e-9 ? { 'band-0/chern': null, 'band-1/chern': null, 'gap-0/minimal-gap': 0 } : { 'band-0/chern': m < 1 ? 1 : 0, 'band-1/chern': m < 1 ? -1 : 0, 'gap-0/minimal-gap': Math.abs(m - 1) } , error: null })),
    };
    const svg = sweepStepsPlot(sweepData(sweep, { model: null, parameters: [{ name: 'm', value: 0.5, expression: null, description: 'mass' }] }), 'steps');
    expect(svg).toContain('C<tspan class="sub" dy="0.3em">1</tspan>');
    expect(svg).toContain('smallest gap (π/T)');
    expect(svg).toContain('url(#steps-u)');
    expect(svg).toContain('this model');
  });
});

describe('axis ticks', () => {
  it('writes multiples of π as fractions and other ranges as round decimals', () => {
    expect(piTicks(0, Math.PI).map((t) => t.label)).toEqual(['0', 'π/4', 'π/2', '3π/4', 'π']);
    expect(piTicks(Math.PI / 2, (5 * Math.PI) / 2).map((t) => t.label)).toEqual(['π/2', 'π', '3π/2', '2π', '5π/2']);
    expect(parameterTicks([-3, -1.5, 0, 1.5, 3]).map((t) => t.label)).toEqual(['−3', '−2', '−1', '0', '1', '2', '3']);
    expect(scaleMaximum(1.9)).toBe(2);
    expect(scaleMaximum(0.37)).toBe(0.4);
  });
});

describe('page budget', () => {
  it('draws a very fine scan on a coarser grid so that a page stays light, and says so', async () => {
    const { sweepFigures, SWEEP_FIGURE_BUDGET } = await import('../../../src/site/figures.ts');
    // A 201 × 201 scan of four phases with noisy gaps: too much to draw point by point.
    const m = 201;
    const axis = Array.from({ length: m }, (_, i) => (Math.PI * i) / (m - 1));
    const points: SweepRecord['points'] = [];
    for (const t2 of axis) for (const t1 of axis) points.push({ parameters: { theta1: t1, theta2: t2 }, values: { 'gap-0/invariant': t1 + t2 < Math.PI ? 0 : 1, 'gap-1/invariant': t2 > t1 ? -1 : 0, 'gap-0/minimal-gap': Math.abs(Math.sin(3 * t1) * Math.cos(5 * t2)) }, error: null });
    const sweep: SweepRecord = { name: 'fine', title: 'Fine scan', axes: [{ parameter: 'theta1', values: axis }, { parameter: 'theta2', values: axis }], quantities: ['invariant', 'minimalGap'], points };
    const [figure] = sweepFigures({ ...record, sweeps: [sweep] } as never);
    const bytes = figure.main.length + figure.heatMaps.reduce((a, h) => a + h.svg.length, 0);
    expect(bytes).toBeLessThanOrEqual(SWEEP_FIGURE_BUDGET);
    expect(figure.caption).toMatch(/Drawn at every \d+th point/);
  });
});
