/**
 * Validation of model documents against schemas/model.schema.json (JSON Schema
 * draft 2020-12, Ajv2020), and the one function that turns Ajv's errors into
 * plain, actionable messages.
 */
import { Ajv2020, type ErrorObject, type ValidateFunction } from 'ajv/dist/2020.js';
import addFormatsModule from 'ajv-formats';
import rootSchema from '../../schemas/model.schema.json';
import claimsSchema from '../../schemas/model/claims.json';
import commonSchema from '../../schemas/model/common.json';
import driveSchema from '../../schemas/model/drive.json';
import latticeSchema from '../../schemas/model/lattice.json';
import numericsSchema from '../../schemas/model/numerics.json';
import parametersSchema from '../../schemas/model/parameters.json';
import provenanceSchema from '../../schemas/model/provenance.json';
import sweepsSchema from '../../schemas/model/sweeps.json';
import { joinPointer, suggestName, type Issue } from './diagnostics.ts';

type SchemaNode = Record<string, unknown>;
// ajv-formats ships CommonJS; under some loaders the plugin sits on .default.
const addFormats = ((addFormatsModule as unknown as { default?: unknown }).default ?? addFormatsModule) as (ajv: Ajv2020) => void;

export const MODEL_SCHEMAS: readonly SchemaNode[] = [
  commonSchema, provenanceSchema, latticeSchema, parametersSchema, driveSchema, claimsSchema, numericsSchema, sweepsSchema,
];

let compiled: ValidateFunction | undefined;

/** The compiled validator (built once). */
export function modelValidator(): ValidateFunction {
  if (!compiled) {
    const ajv = new Ajv2020({ allErrors: true, verbose: true, strict: true, strictRequired: false, allowUnionTypes: true, discriminator: true });
    addFormats(ajv);
    for (const schema of MODEL_SCHEMAS) ajv.addSchema(schema);
    compiled = ajv.compile(rootSchema);
  }
  return compiled;
}

/** Validates a parsed document; returns plain-language issues (empty when valid). */
export function validateDocument(document: unknown): Issue[] {
  const validate = modelValidator();
  if (validate(document)) return [];
  return describeSchemaErrors(validate.errors ?? []);
}

const typeNames: Record<string, string> = {
  number: 'a number', integer: 'an integer', string: 'a string', boolean: 'true or false', object: 'an object', array: 'a list', null: 'null',
};

function typeOf(value: unknown): string {
  if (value === null) return 'null';
  if (Array.isArray(value)) return 'a list';
  if (typeof value === 'number') return Number.isInteger(value) ? `the number ${value}` : `the number ${value}`;
  if (typeof value === 'string') return `the string ${JSON.stringify(value.length > 40 ? value.slice(0, 40) + '…' : value)}`;
  if (typeof value === 'boolean') return String(value);
  return 'an object';
}

function expectedTypes(type: unknown): string {
  const list = (Array.isArray(type) ? type : [type]).map((t) => {
    if (t === 'string') return 'an expression string';
    return typeNames[String(t)] ?? String(t);
  });
  if (list.length === 1 && Array.isArray(type) === false && type === 'string') return 'a string';
  return list.length <= 1 ? list.join('') : `${list.slice(0, -1).join(', ')} or ${list[list.length - 1]}`;
}

function listValues(values: readonly unknown[]): string {
  return values.map((v) => JSON.stringify(v)).join(', ');
}

/** Short description of one alternative of an anyOf, for "expected … or …" messages. */
function describeBranch(branch: SchemaNode): string {
  const resolved = branch;
  if (typeof resolved.$ref === 'string' && /quantity$/.test(resolved.$ref)) return 'a number or an expression string';
  if (typeof resolved.$ref === 'string') return resolved.$ref.split('/').pop() ?? 'a value';
  if (resolved.type === 'object' && Array.isArray(resolved.required)) return `an object with ${resolved.required.map((r) => `"${r}"`).join(' and ')}`;
  return expectedTypes(resolved.type);
}

