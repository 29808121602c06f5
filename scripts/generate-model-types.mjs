#!/usr/bin/env node
// Derives the TypeScript types of model files from the JSON Schema in schemas/
// (the single source of truth) and writes src/catalogue/model-types.generated.ts.
//
//   node scripts/generate-model-types.mjs          write the file
//   node scripts/generate-model-types.mjs --check  exit 1 when the committed file is stale
//
// The schema is split over several files that reference each other by relative
// $id. json-schema-to-typescript resolves references through the file system,
// which does not know our $ids, so the files are first bundled into one schema
// whose $defs hold every definition under a "<file>_<name>" key.
import { readFileSync, writeFileSync, readdirSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import path from 'node:path';
import { compile } from 'json-schema-to-typescript';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const schemaDir = path.join(root, 'schemas');
const outFile = path.join(root, 'src/catalogue/model-types.generated.ts');

/** Reads every schema file, keyed by its $id ("model.schema.json", "model/lattice.json", ...). */
export function readSchemas() {
  const files = ['model.schema.json', ...readdirSync(path.join(schemaDir, 'model')).filter((f) => f.endsWith('.json')).sort().map((f) => `model/${f}`)];
  const byId = new Map();
  for (const file of files) {
    const schema = JSON.parse(readFileSync(path.join(schemaDir, file), 'utf8'));
    byId.set(schema.$id, schema);
  }
  return byId;
}

const keyOf = (id) => path.posix.basename(id, '.json').replace(/\.schema$/, '').replace(/[^A-Za-z0-9]/g, '');

/** Resolves a $ref written in schema `baseId` to [target file $id, definition name or null for the whole file]. */
function resolveRef(ref, baseId) {
  const [file, fragment = ''] = ref.split('#');
  const targetId = file === '' ? baseId : path.posix.normalize(path.posix.join(path.posix.dirname(baseId), file));
  const match = /^\/\$defs\/([A-Za-z0-9_]+)$/.exec(fragment);
  if (fragment !== '' && !match) throw new Error(`${baseId}: unsupported $ref "${ref}" (only whole files and #/$defs/<name>)`);
  return [targetId, match ? match[1] : null];
}

/** True for an anyOf whose branches only list required properties: a validation constraint with no effect on types. */
const isRequiredOnlyAnyOf = (value) =>
  Array.isArray(value) && value.every((b) => Object.keys(b).length === 1 && Array.isArray(b.required));

function rewrite(node, baseId, byId) {
  if (Array.isArray(node)) return node.map((n) => rewrite(n, baseId, byId));
  if (node === null || typeof node !== 'object') return node;
  if (typeof node.$ref === 'string') {
    const [targetId, name] = resolveRef(node.$ref, baseId);
    const target = byId.get(targetId);
    if (!target) throw new Error(`${baseId}: $ref "${node.$ref}" points to unknown schema ${targetId}`);
    const ref = `#/$defs/${keyOf(targetId)}_${name ?? 'root'}`;
    // A description beside a $ref to a titled definition would make the generator
    // emit a numbered copy of the named type (Quantity1, Quantity2, ...): keep the name.
    const definition = name === null ? target : target.$defs?.[name];
    if (definition?.title) return { $ref: ref };
    return { ...rewrite({ ...node, $ref: undefined }, baseId, byId), $ref: ref };
  }
  const out = {};
  for (const [key, value] of Object.entries(node)) {
    if (value === undefined || key === '$id' || key === '$schema' || key === '$defs' || key === 'discriminator') continue;
    if (key === 'anyOf' && isRequiredOnlyAnyOf(value)) continue;
    out[key] = rewrite(value, baseId, byId);
  }
  return out;
}

export function bundle(byId) {
  const defs = {};
  for (const [id, schema] of byId) {
    if (id === 'model.schema.json') continue;
    for (const [name, def] of Object.entries(schema.$defs ?? {})) defs[`${keyOf(id)}_${name}`] = rewrite(def, id, byId);
    if (schema.type !== undefined) defs[`${keyOf(id)}_root`] = rewrite(schema, id, byId);
  }
  const top = byId.get('model.schema.json');
  return { ...rewrite(top, top.$id, byId), $defs: defs };
}

export async function generate() {
  const schema = bundle(readSchemas());
  const body = await compile(schema, 'ModelDocument', {
    bannerComment:
      '/* Generated from schemas/model.schema.json by scripts/generate-model-types.mjs. Do not edit by hand: run `npm run gen:types`. */',
    additionalProperties: false,
    unreachableDefinitions: false,
    strictIndexSignatures: true,
    ignoreMinAndMaxItems: true,
    format: true,
    style: { singleQuote: true, printWidth: 120 },
  });
  return body;
}

if (process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  const text = await generate();
  if (process.argv.includes('--check')) {
    let current = '';
    try {
      current = readFileSync(outFile, 'utf8');
    } catch {}
    if (current !== text) {
      console.error(`${path.relative(root, outFile)} is out of date with schemas/: run npm run gen:types`);
      process.exit(1);
    }
    console.log(`${path.relative(root, outFile)} is up to date`);
  } else {
    writeFileSync(outFile, text);
    console.log(`wrote ${path.relative(root, outFile)}`);
  }
}
