// Edge colouring of ribbon and open-chain spectra: states are coloured only by a
// localisation measure carried in the record (computed by the numerics, with its
// threshold); a record without one is drawn uncoloured rather than coloured by the
// weight in the outer quarter, which extended bulk states reach (a standing wave
// sin²(πj/W) puts a quarter of its weight there, and a uniform state one quarter
// per edge region of W/4 cells).
import { describe, expect, it } from 'vitest';
import type { SpectrumRecord } from '../../src/catalogue/records/model-record.ts';
import { colouringSentence, edgeClasses, localisationField } from '../../src/site/edge-localisation.ts';
import { ordinal } from '../../src/catalogue/vocabulary.ts';
import { spectrumPlot } from '../../src/site/plots/spectrum-plot.ts';

const width = 20;
/** Weight of a standing wave sin²(πnj/(W+1)) in the first W/4 cells: an extended state. */
function quarterWeight(n: number): number {
  const w = Array.from({ length: width }, (_, j) => Math.sin((Math.PI * n * (j + 1)) / (width + 1)) ** 2);
  const total = w.reduce((a, b) => a + b, 0);
  return w.slice(0, width / 4).reduce((a, b) => a + b, 0) / total;
}

const spectrum: SpectrumRecord = {
  kind: 'ribbon', finiteDirection: 1, width, momenta: [0, 0.5], stride: 1,
  quasienergies: [[-0.5, 0, 0.5], [-0.4, 0.1, 0.6]],
  lowEdgeWeight: [[quarterWeight(1), 0.95, 0.02], [quarterWeight(2), 0.5, 0.02]],
  highEdgeWeight: [[quarterWeight(1), 0.01, 0.97], [quarterWeight(2), 0.5, 0.01]],
};

describe('edge colouring', () => {
  it('colours nothing when the record has no localisation measure, even where quarter weights look edge-like', () => {
    expect(quarterWeight(1)).toBeGreaterThan(0.05);
    expect(edgeClasses(spectrum)).toBeNull();
    const svg = spectrumPlot({ title: 't', momenta: spectrum.momenta, quasienergies: spectrum.quasienergies, classes: null, gapLabels: [0] });
    expect(svg).not.toMatch(/class="state-(low|high|both)"/);
  });

  it('colours by the measure and threshold the record carries, with a shape per edge', () => {
    const measured = {
      ...spectrum,
      edgeLocalisation: { measure: 'the weight within three decay lengths of an edge, relative to a uniform state', threshold: 4, low: [[1, 9, 0.1], [1.2, 5, 0.1]], high: [[1, 0.1, 8], [1.2, 5, 0.1]] },
    } as SpectrumRecord;
    const classes = edgeClasses(measured)!;
    expect(classes).toEqual([['bulk', 'low', 'high'], ['bulk', 'both', 'bulk']]);
    const svg = spectrumPlot({ title: 't', momenta: measured.momenta, quasienergies: measured.quasienergies, classes, gapLabels: [0] });
    for (const kind of ['low', 'high', 'both']) expect(svg).toContain(`class="state-${kind}"`);
  });

  it('states the rule in the caption with the numbers the record carries', () => {
    const record = {
      ...spectrum,
      edgeLocalisation: { measure: 'excess weight', cells: 3, uniformWeight: 0.15, threshold: 0.5, low: [[0, 0, 0], [0, 0, 0]], high: [[0, 0, 0], [0, 0, 0]] },
    } as SpectrumRecord;
    const sentence = colouringSentence(localisationField(record));
    expect(sentence).toContain('reaches 0.5');
    expect(sentence).toContain('outer 3 cells');
    expect(sentence).toContain('u = 0.15');
    expect(colouringSentence(null)).toMatch(/drawn alike/);
  });

  it('writes ordinals as English does (2nd, 3rd, 11th, 21st, 112th)', () => {
    expect([1, 2, 3, 4, 11, 12, 13, 21, 22, 23, 112].map(ordinal)).toEqual(['1st', '2nd', '3rd', '4th', '11th', '12th', '13th', '21st', '22nd', '23rd', '112th']);
  });
});
