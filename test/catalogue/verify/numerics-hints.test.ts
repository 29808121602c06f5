/**
 * The numerics hints of model files reach every engine and every invariant:
 * tolerances.integer holds Chern numbers, gap winding numbers and chain
 * windings alike, tolerances.gap holds chain gaps too, timeSlices starts the
 * time integration, and a tolerance loosened beyond its default is written
 * into every certificate of the model.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { checkModelSource } from '../../../src/catalogue/load.ts';
import { compileModel } from '../../../src/catalogue/compile.ts';
import { sheetOptions } from '../../../src/catalogue/verify/real-engines.ts';
import { analyseChainView, chainOptions } from '../../../src/catalogue/verify/chain-adapter.ts';
import { analysePoint } from '../../../src/catalogue/verify/analyse-point.ts';
import { realEngines } from '../../../src/catalogue/verify/real-engines.ts';
import { normalizeClaims } from '../../../src/catalogue/verify/claims.ts';
import { DEFAULT_POLICY } from '../../../src/catalogue/verify/policy.ts';
import type { AnalysisRequest } from '../../../src/catalogue/verify/engines.ts';
import type { NumericsHints } from '../../../src/catalogue/model-types.generated.ts';
import type { LoadedModel } from '../../../src/catalogue/load.ts';
import { quantityEvaluator } from '../../../src/catalogue/verify/verify-model.ts';

function pointOf(model: LoadedModel) {
  const evaluate = quantityEvaluator(model.parameters);
  const doc = model.document;
  const symmetricTimes = (doc.claims?.symmetries?.chiral?.symmetricTimes ?? []).map((q, i) => evaluate(q, `/claims/symmetries/chiral/symmetricTimes/${i}`));
  return analysePoint(model, normalizeClaims(doc, evaluate), realEngines, DEFAULT_POLICY, { symmetricTimes });
}

const request = (hints: NumericsHints): AnalysisRequest => ({ labels: [], hints, skip: new Set(), symmetricTimes: [], ribbonDirections: [], edgeGaps: [] });

function chainModel(numerics: NumericsHints) {
  const file = 'test/fixtures/verification/two-step-chain-correct.json';
  const doc = JSON.parse(readFileSync(file, 'utf8'));
  doc.numerics = numerics;
  const { model, diagnostics } = checkModelSource(file, JSON.stringify(doc, null, 2));
  if (!model) throw new Error(diagnostics.map((d) => d.message).join('; '));
  return model;
}

describe('numerics hints reach the engines', () => {
  it('maps integer, gap, propagator and timeSlices onto sheet options (propagator: π/T → radians)', () => {
    const o = sheetOptions(request({ kGrid: [20, 20], timeSlices: 48, tolerances: { integer: 0.02, gap: 0.004, propagator: 1e-5 } }));
    expect(o.chern?.tolerance).toBe(0.02);
    expect(o.winding?.tolerance).toBe(0.02);
    expect(o.gapTolerance).toBe(0.004);
    expect(o.propagator?.startSlices).toBe(48);
    expect(o.propagator?.tolerance).toBeCloseTo(Math.PI * 1e-5, 15);
    expect(o.grid).toEqual([20, 20]);
  });

  it('gives chains timeSlices and a propagator tolerance no looser than the symmetry residuals allow', () => {
    const o = chainOptions(request({ timeSlices: 32 }));
    expect(o.propagator?.startSlices).toBe(32);
    // Floquet symmetry residuals are held to the policy's 1e-8: the integration must stay well below.
    expect(o.propagator?.tolerance).toBeLessThanOrEqual(DEFAULT_POLICY.symmetryTolerance / 10);
  });

  it('holds chain windings (frames and ν₀, ν_π) to tolerances.integer and chain gaps to tolerances.gap', () => {
    const model = chainModel({ chainLength: 40, tolerances: { integer: 0.05, gap: 0.004 } });
    const view = analyseChainView(compileModel(model), request(model.document.numerics!));
    expect(view.invariants.length).toBe(2);
    for (const inv of view.invariants) expect(inv.estimate.tolerance).toBe(0.05);
    for (const f of view.frames) expect(f.estimate.tolerance).toBe(0.05);
    expect(view.gapTolerance).toBe(0.004);
  });
});

describe('loosened tolerances', () => {
  it('are noted in every certificate, with the default they replace', () => {
    const model = chainModel({ chainLength: 40, tolerances: { integer: 0.05, gap: 0.0005 } });
    const point = pointOf(model);
    expect(point.verdicts.length).toBeGreaterThan(0);
    for (const v of point.verdicts) {
      expect(v.certificate.notes.some((n) => n.includes('loosens numerics.tolerances.integer to 0.05'))).toBe(true);
      expect(v.certificate.notes.some((n) => n.includes('loosens numerics.tolerances.gap to 5×10⁻⁴'))).toBe(true);
    }
    for (const e of point.entries) expect(e.certificate.notes.some((n) => n.includes('numerics.tolerances.integer'))).toBe(true);
  });

  it('are not noted when the hints tighten', () => {
    const model = chainModel({ chainLength: 40, tolerances: { integer: 1e-7, gap: 0.002 } });
    const point = pointOf(model);
    for (const v of point.verdicts) expect(v.certificate.notes.filter((n) => n.includes('loosens'))).toEqual([]);
  });

  it('cannot reach 0.5 for the integer tolerance: the schema caps it at 0.1', () => {
    const file = 'test/fixtures/verification/two-step-chain-correct.json';
    const doc = JSON.parse(readFileSync(file, 'utf8'));
    doc.numerics = { tolerances: { integer: 0.3 } };
    const { model, diagnostics } = checkModelSource(file, JSON.stringify(doc, null, 2));
    expect(model).toBeUndefined();
    expect(diagnostics.map((d) => d.pointer)).toContain('/numerics/tolerances/integer');
  });
});
