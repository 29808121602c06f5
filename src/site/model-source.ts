/**
 * The model file behind a record, read for presentation: the lattice, the
 * terms of every segment and the declared symmetry operators are drawn and
 * typeset from the file itself (records summarise the drive but do not repeat
 * it). The file goes through the catalogue's loader, so only a file that
 * loads is used, and every number is evaluated by the same expression
 * evaluator that the verification used. Nothing here computes physics.
 */
import { checkModelSource } from '../catalogue/load.ts';
import { evaluateQuantity, isIssue } from '../catalogue/parameters.ts';
import type { ModelDocument, Quantity } from '../catalogue/model-types.generated.ts';
import type { ModelRecord } from '../catalogue/records/model-record.ts';
import { modelSourceText } from './data.ts';

export interface ModelSource {
  text: string;
  document: ModelDocument;
  /** Evaluated parameters. */
  scope: ReadonlyMap<string, number>;
  /** Evaluates a number-or-expression of the file; NaN when it cannot (never throws). */
  value(quantity: Quantity | undefined, fallback?: number): number;
}

const cache = new Map<string, ModelSource | null>();

/** The source text of a model file as it was verified, or null when it is gone. */
export function sourceText(record: Pick<ModelRecord, 'id'>): string | null {
  return modelSourceText(record);
}

/** The loaded model file of a record, or null when the file is missing or does not load. */
export function modelSource(record: Pick<ModelRecord, 'file' | 'id'>): ModelSource | null {
  if (cache.has(record.id)) return cache.get(record.id)!;
  const text = sourceText(record);
  let source: ModelSource | null = null;
  if (text !== null) {
    try {
      const { model } = checkModelSource(record.file, text);
      if (model) {
        const scope: ReadonlyMap<string, number> = new Map(Object.entries(model.parameters));
        source = {
          text,
          document: model.document,
          scope,
          value(quantity, fallback = Number.NaN) {
            if (quantity === undefined) return fallback;
            const v = evaluateQuantity(quantity, scope, '');
            return isIssue(v) ? Number.NaN : v;
          },
        };
      }
    } catch {
      source = null;
    }
  }
  cache.set(record.id, source);
  return source;
}
