// A verdict's hint beside its message: shown only when the message does not already
// carry the same advice, and introduced by what it is (a cause, or a way to settle).
import { describe, expect, it } from 'vitest';
import { hintLabel, separateHint } from '../../src/site/verdict-hint.ts';

describe('verdict hints on the page', () => {
  it('drops a hint the message already ends with, whatever the spacing and final full stop', () => {
    const message = 'The gap is too small; to settle, move the parameter point away from the phase transition.';
    expect(separateHint(message, 'move the parameter point away from the phase transition')).toBeNull();
    expect(separateHint(message, 'move the parameter  point away\nfrom the phase transition.')).toBeNull();
  });

  it('keeps a hint that adds something, and nothing when there is none', () => {
    expect(separateHint('W is −1, but the file claims 1.', 'the lattice vectors are left-handed: flip the sign')).toBe('the lattice vectors are left-handed: flip the sign');
    expect(separateHint('anything', null)).toBeNull();
  });

  it('introduces a contradiction by its likely cause and an unsettled claim by what settles it', () => {
    expect(hintLabel('contradicted')).toBe('Likely cause:');
    expect(hintLabel('unsettled')).toBe('To settle:');
  });
});
