/**
 * Advice about numerics.kGrid that the model can follow. The generic hints
 * (verdict.ts) say "raise numerics.kGrid" when a gap looks closed or a
 * refinement did not settle; for a model whose kGrid is already at the schema's
 * maximum that advice cannot be followed, and for a Chern number computed on a
 * single grid because kGrid starts past the refinement limit, a larger kGrid
 * makes things worse. Such hints are replaced by ones that can be followed.
 */
import numericsSchema from '../../../schemas/model/numerics.json';
import type { NumericsHints } from '../model-types.generated.ts';
import type { Verdict } from './verdict.ts';

/** The largest kGrid entry the format allows. */
export const KGRID_MAXIMUM: number = numericsSchema.properties.kGrid.items.maximum;

export function followableGridAdvice(verdicts: Verdict[], hints: NumericsHints | undefined): void {
  const grid = Math.max(0, ...(hints?.kGrid ?? []));
  for (const v of verdicts) {
    const notes = v.certificate.notes.join(' ');
    const refinementLimit = /there is no second grid to compare with/.test(notes);
    if (refinementLimit) {
      v.hint = 'numerics.kGrid starts at or above the refinement limit, so the Chern number was computed on one grid only: set numerics.kGrid to 64 or less so that refinement can compare two grids; a larger kGrid cannot help';
    } else if (grid >= KGRID_MAXIMUM && v.hint !== null && /numerics\.kGrid/.test(v.hint)) {
      v.hint = `numerics.kGrid is already at its maximum (${KGRID_MAXIMUM}): a finer grid is not available, so the evidence cannot be strengthened this way; if a gap is nearly closed, move the parameter point away from the transition`;
    }
  }
}
