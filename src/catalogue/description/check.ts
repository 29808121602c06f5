/**
 * The check-time side of description rendering: the same renderer the site
 * uses (render.ts) runs while a model file loads, and a description it would
 * refuse becomes a located error at the place in the JSON string where the
 * problem starts.
 */
import type { Issue } from '../diagnostics.ts';
import { nodeAt, type PositionedDocument } from '../json-positions.ts';
import { DESCRIPTION_LIMITS, renderDescription, type MarkdownLimits } from './render.ts';

/**
 * Offset in the raw JSON text of a string (between its quotes) of the character
 * at `index` of the decoded string: escapes such as \n or \u00e9 take more raw
 * characters than they decode to.
 */
export function rawOffsetInString(raw: string, index: number): number {
  let decoded = 0;
  let i = 0;
  while (i < raw.length && decoded < index) {
    if (raw[i] === '\\') {
      // \uXXXX is one UTF-16 unit; every other escape is two raw characters for one unit.
      i += raw[i + 1] === 'u' ? 6 : 2;
    } else i++;
    decoded++;
  }
  return i;
}

export function checkDescription(markdown: string, pointer: string, document?: PositionedDocument, limits: MarkdownLimits = DESCRIPTION_LIMITS): Issue[] {
  const result = renderDescription(markdown, limits);
  if (result.ok) return [];
  const { message, hint, offset } = result.problem;
  const issue: Issue = { pointer, message: `the description ${message}` };
  if (hint !== undefined) issue.hint = hint;
  if (offset !== undefined && document) {
    const node = nodeAt(document, pointer);
    if (node?.type === 'string') issue.offsetInString = rawOffsetInString(document.text.slice(node.offset + 1, node.offset + node.length - 1), offset);
  }
  return [issue];
}