/** Words after which a full stop does not end a sentence: abbreviations and initials ("R. Okafor"). */
const ABBREVIATION_BEFORE_STOP = /(?:^|[\s("])(?:e\.g|i\.e|cf|vs|etc|approx|[A-Za-z])$/;

/**
 * First sentence of a schema description, for hints. A full stop ends it only
 * when followed by a capital letter (or the end), outside quotes and
 * parentheses, and not after an abbreviation or an initial, so that examples
 * such as e.g. "R. Okafor (Lantern Lab)" are never cut in the middle.
 */
export function firstSentence(text: unknown): string | undefined {
  if (typeof text !== 'string') return undefined;
  let quoted = false;
  let depth = 0;
  for (let i = 0; i < text.length; i++) {
    const c = text[i];
    if (c === '"') quoted = !quoted;
    else if (c === '(') depth++;
    else if (c === ')') depth = Math.max(0, depth - 1);
    else if (c === '.' && !quoted && depth === 0) {
      const rest = text.slice(i + 1);
      if ((rest === '' || /^\s+[A-Z]/.test(rest)) && !ABBREVIATION_BEFORE_STOP.test(text.slice(0, i))) return text.slice(0, i);
    }
  }
  return text;
}

/**
 * Turns Ajv errors into plain messages. Alternatives (anyOf) are collapsed: when
 * only one alternative has the right JSON type its own errors are reported,
 * otherwise one "expected … or …" message replaces the branch errors.
 */
export function describeSchemaErrors(errors: readonly ErrorObject[]): Issue[] {
  const issues: Issue[] = [];
  const suppressed = new Set<ErrorObject>();

  errors.forEach((error, index) => {
    if (error.keyword !== 'anyOf' && error.keyword !== 'oneOf') return;
    const prefix = error.schemaPath + '/';
    const at = error.instancePath;
    // Ajv reports the failed alternatives just before the anyOf error itself, on the
    // same value or inside it; alternatives behind a $ref carry the referenced
    // schema's path, so they are found by position, not by schema path.
    const branchErrors: ErrorObject[] = [];
    for (let j = index - 1; j >= 0; j--) {
      const e = errors[j];
      if (suppressed.has(e) || !(e.instancePath === at || e.instancePath.startsWith(at + '/'))) break;
      branchErrors.push(e);
    }
    const branches = error.schema as SchemaNode[];
    const refBranches = branches.map((b, i) => (typeof b.$ref === 'string' ? i : -1)).filter((i) => i >= 0);
    const branchOf = (e: ErrorObject): number => {
      const m = e.schemaPath.startsWith(prefix) ? /^(\d+)\//.exec(e.schemaPath.slice(prefix.length)) : null;
      return m ? Number(m[1]) : refBranches.length === 1 ? refBranches[0] : -1;
    };
    const quantityBranch = branches.findIndex((b) => typeof b.$ref === 'string' && /quantity$/.test(b.$ref));
    let keep: number | undefined;
    if (typeof error.data === 'number' || typeof error.data === 'string') {
      if (quantityBranch >= 0) keep = quantityBranch;
    } else {
      // Alternatives that accept this JSON type: those without a type error on the value itself.
      const applicable = branches
        .map((_, i) => i)
        .filter((i) => i !== quantityBranch && !branchErrors.some((e) => branchOf(e) === i && e.keyword === 'type' && e.instancePath === at));
      // Among several object shapes, prefer the one whose property names the value uses.
      const data = error.data;
      const sharing = applicable.filter((i) => {
        const properties = Object.keys((branches[i].properties as Record<string, unknown> | undefined) ?? {});
        return data !== null && typeof data === 'object' && Object.keys(data).some((k) => properties.includes(k));
      });
      if (applicable.length === 1) keep = applicable[0];
      else if (sharing.length === 1) keep = sharing[0];
    }
    for (const e of branchErrors) if (keep === undefined || branchOf(e) !== keep) suppressed.add(e);
    suppressed.add(error);
    if (keep !== undefined) return;
    if (branches.every((b) => Object.keys(b).length === 1 && Array.isArray(b.required))) {
      const names = branches.map((b) => `"${(b.required as string[])[0]}"`);
      issues.push({ pointer: at, message: `needs at least one of ${names.join(', ')}` });
    } else {
      issues.push({ pointer: at, message: `expected ${branches.map(describeBranch).join(', or ')}; found ${typeOf(error.data)}` });
    }
  });

  for (const error of errors) {
    if (suppressed.has(error)) continue;
    const issue = describeSchemaError(error);
    if (issue) issues.push(issue);
  }
  // One message per pointer and text: several schema paths can report the same fault.
  const seen = new Set<string>();
  return issues.filter((i) => {
    const key = `${i.pointer}\u0000${i.message}`;
    if (seen.has(key)) return false;
    seen.add(key);
    return true;
  });
}

/** One Ajv error → one plain message (undefined for errors that only summarise others). */
export function describeSchemaError(error: ErrorObject): Issue | undefined {
  const at = error.instancePath;
  const params = error.params as Record<string, unknown>;
  const parent = (error.parentSchema ?? {}) as SchemaNode;
  switch (error.keyword) {
    case 'required': {
      const name = String(params.missingProperty);
      const description = firstSentence(((parent.properties as Record<string, SchemaNode> | undefined)?.[name])?.description);
      const issue: Issue = { pointer: at, message: `missing property "${name}"` };
      if (description) issue.hint = `${name}: ${description}`;
      return issue;
    }
    case 'additionalProperties': {
      const name = String(params.additionalProperty);
      const allowed = Object.keys((parent.properties as Record<string, unknown> | undefined) ?? {});
      return { pointer: joinPointer(at, name), target: 'key', message: `unknown property "${name}"`, hint: suggestName(name, allowed, 'allowed properties') };
    }
    case 'type':
      return { pointer: at, message: `expected ${expectedTypes(params.type)}; found ${typeOf(error.data)}` };
    case 'enum':
      return { pointer: at, message: `expected one of ${listValues(params.allowedValues as unknown[])}; found ${JSON.stringify(error.data)}` };
    case 'const':
      return { pointer: at, message: `must be ${JSON.stringify(params.allowedValue)}; found ${JSON.stringify(error.data)}` };
    case 'pattern': {
      if (error.propertyName !== undefined) {
        return { pointer: joinPointer(at, error.propertyName), target: 'key', message: `name "${error.propertyName}" is not allowed here`, hint: 'names start with a letter, followed by letters, digits or underscores' };
      }
      const what = firstSentence(parent.description);
      return { pointer: at, message: `${JSON.stringify(error.data)} is not in the expected form`, hint: what ?? `expected to match ${String(params.pattern)}` };
    }
    case 'propertyNames':
      return undefined; // the nested pattern error (with propertyName) says it better
    case 'format':
      return { pointer: at, message: `${JSON.stringify(error.data)} is not a valid ${String(params.format)}`, hint: params.format === 'date' ? 'write dates as YYYY-MM-DD, e.g. 2024-03-15' : undefined };
    case 'minItems':
      return { pointer: at, message: `needs at least ${String(params.limit)} entr${params.limit === 1 ? 'y' : 'ies'}; found ${(error.data as unknown[]).length}` };
    case 'maxItems':
      return { pointer: at, message: `has ${(error.data as unknown[]).length} entries; at most ${String(params.limit)} are supported`, hint: firstSentence(parent.description) };
    case 'minLength':
      return { pointer: at, message: params.limit === 1 ? 'must not be empty' : `needs at least ${String(params.limit)} characters` };
    case 'maxLength':
      return { pointer: at, message: `is longer than ${String(params.limit)} characters` };
    case 'minimum':
    case 'maximum':
    case 'exclusiveMinimum':
    case 'exclusiveMaximum': {
      const op = { minimum: '≥', maximum: '≤', exclusiveMinimum: '>', exclusiveMaximum: '<' }[error.keyword];
      return { pointer: at, message: `must be ${op} ${String(params.limit)}; found ${JSON.stringify(error.data)}` };
    }
    case 'maxProperties':
      return { pointer: at, message: `has more than ${String(params.limit)} entries` };
    case 'uniqueItems':
      return { pointer: at, message: `entries ${String(params.i)} and ${String(params.j)} are identical`, hint: 'remove the duplicate' };
    case 'discriminator': {
      const options = ((parent.oneOf as SchemaNode[] | undefined) ?? []).map((b) => (b.properties as Record<string, SchemaNode>)?.[String(params.tag)]?.const);
      if (params.error === 'mapping') {
        return { pointer: joinPointer(at, String(params.tag)), message: `expected one of ${listValues(options)}; found ${JSON.stringify((error.data as Record<string, unknown>)[String(params.tag)])}` };
      }
      return { pointer: at, message: `property "${String(params.tag)}" must be a string, one of ${listValues(options)}` };
    }
    case 'if':
    case 'anyOf':
    case 'oneOf':
      return undefined;
    default:
      return { pointer: at, message: error.message ?? `fails the ${error.keyword} rule` };
  }
}
