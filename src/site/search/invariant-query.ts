/**
 * Search by invariant: conditions such as "W ≠ 0 in the π gap",
 * "C = 0 in every band" or "ν_π = ±1" found in the search text, parsed into
 * clauses and tested against a model's invariant profile. Runs in the browser
 * and at build time (no imports beyond the profile type).
 *
 * A clause is  quantity relation value [scope]:
 *   quantity  W, C or ν (also "nu"), with an optional subscript naming the gap
 *             (W_π, W_pi, Wπ, W(π), W₀, W_0, ν_π, nu0) or the band (C_1, C₁);
 *   relation  = == ≠ != <> < > ≤ <= ≥ >=;
 *   value     an integer, or ±n (also +-n, +/-n) meaning either sign;
 *   scope     in the π gap | in the 0 gap | at π | at 0 | at ε = π/T |
 *             in every/all/both gap(s)/band(s) | in some/any/a gap/band.
 * Without a gap or band, "=" means every one of them and "≠" some of them
 * ("C = 0" reads as Chern-trivial, "C ≠ 0" as having a Chern band); the
 * reading is always shown back to the user. A value the engine could not
 * settle never matches.
 */
import type { InvariantProfile } from '../invariants.ts';

export type Relation = '=' | '≠' | '<' | '>' | '≤' | '≥';
export type Quantifier = 'every' | 'some';

export interface InvariantClause {
  quantity: 'W' | 'C' | 'ν';
  /** Gap label (units π/T) for W and ν, when one gap is meant. */
  gap: number | null;
  /** Band number (1-based, upward from the cut) for C, when one band is meant. */
  band: number | null;
  relation: Relation;
  value: number;
  /** ±value: either sign. */
  eitherSign: boolean;
  quantifier: Quantifier;
  /** The clause as typed. */
  text: string;
}

const SUBSCRIPT_DIGITS: Record<string, string> = { '₀': '0', '₁': '1', '₂': '2', '₃': '3', '₄': '4', '₅': '5', '₆': '6', '₇': '7', '₈': '8', '₉': '9' };

const QUANTITY = String.raw`(W|C|ν|nu)(?:\s*_?\s*(?:\{\s*(π|pi|0|\d+)\s*\}|\(\s*(π|pi|0|\d+)\s*\)|(π|pi|[₀-₉]+|\d+)))?`;
const RELATION = String.raw`(==|=|≠|!=|=/=|<>|≤|<=|≥|>=|<|>)`;
const VALUE = String.raw`(±|\+-|\+/-)?\s*([−-]?\d+)`;
const SCOPE = String.raw`(?:\s+(?:in|at|for|on)\s+(?:the\s+)?(?:(every|all|both|each|some|any|a|an)\s+(gaps?|bands?)|(π|pi|0|zero)(?:\s+gap)?|gap\s+at\s+(π|pi|0)|ε\s*=\s*(π\/T|π|pi|0)))?`;
const CLAUSE = new RegExp(String.raw`(?<![\p{L}\p{N}])${QUANTITY}\s*${RELATION}\s*${VALUE}${SCOPE}(?![\p{L}\p{N}])`, 'giu');

const gapOf = (text: string | undefined): number | null => {
  if (text === undefined) return null;
  const t = text.toLowerCase();
  if (t === 'π' || t === 'pi' || t === 'π/t') return 1;
  if (t === '0' || t === 'zero') return 0;
  return null;
};

const RELATIONS: Record<string, Relation> = { '=': '=', '==': '=', '≠': '≠', '!=': '≠', '=/=': '≠', '<>': '≠', '<': '<', '>': '>', '≤': '≤', '<=': '≤', '≥': '≥', '>=': '≥' };

