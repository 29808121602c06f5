/**
 * The JSON Schemas published with the site (schemas/), and the results-record
 * schema as a readable page: every definition with its fields, types and
 * descriptions, read from schemas/report.schema.json itself so the page can
 * never disagree with it.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';

/** Every schema file, by its path under schemas/ ("report.schema.json", "model/drive.json"). */
export function schemaFiles(): { path: string; text: string }[] {
  const root = resolve('schemas');
  const out: { path: string; text: string }[] = [];
  const walk = (dir: string, prefix: string) => {
    for (const entry of readdirSync(dir, { withFileTypes: true }).sort((a, b) => a.name.localeCompare(b.name))) {
      if (entry.isDirectory()) walk(join(dir, entry.name), `${prefix}${entry.name}/`);
      else if (entry.name.endsWith('.json')) out.push({ path: `${prefix}${entry.name}`, text: readFileSync(join(dir, entry.name), 'utf8') });
    }
  };
  walk(root, '');
  return out;
}

type Schema = Record<string, unknown>;

export interface SchemaField {
  path: string;
  type: string;
  /** Definition this field refers to, for a link. */
  ref: string | null;
  required: boolean;
  description: string;
}

export interface SchemaDefinition {
  name: string;
  title: string;
  description: string;
  fields: SchemaField[];
}

function refName(ref: unknown): string | null {
  return typeof ref === 'string' && ref.startsWith('#/$defs/') ? ref.slice('#/$defs/'.length) : null;
}

function typeText(s: Schema): { text: string; ref: string | null } {
  const ref = refName(s.$ref);
  if (ref) return { text: ref, ref };
  if ('const' in s) return { text: `= ${JSON.stringify(s.const)}`, ref: null };
  if (Array.isArray(s.enum)) return { text: s.enum.map((v) => JSON.stringify(v)).join(' | '), ref: null };
  if (Array.isArray(s.oneOf)) {
    const parts = (s.oneOf as Schema[]).map(typeText);
    return { text: parts.map((p) => p.text).join(' or '), ref: parts.find((p) => p.ref)?.ref ?? null };
  }
  if (s.type === 'array' && s.items && typeof s.items === 'object') {
    const inner = typeText(s.items as Schema);
    return { text: `list of ${inner.text}`, ref: inner.ref };
  }
  if (Array.isArray(s.type)) return { text: s.type.join(' or '), ref: null };
  if (typeof s.type === 'string') return { text: s.type, ref: null };
  return { text: 'any', ref: null };
}

function fields(s: Schema, prefix: string, depth: number): SchemaField[] {
  const properties = (s.properties ?? {}) as Record<string, Schema>;
  const required = new Set((s.required ?? []) as string[]);
  const out: SchemaField[] = [];
  for (const [name, p] of Object.entries(properties)) {
    const { text, ref } = typeText(p);
    const path = `${prefix}${name}`;
    out.push({ path, type: text, ref, required: required.has(name), description: String(p.description ?? '') });
    if (depth >= 3) continue;
    const nested = p.type === 'object' ? p : p.type === 'array' && (p.items as Schema | undefined)?.type === 'object' ? (p.items as Schema) : Array.isArray(p.oneOf) ? (p.oneOf as Schema[]).find((o) => o.type === 'object') : undefined;
    if (nested?.properties) out.push(...fields(nested, `${path}${p.type === 'array' ? '[]' : ''}.`, depth + 1));
  }
  return out;
}

export function reportSchemaDefinitions(): { title: string; description: string; definitions: SchemaDefinition[] } {
  const schema = JSON.parse(readFileSync(resolve('schemas', 'report.schema.json'), 'utf8')) as Schema;
  const defs = (schema.$defs ?? {}) as Record<string, Schema>;
  const order = ['modelRecord', 'catalogueSummary'];
  const names = [...order.filter((n) => n in defs), ...Object.keys(defs).filter((n) => !order.includes(n))];
  return {
    title: String(schema.title ?? 'Results records'),
    description: String(schema.description ?? ''),
    definitions: names.map((name) => {
      const d = defs[name];
      const { text } = typeText(d);
      const own = fields(d, '', 0);
      return { name, title: String(d.title ?? name), description: String(d.description ?? ''), fields: own.length > 0 ? own : [{ path: '(value)', type: text, ref: null, required: true, description: String(d.description ?? '') }] };
    }),
  };
}
