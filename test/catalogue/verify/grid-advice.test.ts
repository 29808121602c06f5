// Hints about numerics.kGrid that a model can follow: none that asks for a grid
// past the format's maximum, and the right direction when refinement was impossible.
import { describe, expect, it } from 'vitest';
import numericsSchema from '../../../schemas/model/numerics.json';
import { followableGridAdvice, KGRID_MAXIMUM } from '../../../src/catalogue/verify/grid-advice.ts';
import { emptyCertificate } from '../../../src/catalogue/verify/certificate.ts';
import type { Verdict } from '../../../src/catalogue/verify/verdict.ts';

function unsettled(hint: string, note: string): Verdict {
  const certificate = emptyCertificate('chern');
  certificate.notes.push(note);
  return { claim: 'band-0/chern', kind: 'chern', pointer: '/claims/bands/chern/0', gap: 1, outcome: 'unsettled', claimed: 1, computed: null, estimate: 1, message: 'm', hint, certificate };
}

describe('followableGridAdvice', () => {
  it('reads the maximum from the schema', () => {
    expect(KGRID_MAXIMUM).toBe(numericsSchema.properties.kGrid.items.maximum);
  });

  it('never advises raising kGrid past its maximum', () => {
    const v = unsettled('the model may sit at or near a phase transition; move the parameter point away from it or raise numerics.kGrid', 'the gap at 0 is small');
    followableGridAdvice([v], { kGrid: [KGRID_MAXIMUM, KGRID_MAXIMUM] });
    expect(v.hint).toMatch(/^numerics\.kGrid is already at its maximum \(1024\)/);
    expect(v.hint).not.toMatch(/raise numerics\.kGrid/);
  });

  it('advises a smaller kGrid when the Chern number could be computed on one grid only', () => {
    const v = unsettled('raise numerics.kGrid or numerics.timeSlices so that refinement can settle the integer', 'computed on the single grid 256×256: the starting grid is at or above the refinement limit 128×128, so there is no second grid to compare with');
    followableGridAdvice([v], { kGrid: [256, 256] });
    expect(v.hint).toMatch(/set numerics\.kGrid to 64 or less/);
  });

  it('leaves advice alone below the maximum', () => {
    const hint = 'raise numerics.kGrid or numerics.timeSlices so that refinement can settle the integer';
    const v = unsettled(hint, 'refinement did not converge');
    followableGridAdvice([v], { kGrid: [32, 32] });
    expect(v.hint).toBe(hint);
  });
});