/** Splits search text into invariant clauses and the remaining free text. */
export function parseInvariantQuery(text: string): { clauses: InvariantClause[]; rest: string } {
  const clauses: InvariantClause[] = [];
  const rest = text.replace(CLAUSE, (match, q: string, sub1?: string, sub2?: string, sub3?: string, rel?: string, pm?: string, num?: string, quant?: string, noun?: string, scopeGap?: string, gapAt?: string, eps?: string) => {
    const quantity = q.toLowerCase() === 'nu' || q === 'ν' ? 'ν' : (q.toUpperCase() as 'W' | 'C');
    const rawSub = sub1 ?? sub2 ?? sub3;
    const sub = rawSub === undefined ? undefined : [...rawSub].map((c) => SUBSCRIPT_DIGITS[c] ?? c).join('');
    let gap: number | null = null;
    let band: number | null = null;
    if (sub !== undefined) {
      if (quantity === 'C') band = /^\d+$/.test(sub) ? Number(sub) : null;
      else gap = gapOf(sub);
    }
    gap ??= gapOf(scopeGap ?? gapAt ?? eps);
    const relation = RELATIONS[rel ?? '='];
    const explicit = quant === undefined ? null : /^(every|all|both|each)$/i.test(quant) ? 'every' : 'some';
    const quantifier: Quantifier = explicit ?? (relation === '≠' ? 'some' : 'every');
    // "C in the π gap" mixes a band quantity with a gap: read the gap as not given.
    if (quantity === 'C') gap = null;
    void noun;
    clauses.push({ quantity, gap, band, relation, value: Number((num ?? '0').replace('−', '-')), eitherSign: pm !== undefined, quantifier, text: match.trim() });
    return ' ';
  });
  // Words that only joined clauses ("and", "&", ",") are not search terms.
  const free = clauses.length > 0 ? rest.replace(/(^|\s)(and|&|,|;)(?=\s|$)/gi, ' ') : rest;
  return { clauses, rest: free.replace(/\s+/g, ' ').trim() };
}

function holds(x: number, clause: InvariantClause): boolean {
  const v = clause.eitherSign ? Math.abs(clause.value) : clause.value;
  const y = clause.eitherSign ? Math.abs(x) : x;
  switch (clause.relation) {
    case '=': return y === v;
    case '≠': return y !== v;
    case '<': return y < v;
    case '>': return y > v;
    case '≤': return y <= v;
    case '≥': return y >= v;
  }
}

/** Whether a model's invariants satisfy one clause (unsettled values never do). */
export function matchesClause(profile: InvariantProfile, clause: InvariantClause): boolean {
  let values: (number | null)[];
  if (clause.quantity === 'C') {
    values = clause.band === null ? profile.C : [profile.C[clause.band - 1] ?? null];
    if (clause.band !== null && clause.band > profile.C.length) return false;
  } else {
    const list = clause.quantity === 'W' ? profile.W : profile.nu;
    const selected = clause.gap === null ? list : list.filter(([g]) => Math.abs(g - clause.gap!) < 1e-9);
    values = selected.map(([, v]) => v);
  }
  if (values.length === 0) return false;
  const one = clause.band !== null || clause.gap !== null;
  if (one || clause.quantifier === 'every') return values.every((v) => v !== null && holds(v, clause));
  return values.some((v) => v !== null && holds(v, clause));
}

export function matchesAll(profile: InvariantProfile, clauses: InvariantClause[]): boolean {
  return clauses.every((c) => matchesClause(profile, c));
}

const GAP_WORDS: Record<string, string> = { '0': 'the 0 gap', '1': 'the π gap' };

/** How a clause was read, in words: "W ≠ 0 in the π gap", "C = 0 in every band". */
export function describeClause(clause: InvariantClause): string {
  const value = `${clause.eitherSign ? '±' : ''}${String(clause.value).replace('-', '−')}`;
  const head = `${clause.quantity} ${clause.relation} ${value}`;
  if (clause.quantity === 'C') return clause.band !== null ? `${head} for band ${clause.band}` : `${head} in ${clause.quantifier} band`;
  if (clause.gap !== null && clause.quantity === 'ν' && (clause.gap === 0 || clause.gap === 1)) return `ν_${clause.gap === 0 ? '0' : 'π'} ${clause.relation} ${value}`;
  if (clause.gap !== null) return `${head} in ${GAP_WORDS[String(clause.gap)] ?? `the gap at ${clause.gap}π/T`}`;
  return `${head} in ${clause.quantifier} gap`;
}
