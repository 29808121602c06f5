/**
 * Loads model files: reads, decodes, parses with positions, validates against
 * the schema, evaluates parameters and runs the cross-field checks. Every
 * problem becomes a located Diagnostic; bad input never throws and never stops
 * the other models from loading.
 */
import { readFile, stat } from 'node:fs/promises';
import path from 'node:path';
import type { ModelDocument } from './model-types.generated.ts';
import { hasErrors, sortDiagnostics, type Diagnostic, type Issue } from './diagnostics.ts';
import { duplicateProperties, offsetOfIssue, parseWithPositions, positionOf, type PositionedDocument } from './json-positions.ts';
import { validateDocument } from './schema-validation.ts';
import { evaluateParameters } from './parameters.ts';
import { checkSemantics } from './semantic-checks.ts';
import { isModelId, listInventory, MAX_FILE_BYTES, sourceHash } from './inventory.ts';
import { checkDescription } from './description/check.ts';

export { MAX_FILE_BYTES };

export interface LoadedModel {
  id: string;
  file: string;
  source: string;
  document: ModelDocument;
  /** Evaluated parameters, in evaluation order. */
  parameters: Record<string, number>;
  /** Non-fatal findings (e.g. unused parameters). */
  warnings: Diagnostic[];
  /** Fingerprint of the file's bytes (inventory.ts, sourceHash): records carry it so stale ones can be told apart. */
  sourceHash: string;
}

export interface ModelFailure {
  file: string;
  id?: string;
  diagnostics: Diagnostic[];
  /** Fingerprint of the bytes, null when the file was not read. */
  sourceHash: string | null;
}

export interface LoadReport {
  models: LoadedModel[];
  failures: ModelFailure[];
}

function fileDiagnostic(file: string, message: string, hint?: string, line = 1, column = 1): Diagnostic {
  const d: Diagnostic = { file, line, column, pointer: '', message, severity: 'error' };
  if (hint !== undefined) d.hint = hint;
  return d;
}

/** Byte index of the first byte that is not valid UTF-8, or -1. */
export function firstInvalidUtf8(bytes: Uint8Array): number {
  let i = 0;
  while (i < bytes.length) {
    const b = bytes[i];
    const need = b < 0x80 ? 0 : b >= 0xc2 && b < 0xe0 ? 1 : b >= 0xe0 && b < 0xf0 ? 2 : b >= 0xf0 && b < 0xf5 ? 3 : -1;
    if (need < 0 || i + need >= bytes.length) return i;
    for (let k = 1; k <= need; k++) if ((bytes[i + k] & 0xc0) !== 0x80) return i;
    // Overlong three-byte forms, UTF-16 surrogates and code points above U+10FFFF.
    if (need === 2 && ((b === 0xe0 && bytes[i + 1] < 0xa0) || (b === 0xed && bytes[i + 1] >= 0xa0))) return i;
    if (need === 3 && ((b === 0xf0 && bytes[i + 1] < 0x90) || (b === 0xf4 && bytes[i + 1] >= 0x90))) return i;
    i += need + 1;
  }
  return -1;
}

/** Reads one file into text, or explains why it cannot be a model file. */
async function readModelFile(file: string, shown: string): Promise<{ text: string; hash: string } | { diagnostic: Diagnostic; hash: string | null }> {
  let info;
  try {
    info = await stat(file);
  } catch {
    return { diagnostic: fileDiagnostic(shown, 'no such file'), hash: null };
  }
  if (info.isDirectory()) return { diagnostic: fileDiagnostic(shown, 'is a folder, not a model file', 'model files are single JSON files; rename the folder or move it out of the inventory'), hash: null };
  if (!info.isFile()) return { diagnostic: fileDiagnostic(shown, 'is not a regular file'), hash: null };
  if (info.size > MAX_FILE_BYTES) {
    return {
      diagnostic: fileDiagnostic(shown, `file is ${(info.size / 1048576).toFixed(1)} MB; model files may be at most 5 MB`, 'a model file describes one unit cell and its drive; large data belongs elsewhere'),
      hash: null,
    };
  }
  let bytes: Buffer;
  try {
    bytes = await readFile(file);
  } catch (error) {
    return { diagnostic: fileDiagnostic(shown, `cannot read file: ${(error as NodeJS.ErrnoException).code ?? (error as Error).message}`), hash: null };
  }
  const hash = sourceHash(bytes);
  const bad = firstInvalidUtf8(bytes);
  if (bad >= 0) {
    const before = new TextDecoder('utf-8').decode(bytes.subarray(0, bad));
    const lines = before.split('\n');
    return {
      diagnostic: fileDiagnostic(shown, `file is not valid UTF-8 (byte 0x${bytes[bad].toString(16).padStart(2, '0')} at offset ${bad})`, 'save the file as UTF-8', lines.length, lines[lines.length - 1].length + 1),
      hash,
    };
  }
  return { text: new TextDecoder('utf-8').decode(bytes), hash };
}

