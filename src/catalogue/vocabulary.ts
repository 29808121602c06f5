/**
 * The words a physicist reads: one place for the names of statuses, verdicts,
 * anomalous classes and every computed quantity, used by the command line and
 * by the site so that both say the same thing. Records keep their stable ids
 * ("gap-1/winding", "portrait-only"); only what is shown comes from here.
 *
 * Symbols are plain text with "_" before a subscript ("W_π", "ν_0", "C_1"):
 * the terminal prints them as they are, the site sets the subscript.
 */
import type { ModelStatus } from './records/model-record.ts';
import type { AnomalousClass } from './verify/anomalous.ts';
import type { VerdictOutcome } from './verify/verdict.ts';

export const STATUS_LABEL: Record<ModelStatus, string> = {
  verified: 'verified',
  disputed: 'disputed',
  unsettled: 'unsettled',
  'portrait-only': 'no claims',
  invalid: 'invalid',
  failed: 'failed',
};

export const STATUS_MEANING: Record<ModelStatus, string> = {
  verified: 'every claim was confirmed by recomputation',
  disputed: 'at least one claim is contradicted by recomputation',
  unsettled: 'no claim is contradicted, but at least one could not be settled numerically',
  'portrait-only': 'the file states no claims; the invariants computed from its drive are shown',
  invalid: 'the file did not load or compile, so nothing in it was checked',
  failed: 'the computation did not finish (time limit, crash or engine error)',
};

/** Order in which statuses are counted and listed: what needs attention first. */
export const STATUS_ORDER: ModelStatus[] = ['disputed', 'invalid', 'failed', 'unsettled', 'portrait-only', 'verified'];

export const OUTCOME_LABEL: Record<VerdictOutcome, string> = {
  confirmed: 'confirmed',
  contradicted: 'contradicted',
  unsettled: 'unsettled',
};

export const OUTCOME_MEANING: Record<VerdictOutcome, string> = {
  confirmed: 'the computed value is settled and equals the claim',
  contradicted: 'the computed value is settled and differs from the claim (or rests on a symmetry the drive breaks)',
  unsettled: 'the evidence is too weak either way (a gap closed or below tolerance, refinement not converged, a system too small)',
};

export const ANOMALOUS_LABEL: Record<AnomalousClass, string> = {
  'chern-trivial-anomalous': 'anomalous, every C = 0',
  anomalous: 'anomalous',
  'not-anomalous': 'not anomalous',
  undetermined: 'undetermined',
};

/** Plural-aware count: count(1, 'claim') → "1 claim", count(3, 'claim') → "3 claims". */
export function count(n: number, noun: string, plural = `${noun}s`): string {
  return `${n} ${n === 1 ? noun : plural}`;
}

const SMALL_FRACTIONS: [number, string, string][] = [
  [1, 'π', 'π/T'],
  [0.5, 'π/2', 'π/(2T)'],
  [-0.5, '−π/2', '−π/(2T)'],
  [0.25, 'π/4', 'π/(4T)'],
  [-0.25, '−π/4', '−π/(4T)'],
  [0.75, '3π/4', '3π/(4T)'],
  [-0.75, '−3π/4', '−3π/(4T)'],
  [1 / 3, 'π/3', 'π/(3T)'],
  [-1 / 3, '−π/3', '−π/(3T)'],
  [2 / 3, '2π/3', '2π/(3T)'],
  [-2 / 3, '−2π/3', '−2π/(3T)'],
];

const minus = (text: string) => text.replace(/^-/, '−');

/** A quasienergy given in units of π/T, as text: 0, π/T, π/(2T), −0.37π/T. */
export function quasienergyText(value: number | null): string {
  if (value === null || !Number.isFinite(value)) return '—';
  if (Math.abs(value) < 1e-9) return '0';
  const named = SMALL_FRACTIONS.find(([v]) => Math.abs(v - value) < 1e-9);
  if (named) return named[2];
  return `${minus(String(Number(value.toPrecision(3))))}π/T`;
}

/** The subscript that names a gap: 0, π, π/2, −0.37π. */
export function gapSubscript(label: number): string {
  if (Math.abs(label) < 1e-9) return '0';
  const named = SMALL_FRACTIONS.find(([v]) => Math.abs(v - label) < 1e-9);
  if (named) return named[1];
  return `${minus(String(Number(label.toPrecision(3))))}π`;
}

