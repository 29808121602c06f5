/**
 * The engines verification calls, behind one interface so that the pipeline
 * (records, cache, workers, sweeps) can be exercised with stand-in engines and
 * so the mapping from model-file hints to engine options lives in one place.
 */
import type { CompiledModel } from '../compile.ts';
import type { LoadedModel } from '../load.ts';
import type { NumericsHints } from '../model-types.generated.ts';
import type { SheetPortrait } from '../../numerics/portrait.ts';
import type { ChainView } from './chain-view.ts';
import type { PropagatorOptions } from '../../numerics/evolution/propagator.ts';

/** What a caller needs from the engines for one parameter point. */
export interface AnalysisRequest {
  /** Gap labels (units π/T) that claims or sweeps name; the engines also find other gaps. */
  labels: number[];
  hints: NumericsHints | undefined;
  /** Skip costly stages nobody asked for (sweeps): 'chern', 'winding', 'edges'. */
  skip: ReadonlySet<'chern' | 'winding' | 'edges'>;
  /** Start times of the chiral symmetric frames (chains), evaluated. */
  symmetricTimes: number[];
  /** Gap the claimed band Chern numbers are counted from (units π/T), if claimed. */
  cut?: number;
  /** Finite directions of the ribbons claims refer to (2D); empty: the hint's or the default one. */
  ribbonDirections: number[];
  /** Gaps (units π/T) whose edge counts claims name: only these may widen a ribbon (2D). */
  edgeGaps: number[];
}

export interface EngineSet {
  compile(model: LoadedModel, overrides?: Record<string, number>): CompiledModel;
  sheet(compiled: CompiledModel, request: AnalysisRequest): SheetPortrait;
  chain(compiled: CompiledModel, request: AnalysisRequest): ChainView;
}

/**
 * Time-integration options from the hints: numerics.timeSlices is the starting
 * slice count per period; numerics.tolerances.propagator (units π/T) replaces
 * the tolerance the engines derive from the gap and integer tolerances
 * (propagator.ts, verdictPropagatorTolerance). The propagator works in
 * eigenphases (ε·T), hence the factor π.
 */
export function propagatorHints(hints: NumericsHints | undefined): PropagatorOptions | undefined {
  const options: PropagatorOptions = {};
  if (hints?.timeSlices !== undefined) options.startSlices = hints.timeSlices;
  if (hints?.tolerances?.propagator !== undefined) options.tolerance = Math.PI * hints.tolerances.propagator;
  return Object.keys(options).length > 0 ? options : undefined;
}