function locate(file: string, doc: PositionedDocument, issue: Issue): Diagnostic {
  const { line, column } = positionOf(doc, offsetOfIssue(doc, issue));
  const d: Diagnostic = { file, line, column, pointer: issue.pointer, message: issue.message, severity: issue.severity ?? 'error' };
  if (issue.hint !== undefined) d.hint = issue.hint;
  return d;
}

/** Deepest nesting of objects and lists a model file may have (the deepest real one is below 10); the parsers recurse. */
export const MAX_JSON_DEPTH = 100;

/** Offset of the bracket that nests deeper than MAX_JSON_DEPTH, or -1; strings are skipped. */
function tooDeep(text: string): number {
  let depth = 0;
  let inString = false;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (inString) {
      if (c === 92) i++; // backslash: skip the escaped character
      else if (c === 34) inString = false;
    } else if (c === 34) inString = true;
    else if (c === 91 || c === 123) {
      if (++depth > MAX_JSON_DEPTH) return i;
    } else if (c === 93 || c === 125) depth--;
  }
  return -1;
}

/** A located diagnostic for a problem found after loading (the source is parsed again for positions). */
export function diagnosticFor(file: string, source: string, issue: Issue): Diagnostic {
  return locate(file, parseWithPositions(source).document, issue);
}

/**
 * Checks one model file's text. `file` is the path shown in diagnostics; the
 * expected id is its base name without .json. Pure apart from that name.
 */
export function checkModelSource(file: string, source: string): { model?: LoadedModel; diagnostics: Diagnostic[] } {
  // A byte-order mark is not JSON; blank it so offsets stay aligned.
  const text = source.charCodeAt(0) === 0xfeff ? ' ' + source.slice(1) : source;
  if (text.trim() === '') return { diagnostics: [fileDiagnostic(file, 'file is empty', 'run "strobe new <id>" for a minimal model to start from')] };
  const deep = tooDeep(text);
  if (deep >= 0) {
    const lines = text.slice(0, deep).split('\n');
    return { diagnostics: [fileDiagnostic(file, `objects and lists nest more than ${MAX_JSON_DEPTH} levels deep here`, 'a model file is a shallow document; this looks generated by mistake', lines.length, lines[lines.length - 1].length + 1)] };
  }
  const { document: positioned, problems } = parseWithPositions(text);
  if (problems.length > 0) {
    return {
      // One message per place: a single fault often trips several parser rules.
      diagnostics: problems.filter((p, i) => i === 0 || p.offset !== problems[i - 1].offset).slice(0, 5).map((p) => {
        const { line, column } = positionOf(positioned, p.offset);
        const d: Diagnostic = { file, line, column, pointer: '', message: p.message, severity: 'error' };
        if (p.hint !== undefined) d.hint = p.hint;
        return d;
      }),
    };
  }
  const value: unknown = JSON.parse(text);
  if (value === null || typeof value !== 'object' || Array.isArray(value)) {
    const found = Array.isArray(value) ? 'a list' : value === null ? 'null' : typeof value;
    return { diagnostics: [locate(file, positioned, { pointer: '', message: `a model file holds one JSON object; found ${found}` })] };
  }
  const issues: Issue[] = [...duplicateProperties(positioned), ...validateDocument(value)];
  const description = (value as { description?: unknown }).description;
  if (typeof description === 'string') issues.push(...checkDescription(description, '/description', positioned));
  const base = path.posix.basename(file);
  const expectedId = base.endsWith('.json') ? base.slice(0, -'.json'.length) : base;
  let parameters: Record<string, number> = {};
  if (issues.length === 0) {
    const doc = value as ModelDocument;
    const table = evaluateParameters(doc.parameters);
    issues.push(...table.issues);
    const declared = new Set(Object.keys(doc.parameters ?? {}));
    const semantic = checkSemantics(doc, table.values, declared);
    issues.push(...semantic.issues);
    for (const name of declared) {
      if (!semantic.usedParameters.has(name) && !table.issues.some((i) => i.pointer === `/parameters/${name}` && i.target === 'key')) {
        issues.push({ pointer: `/parameters/${name}`, target: 'key', severity: 'warning', message: `parameter "${name}" is never used`, hint: 'remove it or refer to it' });
      }
    }
    if (doc.id !== expectedId) {
      const rename = `rename the file to ${doc.id}.json`;
      issues.push({ pointer: '/id', message: `id "${doc.id}" does not match the file name "${base}"`, hint: isModelId(expectedId) ? `${rename} or set "id": "${expectedId}"` : rename });
    }
    parameters = Object.fromEntries(table.values);
  }
  const diagnostics = sortDiagnostics(issues.map((i) => locate(file, positioned, i)));
  if (hasErrors(diagnostics)) return { diagnostics };
  const document = value as ModelDocument;
  return { model: { id: document.id, file, source, document, parameters, warnings: diagnostics, sourceHash: sourceHash(source) }, diagnostics };
}