const LATTICE_VECTOR = ['a₁', 'a₂'];

/** "low edge of the ribbon finite along a₂". */
export function edgeName(finiteAlong: number, end: 'low' | 'high'): string {
  return `${end} edge of the ribbon finite along ${LATTICE_VECTOR[finiteAlong] ?? `a${finiteAlong + 1}`}`;
}

export const SYMMETRY_NAME: Record<string, { words: string; symbol: string }> = {
  chiral: { words: 'chiral symmetry', symbol: 'Γ' },
  'particle-hole': { words: 'particle–hole symmetry', symbol: 'P' },
  'time-reversal': { words: 'time-reversal symmetry', symbol: 'Θ' },
};

export interface QuantityName {
  /** Short symbol with "_" before the subscript (W_π, C_1, ν_0), or null when words read better. */
  symbol: string | null;
  /** What a physicist calls it, in a few words: "W at ε = π/T". */
  words: string;
  /** Gap label (units π/T) the quantity belongs to, when it belongs to a gap. */
  gap: number | null;
  /** Which family: for grouping and search. */
  family: 'winding' | 'chern' | 'edge-modes' | 'chain-invariant' | 'end-modes' | 'minimal-gap' | 'anomalous' | 'symmetry' | 'frame-winding' | 'symmetry-class' | 'other';
}

export interface QuantityContext {
  /** Claimed Altland–Zirnbauer class (changes the name of a chain invariant: Z₂ in class D). */
  symmetryClass?: string | null;
  /** Gap label (units π/T) of the band cut, for Chern numbers. */
  cut?: number | null;
}

/**
 * Names a claim or computed quantity by its id (same scheme for claims,
 * portrait entries and sweep quantities): gap-1/winding, gap-0/edge-1-low,
 * band-0/chern, gap-1/invariant, gap-1/end-modes, gap-0/minimal-gap,
 * anomalous, symmetry/chiral, symmetry-class, frame-first/winding. Unknown ids come back as
 * they are, so a new kind of claim is never hidden.
 */
