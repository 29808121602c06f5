/**
 * Which states of a ribbon or open-chain spectrum are drawn as edge states.
 *
 * Only a localisation measure that extended bulk states cannot pass may
 * colour a state: the engine computes it (numerics), the record carries one
 * value per state and edge together with the threshold it applies, and this
 * module only reads it. Records without such a measure (engine versions
 * whose only edge data is the weight in the outer quarter of the ribbon,
 * which standing bulk waves reach) get no edge colouring at all: every state
 * is drawn alike and the caption says why.
 */
import type { SpectrumRecord } from '../catalogue/records/model-record.ts';
import type { EdgeClass } from './plots/spectrum-plot.ts';

export interface EdgeLocalisationField {
  /** How the measure is defined, in one sentence (shown in the legend). */
  measure: string;
  /** A state counts as localised at an edge when its value there reaches this. */
  threshold: number;
  /** Cells of each edge region the weight p is taken over, and the weight u an evenly spread state has there (when recorded). */
  cells?: number;
  uniformWeight?: number;
  /** Per state, same shape as quasienergies: the measure at the low and at the high edge. */
  low: number[][];
  high: number[][];
}

/** The localisation measure a record carries, or null. Accepts the field under its documented name. */
export function localisationField(spectrum: SpectrumRecord): EdgeLocalisationField | null {
  const candidate = (spectrum as SpectrumRecord & { edgeLocalisation?: unknown }).edgeLocalisation;
  if (!candidate || typeof candidate !== 'object') return null;
  const f = candidate as Partial<EdgeLocalisationField>;
  if (typeof f.threshold !== 'number' || !Array.isArray(f.low) || !Array.isArray(f.high)) return null;
  return {
    measure: typeof f.measure === 'string' ? f.measure : 'edge localisation',
    threshold: f.threshold,
    ...(typeof f.cells === 'number' ? { cells: f.cells } : {}),
    ...(typeof f.uniformWeight === 'number' ? { uniformWeight: f.uniformWeight } : {}),
    low: f.low,
    high: f.high,
  };
}

/** Edge class of every state, or null when the record has no honest measure to colour by. */
export function edgeClasses(spectrum: SpectrumRecord): EdgeClass[][] | null {
  const field = localisationField(spectrum);
  if (!field) return null;
  return spectrum.quasienergies.map((row, i) =>
    row.map((_, n) => {
      const low = (field.low[i]?.[n] ?? 0) >= field.threshold;
      const high = (field.high[i]?.[n] ?? 0) >= field.threshold;
      return low && high ? 'both' : low ? 'low' : high ? 'high' : 'bulk';
    }),
  );
}

/** The colouring rule in one or two sentences, for the caption under a spectrum. */
export function colouringSentence(field: EdgeLocalisationField | null): string {
  if (!field) {
    return 'Every state is drawn alike: this record carries no edge-localisation measure that extended bulk states cannot pass, so states are not coloured by edge. The edge counts in the claims table rest on the engine’s own crossing analysis, shown in their certificates.';
  }
  if (field.cells === undefined || field.uniformWeight === undefined) {
    return `A state is drawn as an edge state when its edge-localisation measure (${field.measure}) reaches ${field.threshold}.`;
  }
  const u = Number(field.uniformWeight.toPrecision(3));
  return (
    `A state is drawn as an edge state when its excess weight at an edge, m = (p − u)/(1 − u), reaches ${field.threshold}: ` +
    `p is its weight in the outer ${field.cells} cell${field.cells === 1 ? '' : 's'} of that edge and u = ${u} what an evenly spread state has there, so extended bulk states stay far below the threshold.`
  );
}

