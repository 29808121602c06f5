/**
 * Source positions for JSON documents: parses with jsonc-parser (which keeps the
 * offset of every node) and maps JSON pointers back to line:column, so every
 * diagnostic can point at the exact place in the user's file.
 */
import { findNodeAtLocation, parseTree, printParseErrorCode, type Node, type ParseError } from 'jsonc-parser';
import { joinPointer, splitPointer, type Issue } from './diagnostics.ts';

export interface Position {
  line: number;
  column: number;
}

export interface SyntaxProblem {
  offset: number;
  message: string;
  hint?: string;
}

export interface PositionedDocument {
  text: string;
  tree: Node | undefined;
  /** Offsets at which lines start. */
  lineStarts: number[];
}

const syntaxMessages: Record<string, [string, string?]> = {
  InvalidSymbol: ['unexpected character', 'JSON allows only objects, arrays, strings in double quotes, numbers, true, false and null'],
  InvalidNumberFormat: ['malformed number', 'write numbers like 1, -0.5 or 2e-3; use a string for expressions, e.g. "pi/2"'],
  PropertyNameExpected: ['expected a property name in double quotes', 'remove a trailing comma or quote the name'],
  ValueExpected: ['expected a value', 'remove a trailing comma or supply the missing value'],
  ColonExpected: ['expected ":" after the property name'],
  CommaExpected: ['expected "," between entries'],
  CloseBraceExpected: ['expected "}" to close the object'],
  CloseBracketExpected: ['expected "]" to close the list'],
  EndOfFileExpected: ['unexpected content after the end of the document', 'a model file holds exactly one JSON object'],
  InvalidCommentToken: ['comments are not allowed in JSON', 'put remarks into a "note" field'],
  UnexpectedEndOfComment: ['unterminated comment', 'comments are not allowed in JSON'],
  UnexpectedEndOfString: ['unterminated string', 'close the string with a double quote'],
  UnexpectedEndOfNumber: ['incomplete number'],
  InvalidUnicode: ['invalid \\u escape'],
  InvalidEscapeCharacter: ['invalid escape sequence in string', 'valid escapes are \\" \\\\ \\/ \\b \\f \\n \\r \\t \\uXXXX'],
  InvalidCharacter: ['invalid character in string', 'control characters must be escaped, e.g. \\n'],
};

/** Parses strict JSON (no comments, no trailing commas), keeping positions. */
export function parseWithPositions(text: string): { document: PositionedDocument; problems: SyntaxProblem[] } {
  const errors: ParseError[] = [];
  const tree = parseTree(text, errors, { disallowComments: true, allowTrailingComma: false, allowEmptyContent: false });
  const lineStarts = [0];
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c === 10) lineStarts.push(i + 1);
    else if (c === 13 && text.charCodeAt(i + 1) !== 10) lineStarts.push(i + 1);
  }
  const problems = errors.map((e) => {
    const [message, hint] = syntaxMessages[printParseErrorCode(e.error)] ?? ['malformed JSON'];
    return hint === undefined ? { offset: e.offset, message } : { offset: e.offset, message, hint };
  });
  return { document: { text, tree, lineStarts }, problems };
}

/** 1-based line and column of a character offset. */
export function positionOf(document: PositionedDocument, offset: number): Position {
  const starts = document.lineStarts;
  let lo = 0;
  let hi = starts.length - 1;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if (starts[mid] <= offset) lo = mid;
    else hi = mid - 1;
  }
  return { line: lo + 1, column: offset - starts[lo] + 1 };
}

/** The node at a pointer, or the deepest existing ancestor when the pointer runs past the document. */
export function nodeAt(document: PositionedDocument, pointer: string): Node | undefined {
  if (!document.tree) return undefined;
  const tokens = splitPointer(pointer);
  for (let n = tokens.length; n >= 0; n--) {
    const path = tokens.slice(0, n).map((t, i) => (isArrayIndex(document, tokens.slice(0, i), t) ? Number(t) : t));
    const node = findNodeAtLocation(document.tree, path);
    if (node) return node;
  }
  return document.tree;
}

function isArrayIndex(document: PositionedDocument, parentTokens: string[], token: string): boolean {
  if (!/^(0|[1-9][0-9]*)$/.test(token) || !document.tree) return false;
  const parent = parentTokens.length === 0 ? document.tree : findNodeAtLocation(document.tree, parentTokens.map((t) => (/^\d+$/.test(t) ? Number(t) : t)));
  return parent?.type === 'array';
}

/** Offset an issue refers to: the value, its property name, or a character inside a string value. */
export function offsetOfIssue(document: PositionedDocument, issue: Issue): number {
  if (issue.offset !== undefined) return issue.offset;
  const node = nodeAt(document, issue.pointer);
  if (!node) return 0;
  if (issue.target === 'key' && node.parent?.type === 'property' && node.parent.children?.[0]) {
    return node.parent.children[0].offset;
  }
  if (issue.offsetInString !== undefined && node.type === 'string') {
    return node.offset + 1 + Math.min(issue.offsetInString, Math.max(0, node.length - 2));
  }
  return node.offset;
}

/** Properties that occur twice in one object (JSON.parse keeps the last silently). */
export function duplicateProperties(document: PositionedDocument): Issue[] {
  const issues: Issue[] = [];
  const walk = (node: Node, pointer: string): void => {
    if (node.type === 'object') {
      const seen = new Map<string, Node>();
      for (const property of node.children ?? []) {
        const [key, value] = property.children ?? [];
        if (!key) continue;
        const name = String(key.value);
        const first = seen.get(name);
        if (first) {
          const at = positionOf(document, first.offset);
          issues.push({
            pointer: joinPointer(pointer, name),
            message: `duplicate property "${name}"`,
            hint: `it is already set at line ${at.line}:${at.column}; keep one`,
            target: 'key',
            offset: key.offset,
          });
        } else seen.set(name, key);
        if (value) walk(value, joinPointer(pointer, name));
      }
    } else if (node.type === 'array') {
      (node.children ?? []).forEach((child, i) => walk(child, joinPointer(pointer, i)));
    }
  };
  if (document.tree) walk(document.tree, '');
  return issues;
}
