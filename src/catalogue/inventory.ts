/**
 * The inventory: the model files named by the paths a run is given (files, or
 * folders scanned for *.json, not recursively), each with the path it is known
 * by in diagnostics, results records and pages, and a fingerprint of its bytes.
 *
 * Paths are relative, never absolute: relative to the working directory for
 * files inside it (models/qwz-sheet.json), otherwise the file's folder and
 * name (/data/lab/models/x.json is models/x.json, however it was named on the
 * command line). So records and published pages never carry the layout of a
 * user's disk, and one file always has one path.
 *
 * Record ids are derived from file names only for files that did not load;
 * they become file and page names, so they are made safe here: kebab-case,
 * never empty, never "." or "..".
 */
import { createHash } from 'node:crypto';
import { readdirSync, readFileSync, realpathSync, statSync } from 'node:fs';
import path from 'node:path';

/** Largest model file read (bytes). Larger files are refused without reading them. */
export const MAX_FILE_BYTES = 5 * 1024 * 1024;

export interface InventoryFile {
  /** Absolute path on disk. */
  absolute: string;
  /** Path shown in diagnostics and written into records ('/'-separated, relative). */
  path: string;
}

export interface MissingPath {
  /** The argument as shown (relative like every inventory path). */
  path: string;
  message: string;
}

function slashes(p: string): string {
  return p.split(path.sep).join('/');
}

/** The path a file is known by (see the module comment): the same however the file was named on the command line. */
export function inventoryPath(file: string): string {
  const absolute = path.resolve(file);
  const inCwd = path.relative(process.cwd(), absolute);
  if (inCwd !== '' && !inCwd.startsWith('..') && !path.isAbsolute(inCwd)) return slashes(inCwd);
  const folder = path.basename(path.dirname(absolute));
  return folder === '' ? path.basename(absolute) : `${folder}/${path.basename(absolute)}`;
}

/** Model file candidates under the given files or folders, each once however often it is named. */
export function listInventory(paths: readonly string[]): { files: InventoryFile[]; missing: MissingPath[] } {
  const files: InventoryFile[] = [];
  const missing: MissingPath[] = [];
  const seen = new Set<string>();
  const add = (absolute: string) => {
    let key = absolute;
    try {
      key = realpathSync(absolute);
    } catch {
      // dangling or unreadable: the loader reports it; keep the spelled path as its identity
    }
    if (seen.has(key)) return;
    seen.add(key);
    files.push({ absolute, path: inventoryPath(absolute) });
  };
  for (const argument of paths) {
    const absolute = path.resolve(argument);
    let info;
    try {
      info = statSync(absolute);
    } catch {
      missing.push({ path: inventoryPath(absolute), message: 'no such file or folder' });
      continue;
    }
    if (info.isDirectory() && !absolute.endsWith('.json')) {
      let names: string[];
      try {
        names = readdirSync(absolute, { withFileTypes: true }).map((e) => e.name);
      } catch (error) {
        missing.push({ path: inventoryPath(absolute), message: `cannot read folder: ${(error as Error).message}` });
        continue;
      }
      for (const name of names.filter((n) => n.endsWith('.json')).sort((a, b) => a.localeCompare(b))) add(path.join(absolute, name));
    } else add(absolute);
  }
  return { files, missing };
}

/** sha256 of a file's bytes, as records carry it ("sha256:<hex>"). */
export function sourceHash(bytes: Uint8Array | string): string {
  return `sha256:${createHash('sha256').update(bytes).digest('hex')}`;
}

/**
 * The fingerprint the loader gives a file: the hash of its bytes, or null when
 * it is not read (missing, a folder, unreadable or over MAX_FILE_BYTES). The
 * site build compares it with the record's to tell fresh records from stale ones.
 */
export function fingerprintFile(absolute: string): string | null {
  try {
    const info = statSync(absolute);
    if (!info.isFile() || info.size > MAX_FILE_BYTES) return null;
    return sourceHash(readFileSync(absolute));
  } catch {
    return null;
  }
}

const KEBAB = /^[a-z0-9]+(-[a-z0-9]+)*$/;
const ID_LENGTH = 64;

/** Whether a model id is kebab-case and at most 64 characters (the schema's rule). */
export function isModelId(id: string): boolean {
  return id.length <= ID_LENGTH && KEBAB.test(id);
}

/**
 * A safe record id for a file that did not load: its base name when that is a
 * valid model id, else a kebab-case version of it with a short hash of the
 * name, so that ".json", "..json" or "Ω.json" get distinct, harmless ids.
 */
export function recordIdForFile(file: string): string {
  const name = path.posix.basename(file.split(path.sep).join('/')).replace(/\.json$/, '');
  if (isModelId(name)) return name;
  const stem = name.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 40).replace(/-+$/, '');
  const tag = createHash('sha256').update(name, 'utf8').digest('hex').slice(0, 8);
  return `${stem || 'unnamed'}-${tag}`;
}
