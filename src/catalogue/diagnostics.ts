/**
 * Diagnostics: located, actionable messages about model files.
 *
 * Every problem the catalogue finds in a user's file becomes one Diagnostic with
 * the file, a 1-based line:column, the JSON pointer (RFC 6901) of the offending
 * value, a plain message and, where there is an obvious fix, a hint.
 */
export type Severity = 'error' | 'warning';

export interface Diagnostic {
  file: string;
  /** 1-based line. */
  line: number;
  /** 1-based column (UTF-16 code units, as editors count). */
  column: number;
  /** JSON pointer of the value concerned ("" for the whole document). */
  pointer: string;
  message: string;
  hint?: string;
  severity: Severity;
}

/** A problem found before positions are known: a pointer into the document plus text. */
export interface Issue {
  pointer: string;
  message: string;
  hint?: string;
  severity?: Severity;
  /** Point at the property name rather than the value (unknown or duplicate properties). */
  target?: 'value' | 'key';
  /** Character offset inside a string value (expression errors), counted from the first character after the quote. */
  offsetInString?: number;
  /** Absolute character offset, when the pointer alone cannot tell (e.g. the second of two equal keys). */
  offset?: number;
}

/** Escapes one reference token of a JSON pointer (RFC 6901: ~ → ~0, / → ~1). */
export function escapePointerToken(token: string | number): string {
  return String(token).replace(/~/g, '~0').replace(/\//g, '~1');
}

export function joinPointer(base: string, ...tokens: (string | number)[]): string {
  return base + tokens.map((t) => '/' + escapePointerToken(t)).join('');
}

/** Splits a JSON pointer into its reference tokens (numbers stay strings). */
export function splitPointer(pointer: string): string[] {
  if (pointer === '') return [];
  return pointer
    .slice(1)
    .split('/')
    .map((t) => t.replace(/~1/g, '/').replace(/~0/g, '~'));
}

/**
 * One line of terminal output: `file:line:column  pointer  message  (hint)`,
 * with warnings marked at the start (`warning: file:…`) so they stand apart
 * from errors in any list.
 */
export function formatDiagnostic(d: Pick<Diagnostic, 'file' | 'line' | 'column' | 'pointer' | 'message' | 'severity'> & { hint?: string | null }): string {
  const pointer = d.pointer === '' ? '(document)' : d.pointer;
  const hint = d.hint ? `  (${d.hint})` : '';
  const level = d.severity === 'warning' ? 'warning: ' : '';
  return `${level}${d.file}:${d.line}:${d.column}  ${pointer}  ${d.message}${hint}`;
}

export function hasErrors(diagnostics: readonly Diagnostic[]): boolean {
  return diagnostics.some((d) => d.severity === 'error');
}

/** Orders diagnostics by position so reports read top to bottom. */
export function sortDiagnostics(diagnostics: Diagnostic[]): Diagnostic[] {
  return diagnostics.sort((a, b) => a.file.localeCompare(b.file) || a.line - b.line || a.column - b.column);
}

/** Edit distance counting insertions, deletions, substitutions and adjacent transpositions (optimal string alignment), for "did you mean" hints. */
export function editDistance(a: string, b: string): number {
  const d = Array.from({ length: a.length + 1 }, (_, i) => Array.from({ length: b.length + 1 }, (_, j) => (i === 0 ? j : j === 0 ? i : 0)));
  for (let i = 1; i <= a.length; i++) {
    for (let j = 1; j <= b.length; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      d[i][j] = Math.min(d[i - 1][j] + 1, d[i][j - 1] + 1, d[i - 1][j - 1] + cost);
      if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1]) d[i][j] = Math.min(d[i][j], d[i - 2][j - 2] + 1);
    }
  }
  return d[a.length][b.length];
}

/** The closest candidate within a small edit distance (case-insensitive), or undefined. */
export function closestName(name: string, candidates: Iterable<string>): string | undefined {
  let best: string | undefined;
  let bestDistance = Infinity;
  for (const candidate of candidates) {
    const d = editDistance(name.toLowerCase(), candidate.toLowerCase());
    if (d < bestDistance) {
      best = candidate;
      bestDistance = d;
    }
  }
  const limit = Math.max(1, Math.floor(name.length / 3));
  if (bestDistance <= limit) return best;
  // A truncated name ("descr" for "description") is a likely slip too.
  if (name.length >= 3) return [...candidates].find((c) => c.toLowerCase().startsWith(name.toLowerCase()));
  return undefined;
}

/** "did you mean 'x'?" when a close candidate exists, else "<what> are a, b, c". */
export function suggestName(name: string, candidates: readonly string[], what: string): string {
  const close = closestName(name, candidates);
  if (close !== undefined) return `did you mean '${close}'?`;
  if (candidates.length === 0) return `no ${what} are defined`;
  return `${what} are ${candidates.join(', ')}`;
}
