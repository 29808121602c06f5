/** Validation of results records against schemas/report.schema.json (JSON Schema 2020-12, Ajv2020). */
import { Ajv2020, type ErrorObject, type ValidateFunction } from 'ajv/dist/2020.js';
import reportSchema from '../../../schemas/report.schema.json';

let compiled: ValidateFunction | undefined;

export function reportValidator(): ValidateFunction {
  if (!compiled) {
    const ajv = new Ajv2020({ allErrors: true, strict: true, strictRequired: false, allowUnionTypes: true });
    compiled = ajv.compile(reportSchema);
  }
  return compiled;
}

/** Plain messages for every schema violation of a record ("" when valid). */
export function reportProblems(record: unknown): string[] {
  const validate = reportValidator();
  if (validate(record)) return [];
  return (validate.errors ?? []).map((e: ErrorObject) => `${e.instancePath || '(record)'} ${e.message ?? 'is invalid'}${e.params ? ` ${JSON.stringify(e.params)}` : ''}`);
}
