// The words shown for statuses and quantities: one vocabulary for the command line
// and the site (physicists' names: W at ε = π/T, ν_π, "low edge of the ribbon
// finite along a₂"), never the record ids ("gap-1/winding", "portrait-only").
import { describe, expect, it } from 'vitest';
import { ANOMALOUS_LABEL, consistencyDetail, consistencyName, count, gapSubscript, quantityName, quasienergyText, STATUS_LABEL, valueText } from '../../src/catalogue/vocabulary.ts';

describe('quantity names', () => {
  it('names claim ids the way a physicist writes them', () => {
    expect(quantityName('gap-1/winding')).toMatchObject({ symbol: 'W_π', words: 'W at ε = π/T', gap: 1 });
    expect(quantityName('gap-0/winding')).toMatchObject({ symbol: 'W_0', words: 'W at ε = 0' });
    expect(quantityName('gap-0.5/winding')).toMatchObject({ symbol: 'W_π/2', words: 'W at ε = π/(2T)' });
    expect(quantityName('gap-1/invariant').symbol).toBe('ν_π');
    expect(quantityName('gap-1/invariant', { symmetryClass: 'D' }).words).toBe('ν_π, the Z₂ index at ε = π/T');
    // Every claim id a record can carry reads as words, never as the id itself.
    expect(quantityName('symmetry-class')).toMatchObject({ words: 'symmetry class (Altland–Zirnbauer)', family: 'symmetry-class' });
    expect(quantityName('gap-0/edge-1-low').words).toBe('edge modes at ε = 0, low edge of the ribbon finite along a₂');
    expect(quantityName('band-0/chern', { cut: 1 })).toMatchObject({ symbol: 'C_1', words: 'C of band 1 above the cut at ε = π/T' });
    expect(quantityName('gap-1/end-modes').words).toBe('end modes at ε = π/T (per end)');
    expect(quantityName('symmetry/chiral').words).toBe('chiral symmetry Γ');
    expect(quantityName('frame-second/winding').symbol).toBe('ν″');
    expect(quantityName('gap-1/winding#2').symbol).toBe('W_π');
  });

  it('passes unknown ids through rather than hiding them', () => {
    expect(quantityName('something/new')).toMatchObject({ words: 'something/new', family: 'other' });
  });

  it('writes quasienergies in units of π/T as fractions where they are simple', () => {
    expect([0, 1, 0.5, -0.5, 0.25, 0.37].map(quasienergyText)).toEqual(['0', 'π/T', 'π/(2T)', '−π/(2T)', 'π/(4T)', '0.37π/T']);
    expect([0, 1, -0.5, 0.37].map(gapSubscript)).toEqual(['0', 'π', '−π/2', '0.37π']);
  });
});

describe('statuses and values', () => {
  it('uses one word per status, never the record ids', () => {
    expect(STATUS_LABEL['portrait-only']).toBe('no claims');
    expect(Object.values(STATUS_LABEL)).not.toContain('portrait-only');
    expect(ANOMALOUS_LABEL['not-anomalous']).toBe('not anomalous');
    expect(ANOMALOUS_LABEL['chern-trivial-anomalous']).toBe('anomalous, every C = 0');
  });

  it('counts with plurals and writes numbers with true minus signs and powers of ten', () => {
    expect([count(1, 'claim'), count(3, 'claim')]).toEqual(['1 claim', '3 claims']);
    expect(valueText(-1)).toBe('−1');
    expect(valueText(6.88e-8)).toBe('6.88×10⁻⁸');
    expect(valueText(1e-6)).toBe('1×10⁻⁶');
    expect(valueText(true)).toBe('yes');
    expect(valueText(null)).toBe('—');
  });

  it('puts the engine’s consistency relations into words', () => {
    expect(consistencyName('winding-step:band-0')).toBe('C_1 = W above band 1 − W below it');
    expect(consistencyName('edge-winding:f1:low:1.0000')).toBe('edge count = ±W at ε = π/T, low edge of the ribbon finite along a₂');
    expect(consistencyName('bulk–end at π (chiral)')).toBe('bulk–end at π (chiral)');
    expect(consistencyDetail('W(1.0000) − W(0.0000) = 1 − 1 = 0, C = 0')).toBe('W_π − W_0 = 1 − 1 = 0, C = 0');
    expect(consistencyDetail('high-edge count -1 on the ribbon finite along a2, expected −W = -1')).toBe('high-edge count −1 on the ribbon finite along a₂, expected −W = −1');
    expect(consistencyDetail('winding of det U(k, T) = -0.000000 on 32 momenta')).toBe('winding of det U(k, T) = 0 on 32 momenta');
  });
});
