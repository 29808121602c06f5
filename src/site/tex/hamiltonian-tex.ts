/**
 * The Hamiltonian of every drive segment written out in second quantisation,
 * built from the terms of the model file exactly as the format defines them
 * (docs/model-format.md, Drive):
 *
 *   hopping  t·f(t)·e^{iA(t)·d} c†_{to, R+n} c_{from, R} + h.c.,
 *            d = Σ nᵢaᵢ + r_to − r_from (the Peierls phase, charge 1);
 *   onsite   ε·f(t) n_{o, R};
 *   pairing  Δ·f(t) c†_{to, R+n} c†_{from, R} + h.c.;
 *   f(t)     m₀ + Σ aⱼ cos|sin(hⱼ ω t + φⱼ), ω = 2π/T, t the time in the period;
 *   kick     a segment of duration 0 applies U = e^{−iK} with K built the same way.
 *
 * Only presentation: the numbers come from the file, as written.
 */
import type { Amplitude, HarmonicComponent, Modulation, ModelDocument, Quantity, Segment, VectorPotentialSpec } from '../../catalogue/model-types.generated.ts';
import { orbitalTex } from '../symbols.ts';
import { isCompound, numberTex, quantityTex } from './expression-tex.ts';

/** Terms typeset per segment before the rest is summarised (keeps pages small). */
const MAX_TERMS_SHOWN = 24;
/** Terms typeset on one page in all; later segments are summarised by their term count. */
const MAX_TERMS_PER_PAGE = 120;

export interface SegmentFormula {
  index: number;
  label: string | null;
  /** TeX of the time window, e.g. 0 \le t < \tau, or t = T/2 for a kick. */
  window: string;
  kick: boolean;
  /** Display TeX of the segment Hamiltonian (or kick generator). */
  tex: string;
  /** Display TeX of the segment's vector potential A(t), when it has one. */
  potential: string | null;
  /** Terms not typeset (see the model file). */
  omitted: number;
}

export interface HamiltonianFormulas {
  dimension: 1 | 2;
  segments: SegmentFormula[];
  /** ω = 2π/T and other definitions the formulas use. */
  definitions: string[];
}

const LATTICE_VECTOR = ['\\mathbf a_1', '\\mathbf a_2'];

/** Cell index of the created particle: R + a₁ − a₂ (2D) or j + 1 (1D). */
function cellTex(offset: number[], dimension: 1 | 2): string {
  const base = dimension === 1 ? 'j' : '\\mathbf R';
  let text = base;
  offset.forEach((n, i) => {
    if (n === 0) return;
    const unit = dimension === 1 ? '' : LATTICE_VECTOR[i];
    const magnitude = Math.abs(n) === 1 && unit ? '' : String(Math.abs(n));
    text += `${n > 0 ? '+' : '-'}${magnitude}${unit}`;
  });
  return text;
}

function site(name: string, cell: string): string {
  return `${orbitalTex(name)},${cell}`;
}

function componentTex(c: HarmonicComponent | VectorPotentialSpec, amplitude: string): string {
  const harmonic = c.harmonic === 1 ? '' : c.harmonic === -1 ? '-' : String(c.harmonic);
  const phase = c.phase === undefined || c.phase === 0 ? '' : isCompound(c.phase) && typeof c.phase !== 'number' ? ` + \\left(${quantityTex(c.phase)}\\right)` : ` + ${quantityTex(c.phase)}`;
  const argument = c.harmonic === 0 ? (phase ? phase.slice(3) : '0') : `${harmonic}\\omega t${phase}`;
  const a = amplitude === '1' ? '' : amplitude;
  return `${a}\\${c.function}\\left(${argument}\\right)`.replace('+ -', '- ');
}

function factorTex(q: Quantity): string {
  const tex = quantityTex(q);
  return isCompound(q) ? `\\left(${tex}\\right)` : tex;
}

/** A factor with its sign taken out: -Delta → { negative, tex: \Delta }; 0.5 → { tex: 0.5 }. */
function signedFactor(q: Quantity): { negative: boolean; tex: string } {
  if (typeof q === 'number') return { negative: q < 0, tex: numberTex(Math.abs(q)) };
  const tex = quantityTex(q);
  if (/^-[^+-]*$/.test(tex) && !tex.includes('\\left')) return { negative: true, tex: tex.slice(1) };
  if (tex.startsWith('-') && !/[+-]/.test(tex.slice(1).replace(/\\left\(.*?\\right\)|\{[^{}]*\}/g, ''))) return { negative: true, tex: tex.slice(1) };
  return { negative: false, tex: isCompound(q) ? `\\left(${tex}\\right)` : tex };
}