/** The id a file that did not load claims for itself, when it names a valid one. */
function claimedId(text: string): string | undefined {
  const match = /"id"\s*:\s*"([a-z0-9-]{1,64})"/.exec(text);
  return match && isModelId(match[1]) ? match[1] : undefined;
}

/**
 * Loads every model file under the given files or folders (default: models/).
 * A file named twice (directly, or also through its folder) is loaded once.
 * Never throws for bad input.
 */
export async function loadModels(paths: string[] = ['models']): Promise<LoadReport> {
  const report: LoadReport = { models: [], failures: [] };
  const { files, missing } = listInventory(paths.length > 0 ? paths : ['models']);
  for (const m of missing) {
    const hint = m.message === 'no such file or folder' ? 'check the path; model files live in models/ by default' : undefined;
    report.failures.push({ file: m.path, diagnostics: [fileDiagnostic(m.path, m.message, hint)], sourceHash: null });
  }
  const seen = new Map<string, string>();
  for (const { absolute, path: shown } of files) {
    let hash: string | null = null;
    try {
      const read = await readModelFile(absolute, shown);
      hash = read.hash;
      if ('diagnostic' in read) {
        report.failures.push({ file: shown, diagnostics: [read.diagnostic], sourceHash: read.hash });
        continue;
      }
      const { model, diagnostics } = checkModelSource(shown, read.text);
      if (!model) {
        const id = claimedId(read.text);
        report.failures.push(id ? { file: shown, id, diagnostics, sourceHash: read.hash } : { file: shown, diagnostics, sourceHash: read.hash });
        continue;
      }
      model.sourceHash = read.hash;
      const previous = seen.get(model.id);
      if (previous !== undefined) {
        const { document: positioned } = parseWithPositions(read.text);
        const d = locate(shown, positioned, { pointer: '/id', message: `id "${model.id}" is already used by ${previous}`, hint: 'ids must be unique across the inventory' });
        report.failures.push({ file: shown, id: model.id, diagnostics: [d], sourceHash: read.hash });
        continue;
      }
      seen.set(model.id, shown);
      report.models.push(model);
    } catch (error) {
      report.failures.push({
        file: shown,
        diagnostics: [fileDiagnostic(shown, `internal error while checking this file: ${(error as Error).message}`, 'this is a bug in Strobe Atlas; please report it with the file attached')],
        sourceHash: hash,
      });
    }
  }
  return report;
}