export function quantityName(id: string, context: QuantityContext = {}): QuantityName {
  const bare = id.replace(/#\d+$/, '');
  let m = /^gap-(-?[0-9.e-]+)\/(winding|invariant|end-modes|minimal-gap|edge-(\d)-(low|high))$/.exec(bare);
  if (m) {
    const gap = Number(m[1]);
    const sub = gapSubscript(gap);
    const at = `ε = ${quasienergyText(gap)}`;
    switch (m[2]) {
      case 'winding':
        return { symbol: `W_${sub}`, words: `W at ${at}`, gap, family: 'winding' };
      case 'invariant': {
        const z2 = context.symmetryClass === 'D';
        return { symbol: `ν_${sub}`, words: `ν_${sub}, the ${z2 ? 'Z₂ index' : 'winding'} at ${at}`, gap, family: 'chain-invariant' };
      }
      case 'end-modes':
        return { symbol: null, words: `end modes at ${at} (per end)`, gap, family: 'end-modes' };
      case 'minimal-gap':
        return { symbol: `Δ_${sub}`, words: `smallest gap at ${at} (units of π/T)`, gap, family: 'minimal-gap' };
      default:
        return { symbol: null, words: `edge modes at ${at}, ${edgeName(Number(m[3]), m[4] as 'low' | 'high')}`, gap, family: 'edge-modes' };
    }
  }
  m = /^band-(\d+)\/chern$/.exec(bare);
  if (m) {
    const band = Number(m[1]) + 1;
    const cut = context.cut === undefined || context.cut === null ? '' : ` above the cut at ε = ${quasienergyText(context.cut)}`;
    return { symbol: `C_${band}`, words: `C of band ${band}${cut}`, gap: null, family: 'chern' };
  }
  m = /^symmetry\/(.+)$/.exec(bare);
  if (m) {
    if (m[1] === 'class') return { symbol: null, words: 'symmetry class', gap: null, family: 'symmetry-class' };
    const name = SYMMETRY_NAME[m[1]];
    return { symbol: name?.symbol ?? null, words: name ? `${name.words} ${name.symbol}` : m[1], gap: null, family: 'symmetry' };
  }
  m = /^frame-(first|second)\/winding$/.exec(bare);
  if (m) {
    const prime = m[1] === 'first' ? '′' : '″';
    return { symbol: `ν${prime}`, words: `ν${prime}, winding in the ${m[1]} symmetric time frame`, gap: null, family: 'frame-winding' };
  }
  if (bare === 'anomalous') return { symbol: null, words: 'anomalous phase', gap: null, family: 'anomalous' };
  if (bare === 'symmetry-class') return { symbol: null, words: 'symmetry class (Altland–Zirnbauer)', gap: null, family: 'symmetry-class' };
  return { symbol: null, words: id, gap: null, family: 'other' };
}

/** A claimed or computed value as text: yes/no for booleans, − for negatives, — for none. */
export function valueText(value: number | boolean | string | null | undefined, digits = 4): string {
  if (value === null || value === undefined) return '—';
  if (typeof value === 'boolean') return value ? 'yes' : 'no';
  if (typeof value === 'string') return value;
  if (Number.isInteger(value)) return minus(String(value));
  if (Math.abs(value) !== 0 && (Math.abs(value) < 1e-3 || Math.abs(value) >= 1e5)) {
    const [mantissa, exponent] = value.toExponential(2).split('e');
    return `${minus(String(Number(mantissa)))}×10${superscript(exponent.replace(/^\+/, ''))}`;
  }
  return minus(String(Number(value.toPrecision(digits))));
}

const SUPERSCRIPT: Record<string, string> = { '-': '⁻', '0': '⁰', '1': '¹', '2': '²', '3': '³', '4': '⁴', '5': '⁵', '6': '⁶', '7': '⁷', '8': '⁸', '9': '⁹' };
function superscript(text: string): string {
  return [...text].map((c) => SUPERSCRIPT[c] ?? c).join('');
}

const SUBSCRIPT_DIGIT: Record<string, string> = { '1': '₁', '2': '₂' };

/** A quasienergy written by the engine as 1.0000 or 0.5000 (units π/T), as text. */
function labelText(text: string): string {
  return quasienergyText(Number(text));
}

/**
 * A consistency relation checked by the engine, in words: the engine names
 * them "chern-sum", "winding-step:band-0", "edge-winding:f1:low:1.0000",
 * "edge-step:f1:high:band-1"; chain relations are already in words.
 */
export function consistencyName(name: string): string {
  if (name === 'chern-sum') return 'the Chern numbers of all bands add up to 0';
  let m = /^winding-step:band-(\d+)$/.exec(name);
  if (m) return `C_${Number(m[1]) + 1} = W above band ${Number(m[1]) + 1} − W below it`;
  m = /^edge-winding:f(\d):(low|high):(-?[\d.]+)$/.exec(name);
  if (m) return `edge count = ${m[2] === 'low' ? '±' : '∓'}W at ε = ${labelText(m[3])}, ${edgeName(Number(m[1]), m[2] as 'low' | 'high')}`;
  m = /^edge-step:f(\d):(low|high):band-(\d+)$/.exec(name);
  if (m) return `edge counts change across band ${Number(m[3]) + 1} by its Chern number, ${edgeName(Number(m[1]), m[2] as 'low' | 'high')}`;
  return name;
}

/** Engine detail text with gap labels, lattice vectors and minus signs written for reading. */
export function consistencyDetail(detail: string): string {
  return detail
    .replace(/W\((-?[\d.]+)\)/g, (_, g: string) => `W_${gapSubscript(Number(g))}`)
    .replace(/\(gap (-?[\d.]+)\)/g, (_, g: string) => `(ε = ${labelText(g)})`)
    .replace(/\ba([12])\b/g, (_, d: string) => `a${SUBSCRIPT_DIGIT[d]}`)
    .replace(/-0\.0+\b/g, '0')
    .replace(/(^|[\s(=,])-(\d)/g, '$1−$2');
}

/** 2nd, 3rd, 11th, 22nd. */
export function ordinal(n: number): string {
  const tens = n % 100;
  const suffix = tens >= 11 && tens <= 13 ? 'th' : ({ 1: 'st', 2: 'nd', 3: 'rd' } as Record<number, string>)[n % 10] ?? 'th';
  return `${n}${suffix}`;
}
