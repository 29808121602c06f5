/** How a verdict's hint is shown beside its message (claims table, needs-attention page). */
/**
 * A verdict's hint, unless its message already ends with the same advice
 * (unsettled messages carry their remedy after "to settle,"), so a reader
 * never reads one sentence twice.
 */
export function separateHint(message: string, hint: string | null): string | null {
  if (!hint) return null;
  const flat = (t: string) => t.replace(/\s+/g, ' ').replace(/[.\s]+$/, '').trim();
  return flat(message).includes(flat(hint)) ? null : hint;
}

/** How a hint is introduced: a contradiction has a likely cause, an unsettled claim a way to settle it. */
export function hintLabel(outcome: string): string {
  return outcome === 'unsettled' ? 'To settle:' : outcome === 'contradicted' ? 'Likely cause:' : 'Note:';
}