/** f(t) as a factor: "" for a constant term, else [m₀ + Σ …]. */
function modulationTex(modulation: Modulation | undefined): string {
  if (!modulation || modulation.kind === 'constant') return '';
  const parts: string[] = [];
  if (modulation.mean !== undefined && modulation.mean !== 0) parts.push(quantityTex(modulation.mean));
  for (const c of modulation.components) parts.push(componentTex(c, factorTex(c.amplitude)));
  const sum = parts.join(' + ').replace(/\+ -/g, '- ');
  return parts.length === 1 && !(modulation.mean !== undefined && modulation.mean !== 0) ? sum : `\\left[${sum}\\right]`;
}

function amplitudeTex(amplitude: Amplitude): { negative: boolean; tex: string; real: boolean } {
  if (typeof amplitude === 'number' || typeof amplitude === 'string') return { ...signedFactor(amplitude), real: true };
  if ('magnitude' in amplitude) {
    const m = signedFactor(amplitude.magnitude);
    return { negative: m.negative, tex: `${m.tex}\\, e^{i${factorTex(amplitude.phase)}}`, real: false };
  }
  if (amplitude.re === 0) {
    const im = signedFactor(amplitude.im);
    return { negative: im.negative, tex: im.tex === '1' ? 'i' : `${im.tex}\\, i`, real: false };
  }
  const re = quantityTex(amplitude.re), im = quantityTex(amplitude.im);
  return { negative: false, tex: `\\left(${re} + ${isCompound(amplitude.im) ? `\\left(${im}\\right)` : im}\\, i\\right)`.replace('+ -', '- '), real: false };
}

/** One term: sign, coefficient and operator, dropping a coefficient of 1. */
function term(negative: boolean, factors: string[], operator: string): string {
  const coefficient = factors.filter((f) => f !== '' && f !== '1').join('\\,');
  const gap = operator.startsWith('\\left') ? '' : '\\, ';
  return `${negative ? '-' : ''}${coefficient ? `${coefficient}${gap}` : ''}${operator}`;
}

function termsTex(segment: Segment, dimension: 1 | 2, peierls: boolean): string[] {
  const cell0 = dimension === 1 ? 'j' : '\\mathbf R';
  const lines: string[] = [];
  for (const t of segment.onsite ?? []) {
    const energy = signedFactor(t.energy);
    lines.push(term(energy.negative, [energy.tex, modulationTex(t.modulation)], `n_{${site(t.orbital, cell0)}}`));
  }
  for (const [kind, terms] of [['hop', segment.hoppings ?? []], ['pair', segment.pairings ?? []]] as const) {
    for (const t of terms) {
      const amplitude = amplitudeTex(t.amplitude);
      const phase = peierls && kind === 'hop' ? `e^{i\\mathbf A(t)\\cdot\\mathbf d_{${orbitalTex(t.from)}${orbitalTex(t.to)}}}` : '';
      const factors = [amplitude.tex, modulationTex(t.modulation), phase];
      const created = `c^\\dagger_{${site(t.to, cellTex(t.offset, dimension))}}`;
      const other = kind === 'hop' ? `c_{${site(t.from, cell0)}}` : `c^\\dagger_{${site(t.from, cell0)}}`;
      if (amplitude.real && !phase) lines.push(term(amplitude.negative, factors, `\\left(${created} ${other} + \\mathrm{h.c.}\\right)`));
      else lines.push(`${amplitude.negative ? '-' : ''}\\left(${term(false, factors, `${created} ${other}`)} + \\mathrm{h.c.}\\right)`);
    }
  }
  return lines;
}

/** Terms joined with their signs: a, − b, + c. */
function joinTerms(lines: string[], separator: string): string {
  return lines.map((l, k) => (k === 0 ? l : l.startsWith('-') ? `- ${l.slice(1)}` : `+ ${l}`)).join(separator);
}

/** A time as a multiple of T when it is a simple fraction (T/4, 2T/5), else a number. */
export function timeTex(value: number, period: number): string {
  if (!Number.isFinite(value) || !Number.isFinite(period) || period <= 0) return numberTex(value);
  const x = value / period;
  if (Math.abs(x) < 1e-9) return '0';
  if (Math.abs(x - 1) < 1e-9) return 'T';
  for (let q = 2; q <= 12; q++) {
    const p = Math.round(x * q);
    if (Math.abs(x * q - p) < 1e-9 && p > 0) {
      const g = gcd(p, q);
      const [pp, qq] = [p / g, q / g];
      if (qq === 1) return `${pp}T`;
      return `${pp === 1 ? '' : pp}T/${qq}`;
    }
  }
  return numberTex(value);
}

