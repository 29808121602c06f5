// The cost model and the refusals built on it. Expected values are worked out in
// the test from the model's formula (work-estimate.ts), not pasted from its output.
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { DEFAULTS, estimateWork, EVALUATION_NS, SMALL_MATRIX, STATIC_UNITS } from '../../../src/catalogue/budget/work-estimate.ts';
import { budgetIssue, DEFAULT_TIME_LIMIT_SECONDS, durationText, limitsFor } from '../../../src/catalogue/budget/limits.ts';
import type { ModelDocument } from '../../../src/catalogue/model-types.generated.ts';
import { chainDocument, sheetDocument } from '../../support/synthetic-models.ts';

const doc = (d: Record<string, unknown>) => d as unknown as ModelDocument;
const stage = (d: Record<string, unknown>, name: string) => estimateWork(doc(d)).stages.find((s) => s.stage === name)!;

describe('estimateWork', () => {
  it('prices a static ribbon as two Hermitian eigen-decompositions per momentum, at the width and at 1.5× the width', () => {
    const width = 40, momenta = 100;
    const ribbon = stage(sheetDocument({ orbitals: 2, numerics: { ribbon: { width, momenta } } }), 'ribbon spectra');
    const unit = (n: number) => EVALUATION_NS * n ** 3 * (1 + SMALL_MATRIX / n) * 1e-9;
    const expected = momenta * STATIC_UNITS * (unit(2 * width) + unit(2 * Math.ceil(1.5 * width)));
    expect(ribbon.seconds).toBeCloseTo(expected, 9);
  });

  it('grows like the cube of the open chain for long chains', () => {
    const at = (length: number) => stage(chainDocument({ orbitals: 2, numerics: { chainLength: length } }), 'open chain').seconds;
    // (1 + 100/n) → 1 for n ≫ 100: doubling a long chain costs close to 2³.
    expect(at(4000) / at(2000)).toBeGreaterThan(7.5);
    expect(at(4000) / at(2000)).toBeLessThan(8);
  });

  it('multiplies the bulk stages by the points of a sweep', () => {
    const sweep = { name: 'period', axes: [{ parameter: 'T', start: 0.5, stop: 1.5, count: 21 }], quantities: ['invariant'] };
    const estimate = estimateWork(doc(chainDocument({ orbitals: 2, sweeps: [sweep] })));
    const scan = estimate.stages.find((s) => s.stage === 'gap scan')!;
    expect(estimate.stages.find((s) => s.stage === 'sweep "period"')!.seconds).toBeCloseTo(21 * scan.seconds, 12);
  });

  it('lets the demo inventory through under the default limits', () => {
    for (const id of ['qwz-sheet', 'checkerboard-five-step', 'two-step-chain']) {
      const model = JSON.parse(readFileSync(`models/${id}.json`, 'utf8'));
      expect(budgetIssue(estimateWork(model), limitsFor(model)), id).toBeUndefined();
    }
  });
});

describe('limits and refusals', () => {
  it('take the time limit from the command line, else the model file, else the default', () => {
    const own = doc(chainDocument({ orbitals: 2, numerics: { timeLimit: 120 } }));
    expect(limitsFor(own)).toMatchObject({ timeLimitSeconds: 120, timeLimitSource: 'model file' });
    expect(limitsFor(own, { timeLimitSeconds: 30 })).toMatchObject({ timeLimitSeconds: 30, timeLimitSource: 'command line' });
    expect(limitsFor(doc(chainDocument({ orbitals: 2 })))).toMatchObject({ timeLimitSeconds: DEFAULT_TIME_LIMIT_SECONDS, timeLimitSource: 'default' });
  });

  it('name the field that inflates the costliest stage, with the estimate, and how to proceed', () => {
    const model = doc(sheetDocument({ orbitals: 2, numerics: { ribbon: { width: 2000, momenta: 4096 } } }));
    const estimate = estimateWork(model);
    const issue = budgetIssue(estimate, limitsFor(model))!;
    expect(issue.pointer).toBe('/numerics/ribbon/width');
    expect(issue.message).toContain('numerics.ribbon.width asks for a ribbon 2000 cells wide');
    expect(issue.message).toContain(`about ${durationText(estimate.seconds)} of computing`);
    expect(issue.hint).toMatch(/^lower numerics\.ribbon\.width .*--time-limit/);
  });

  it('refuse the largest k grid the format allows for its memory, and never advise a larger one', () => {
    const model = doc(sheetDocument({ orbitals: 2, numerics: { kGrid: [1024, 1024] } }));
    const issue = budgetIssue(estimateWork(model), limitsFor(model, { timeLimitSeconds: 3600 }))!;
    expect(issue.pointer).toBe('/numerics/kGrid');
    expect(issue.message).toMatch(/GB of memory/);
    expect(issue.hint).toMatch(/^lower numerics\.kGrid/);
    expect(issue.hint).not.toMatch(/raise numerics\.kGrid/);
  });

  it('let a model through when its limits are raised far enough', () => {
    const model = doc(chainDocument({ orbitals: 2, numerics: { chainLength: 600 } }));
    const estimate = estimateWork(model);
    expect(budgetIssue(estimate, limitsFor(model, { timeLimitSeconds: 1 }))).toBeDefined();
    expect(budgetIssue(estimate, limitsFor(model, { timeLimitSeconds: Math.ceil(estimate.seconds) + 1 }))).toBeUndefined();
  });

  it('write durations in units a reader takes in at a glance', () => {
    expect([durationText(3.44), durationText(125), durationText(7200), durationText(86400 * 4)]).toEqual(['3.4 s', '2.1 min', '2 h', '4 days']);
    expect(DEFAULTS.secondSize).toBe(1.5);
  });
});
