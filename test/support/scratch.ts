/** Scratch directories removed after each test, and command output captured in memory. */
import { afterEach } from 'vitest';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

/** A maker of temporary directories (prefix names the test file), each removed after the test that made it. */
export function scratchDirectories(prefix: string): () => string {
  const dirs: string[] = [];
  afterEach(() => {
    for (const d of dirs.splice(0)) rmSync(d, { recursive: true, force: true });
  });
  return () => {
    const d = mkdtempSync(join(tmpdir(), prefix));
    dirs.push(d);
    return d;
  };
}

/** Stream-shaped stdout and stderr that keep what is written. */
export function capture() {
  const out: string[] = [];
  const err: string[] = [];
  return { io: { stdout: { write: (t: string) => out.push(t) }, stderr: { write: (t: string) => err.push(t) } }, out, err };
}