function gcd(a: number, b: number): number {
  return b === 0 ? a : gcd(b, a % b);
}

function vectorPotentialTex(components: VectorPotentialSpec[], dimension: 1 | 2): string {
  const axes = dimension === 1 ? ['x'] : ['x', 'y'];
  const parts = axes.map((_, axis) => {
    const terms = components.filter((c) => c.amplitude[axis] !== undefined && c.amplitude[axis] !== 0).map((c) => componentTex(c, factorTex(c.amplitude[axis])));
    return terms.length > 0 ? terms.join(' + ').replace(/\+ -/g, '- ') : '0';
  });
  return dimension === 1 ? `A(t) = ${parts[0]}` : `\\mathbf A(t) = \\left(${parts.join(',\\; ')}\\right)`;
}

/**
 * Display TeX per segment, with the values written in the file:
 *   H_1(t) = \sum_{\mathbf R} [ J (c^\dagger_{B,\mathbf R} c_{A,\mathbf R} + h.c.) + … ],  0 ≤ t < τ.
 * `value` evaluates durations (for the time windows); `period` is T.
 */
export function hamiltonianFormulas(doc: ModelDocument, value: (q: Quantity) => number): HamiltonianFormulas {
  const dimension = doc.lattice.dimension;
  const period = value(doc.drive.period);
  const definitions = new Set<string>();
  let start = 0;
  let budget = MAX_TERMS_PER_PAGE;
  const sum = dimension === 1 ? '\\sum_{j}' : '\\sum_{\\mathbf R}';
  const segments = doc.drive.segments.map((segment, i): SegmentFormula => {
    const duration = value(segment.duration);
    const kick = duration === 0;
    const peierls = (segment.vectorPotential ?? []).length > 0;
    const lines = termsTex(segment, dimension, peierls);
    const shown = lines.slice(0, Math.max(0, Math.min(MAX_TERMS_SHOWN, budget)));
    budget -= shown.length;
    const omitted = lines.length - shown.length;
    if (omitted > 0) shown.push(`\\ldots\\;\\text{(${omitted} more terms)}`);
    if ([...(segment.onsite ?? []), ...(segment.hoppings ?? []), ...(segment.pairings ?? [])].some((t) => t.modulation?.kind === 'harmonic') || peierls) definitions.add('\\omega = 2\\pi/T');
    const name = kick ? `K_{${i + 1}}` : `H_{${i + 1}}(t)`;
    let body: string;
    if (shown.length === 0) body = `${name} = 0`;
    else if (shown.length === 1) body = `${name} = ${shown[0].startsWith('-') ? `-${sum} ${shown[0].slice(1)}` : `${sum} ${shown[0]}`}`;
    else if (shown.length <= 3) body = `${name} = ${sum} \\Big[ ${joinTerms(shown, ' ')} \\Big]`;
    else body = `\\begin{aligned} ${name} = ${sum} \\Big[\\, & ${joinTerms(shown, ' \\\\ & ')} \\,\\Big] \\end{aligned}`;
    const potential = peierls ? vectorPotentialTex(segment.vectorPotential!, dimension) : null;
    if (peierls) definitions.add(`\\mathbf d_{ab} = \\sum_i n_i\\mathbf a_i + \\mathbf r_b - \\mathbf r_a \\text{ (hop vector from } a \\text{ to } b)`);
    const window = kick ? `U_{${i + 1}} = e^{-iK_{${i + 1}}} \\text{ at } t = ${timeTex(start, period)}` : `${timeTex(start, period)} \\le t < ${timeTex(start + duration, period)}`;
    start += Number.isFinite(duration) ? duration : 0;
    return { index: i + 1, label: segment.label ?? null, window, kick, tex: body, potential, omitted };
  });
  if (doc.drive.segments.some((s) => (s.onsite ?? []).length > 0)) definitions.add(`n_{a,${dimension === 1 ? 'j' : '\\mathbf R'}} = c^\\dagger_{a,${dimension === 1 ? 'j' : '\\mathbf R'}} c_{a,${dimension === 1 ? 'j' : '\\mathbf R'}}`);
  return { dimension, segments, definitions: [...definitions] };
}
