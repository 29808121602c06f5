/**
 * The production engines: compileModel from the catalogue, analyseSheet for
 * sheets and the chain engine for chains, with the model file's numerics
 * hints mapped onto engine options here and nowhere else.
 */
import { compileModel } from '../compile.ts';
import { analyseSheet, type SheetOptions } from '../../numerics/sheet/sheet-analysis.ts';
import type { AnalysisRequest, EngineSet } from './engines.ts';
import { propagatorHints } from './engines.ts';
import { analyseChainView } from './chain-adapter.ts';

/** Default ribbon direction when no claim names one (the schema's default: finite along a₂). */
const DEFAULT_FINITE_ALONG = 1;

export function sheetOptions(request: AnalysisRequest): SheetOptions {
  const hints = request.hints;
  const options: SheetOptions = {
    labels: request.labels,
    run: { chern: !request.skip.has('chern'), winding: !request.skip.has('winding'), edges: !request.skip.has('edges') },
    ribbon: {
      directions: request.ribbonDirections.length > 0 ? request.ribbonDirections : [hints?.ribbon?.finiteAlong ?? DEFAULT_FINITE_ALONG],
      ...(hints?.ribbon?.width !== undefined ? { width: hints.ribbon.width } : {}),
      ...(hints?.ribbon?.maxWidth !== undefined ? { maxWidth: hints.ribbon.maxWidth } : {}),
      widenFor: request.edgeGaps,
      ...(hints?.ribbon?.momenta !== undefined ? { momenta: hints.ribbon.momenta } : {}),
    },
  };
  // The Chern refinement starts at this grid too (sheet-analysis.ts).
  if (hints?.kGrid) options.grid = hints.kGrid.length >= 2 ? hints.kGrid.slice(0, 2) : [hints.kGrid[0], hints.kGrid[0]];
  if (hints?.tolerances?.gap !== undefined) options.gapTolerance = hints.tolerances.gap;
  if (hints?.gapEvaluations !== undefined) options.gapEvaluations = hints.gapEvaluations;
  const integer = hints?.tolerances?.integer;
  if (integer !== undefined) options.chern = { tolerance: integer };
  if (integer !== undefined || hints?.windingEvaluations !== undefined) {
    options.winding = { ...(integer !== undefined ? { tolerance: integer } : {}), ...(hints?.windingEvaluations !== undefined ? { evaluations: hints.windingEvaluations } : {}) };
  }
  const propagator = propagatorHints(hints);
  if (propagator !== undefined) options.propagator = propagator;
  if (request.cut !== undefined) options.cut = request.cut;
  return options;
}

export const realEngines: EngineSet = {
  compile: (model, overrides) => compileModel(model, overrides),
  sheet: (compiled, request) => analyseSheet(compiled.drive, { ...sheetOptions(request), symmetries: compiled.symmetries }),
  chain: (compiled, request) => analyseChainView(compiled, request),
};
