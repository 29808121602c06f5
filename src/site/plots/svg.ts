/**
 * Shared geometry and style of the build-time SVG figures: a plotting frame
 * with linear axes, ticks (plain, π-multiples or named), axis labels with
 * units, hatch patterns and markers. Figures are plain SVG strings: no client
 * code, they print and scale. Sizes are chosen so that text stays readable
 * at 100 % on a laptop (figures shown up to ~1.25× their viewBox) and on a
 * phone (~0.85×): the viewBox is 420 units wide and text is 13 units.
 *
 * Colours: the Okabe–Ito palette (Okabe & Ito, "Color Universal Design",
 * 2008), distinguishable with the common colour-vision deficiencies; anything
 * a colour says is also said by a shape, a dash pattern, a hatch or a label.
 */
import { escapeHtml } from '../render/escape.ts';

export const FIGURE_WIDTH = 420;

/** Okabe–Ito colours. */
export const OKABE_ITO = {
  blue: '#0072B2',
  vermillion: '#D55E00',
  green: '#009E73',
  purple: '#CC79A7',
  orange: '#E69F00',
  sky: '#56B4E9',
  yellow: '#F0E442',
  black: '#000000',
} as const;
/**
 * Colours in order of use, each with its second channel: a dash pattern for
 * lines, a marker shape for points (orbitals in lattice drawings).
 */
export const SERIES: { colour: string; dash: string; marker: 'circle' | 'square' | 'triangleUp' | 'diamond' | 'triangleDown' }[] = [
  { colour: OKABE_ITO.blue, dash: '', marker: 'circle' },
  { colour: OKABE_ITO.vermillion, dash: '6 3', marker: 'square' },
  { colour: OKABE_ITO.green, dash: '2 2', marker: 'triangleUp' },
  { colour: OKABE_ITO.purple, dash: '8 3 2 3', marker: 'diamond' },
  { colour: OKABE_ITO.orange, dash: '4 4', marker: 'triangleDown' },
  { colour: OKABE_ITO.sky, dash: '1 3', marker: 'circle' },
];

export interface Tick {
  value: number;
  label: string;
}

export interface Axis {
  /** Axis title with units, e.g. "quasienergy ε". */
  label: string;
  min: number;
  max: number;
  ticks: Tick[];
}

export interface Frame {
  width: number;
  height: number;
  left: number;
  right: number;
  top: number;
  bottom: number;
  x(value: number): number;
  y(value: number): number;
  plotWidth: number;
  plotHeight: number;
}

export interface Margins {
  left: number;
  right: number;
  top: number;
  bottom: number;
}

const DEFAULT_MARGINS: Margins = { left: 70, right: 14, top: 14, bottom: 46 };

export function makeFrame(width: number, height: number, xAxis: Pick<Axis, 'min' | 'max'>, yAxis: Pick<Axis, 'min' | 'max'>, margins: Margins = DEFAULT_MARGINS): Frame {
  const { left, right, top, bottom } = margins;
  const plotWidth = width - left - right;
  const plotHeight = height - top - bottom;
  const xSpan = xAxis.max - xAxis.min || 1;
  const ySpan = yAxis.max - yAxis.min || 1;
  return {
    width, height, left, right, top, bottom, plotWidth, plotHeight,
    x: (value) => left + ((value - xAxis.min) / xSpan) * plotWidth,
    y: (value) => top + (1 - (value - yAxis.min) / ySpan) * plotHeight,
  };
}

/** A coordinate with one decimal: enough for any screen, and short. */
export function fmt(value: number): string {
  const r = Math.round(value * 10) / 10;
  return Object.is(r, -0) ? '0' : String(r);
}

const minus = (text: string) => text.replace(/^-/, '−');

/** Text with "_" subscripts as SVG tspans (W_π → W<tspan …>π</tspan>). */
export function svgText(text: string): string {
  return escapeHtml(text).replace(/([\p{L}\p{N}′″)])_(?:\{([^}]*)\}|([\p{L}\p{N}π/−.]+?(?=[\s,;:)]|$)))/gu, (_, base: string, group?: string, run?: string) => `${base}<tspan class="sub" dy="0.3em">${group ?? run}</tspan><tspan dy="-0.3em">\u200a</tspan>`);
}

export function drawAxes(frame: Frame, xAxis: Axis, yAxis: Axis, options: { xTitle?: boolean; yTitle?: boolean; box?: boolean } = {}): string {
  const { left, top, width, height, right, bottom } = frame;
  const parts: string[] = [];
  if (options.box !== false) parts.push(`<rect x="${left}" y="${top}" width="${fmt(width - left - right)}" height="${fmt(height - top - bottom)}" class="plot-box"/>`);
  for (const tick of xAxis.ticks) {
    const x = fmt(frame.x(tick.value));
    parts.push(`<line x1="${x}" x2="${x}" y1="${height - bottom}" y2="${height - bottom + 5}" class="plot-tick"/>`);
    parts.push(`<text x="${x}" y="${height - bottom + 19}" text-anchor="middle" class="plot-tick-label">${svgText(tick.label)}</text>`);
  }
  for (const tick of yAxis.ticks) {
    const y = fmt(frame.y(tick.value));
    parts.push(`<line x1="${left - 5}" x2="${left}" y1="${y}" y2="${y}" class="plot-tick"/>`);
    parts.push(`<text x="${left - 8}" y="${y}" dy="0.35em" text-anchor="end" class="plot-tick-label">${svgText(tick.label)}</text>`);
  }
  if (options.xTitle !== false && xAxis.label) parts.push(`<text x="${fmt(left + (width - left - right) / 2)}" y="${height - 8}" text-anchor="middle" class="plot-axis-label">${svgText(xAxis.label)}</text>`);
  if (options.yTitle !== false && yAxis.label) parts.push(`<text transform="translate(15 ${fmt(top + (height - top - bottom) / 2)}) rotate(-90)" text-anchor="middle" class="plot-axis-label">${svgText(yAxis.label)}</text>`);
  return parts.join('');
}

/** The whole figure: an accessible SVG with a title and description. */
export function svgDocument(width: number, height: number, title: string, body: string, className = ''): string {
  return `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 ${fmt(width)} ${fmt(height)}" role="img" aria-label="${escapeHtml(title)}" class="plot${className ? ` ${className}` : ''}"><title>${escapeHtml(title)}</title>${body}</svg>`;
}

function gcd(a: number, b: number): number {
  return b === 0 ? a : gcd(b, a % b);
}

/** p/q·π as text: π, −π/2, 3π/4, 2π. */
function piFraction(p: number, q: number, unit = 'π'): string {
  if (p === 0) return '0';
  const g = gcd(Math.abs(p), q);
  const [n, d] = [p / g, q / g];
  const sign = n < 0 ? '−' : '';
  const head = Math.abs(n) === 1 ? unit : `${Math.abs(n)}${unit}`;
  return d === 1 ? `${sign}${head}` : `${sign}${head}/${d}`;
}

/** Whether a value is a multiple of π/12 (so π ticks read naturally). */
export function isPiMultiple(value: number): boolean {
  const x = (value / Math.PI) * 12;
  return Math.abs(x - Math.round(x)) < 1e-6;
}

/** Ticks at multiples of π/q between min and max, q chosen for 4–7 ticks. */
export function piTicks(min: number, max: number): Tick[] {
  for (const q of [1, 2, 4, 6, 8, 12]) {
    const step = Math.PI / q;
    const first = Math.ceil(min / step - 1e-9), last = Math.floor(max / step + 1e-9);
    const n = last - first + 1;
    if (n >= 4 || q === 12) {
      const stride = Math.max(1, Math.ceil(n / 7));
      const ticks: Tick[] = [];
      for (let k = first; k <= last; k += stride) ticks.push({ value: k * step, label: piFraction(k, q) });
      return ticks;
    }
  }
  return [];
}

/** "Nice" decimal ticks (1, 2, 2.5, 5 × 10ᵏ): the finest spacing that gives at most `most` ticks. */
export function niceTicks(min: number, max: number, most = 7): Tick[] {
  if (!(max > min)) return [{ value: min, label: minus(String(Number(min.toPrecision(3)))) }];
  const k0 = Math.floor(Math.log10(max - min)) - 1;
  const steps = [0, 1, 2].flatMap((d) => [1, 2, 2.5, 5].map((m) => m * 10 ** (k0 + d)));
  const count = (step: number) => Math.floor(max / step + 1e-9) - Math.ceil(min / step - 1e-9) + 1;
  const step = steps.find((s) => count(s) <= most) ?? steps[steps.length - 1];
  const ticks: Tick[] = [];
  for (let k = Math.ceil(min / step - 1e-9); k * step <= max + step * 1e-9; k++) {
    const value = k === 0 ? 0 : k * step;
    ticks.push({ value, label: minus(String(Number(value.toPrecision(6)))) });
  }
  return ticks;
}

/** Ticks for a parameter axis: π multiples when the range is made of them, else decimal. */
export function parameterTicks(values: number[]): Tick[] {
  const min = Math.min(...values), max = Math.max(...values);
  if (isPiMultiple(min) && isPiMultiple(max) && max - min >= Math.PI / 4) return piTicks(min, max);
  return niceTicks(min, max);
}

/** The quasienergy axis: ε from −π/T to π/T with π ticks. */
export function quasienergyAxis(label = 'quasienergy ε'): Axis {
  return {
    label,
    min: -1,
    max: 1,
    ticks: [
      { value: -1, label: '−π/T' },
      { value: -0.5, label: '−π/2T' },
      { value: 0, label: '0' },
      { value: 0.5, label: 'π/2T' },
      { value: 1, label: 'π/T' },
    ],
  };
}

/** Hatch patterns: the second channel of region fills. Ids are prefixed per figure. */
export const HATCHES = ['', 'diagonal', 'dots', 'antidiagonal', 'cross', 'horizontal', 'vertical'] as const;
export type Hatch = (typeof HATCHES)[number] | 'unsettled';

export function hatchPattern(id: string, kind: Hatch, colour = '#5b6470'): string {
  const open = (size: number, rotate = 0) => `<pattern id="${id}" width="${size}" height="${size}" patternUnits="userSpaceOnUse"${rotate ? ` patternTransform="rotate(${rotate})"` : ''}>`;
  switch (kind) {
    case 'diagonal':
      return `${open(7, 45)}<line x1="0" y1="0" x2="0" y2="7" stroke="${colour}" stroke-width="1" stroke-opacity="0.55"/></pattern>`;
    case 'antidiagonal':
      return `${open(7, -45)}<line x1="0" y1="0" x2="0" y2="7" stroke="${colour}" stroke-width="1" stroke-opacity="0.55"/></pattern>`;
    case 'dots':
      return `${open(6)}<circle cx="3" cy="3" r="1.1" fill="${colour}" fill-opacity="0.6"/></pattern>`;
    case 'cross':
      return `${open(8, 45)}<path d="M0 4H8M4 0V8" stroke="${colour}" stroke-width="0.9" stroke-opacity="0.5"/></pattern>`;
    case 'horizontal':
      return `${open(6)}<line x1="0" y1="3" x2="6" y2="3" stroke="${colour}" stroke-width="1" stroke-opacity="0.55"/></pattern>`;
    case 'vertical':
      return `${open(6)}<line x1="3" y1="0" x2="3" y2="6" stroke="${colour}" stroke-width="1" stroke-opacity="0.55"/></pattern>`;
    case 'unsettled':
      return `${open(5, 45)}<rect width="5" height="5" fill="#e4e4e4"/><line x1="0" y1="0" x2="0" y2="5" stroke="#6b6b6b" stroke-width="1.6"/></pattern>`;
    default:
      return '';
  }
}

/** A legend swatch as a tiny inline SVG (HTML text stays readable on phones). */
export function swatch(fill: string, hatch: Hatch, id: string, shape: 'square' | 'line' = 'square', dash = ''): string {
  if (shape === 'line') return `<svg class="swatch" viewBox="0 0 24 12" aria-hidden="true"><line x1="1" y1="6" x2="23" y2="6" stroke="${fill}" stroke-width="2.5"${dash ? ` stroke-dasharray="${dash}"` : ''}/></svg>`;
  const pattern = hatch ? hatchPattern(id, hatch) : '';
  return `<svg class="swatch" viewBox="0 0 16 16" aria-hidden="true">${pattern ? `<defs>${pattern}</defs>` : ''}<rect x="0.5" y="0.5" width="15" height="15" fill="${fill}" stroke="#8a939d"/>${pattern ? `<rect x="0.5" y="0.5" width="15" height="15" fill="url(#${id})"/>` : ''}</svg>`;
}

/**
 * Marker shapes as relative path data: a start offset from the point and the
 * outline in relative commands, so one marker costs a few bytes per point.
 */
export const MARKERS = {
  circle: (r: number) => ({ start: [-r, 0] as const, outline: `a${fmt(r)} ${fmt(r)} 0 1 0 ${fmt(2 * r)} 0a${fmt(r)} ${fmt(r)} 0 1 0 ${fmt(-2 * r)} 0` }),
  triangleUp: (r: number) => ({ start: [0, -1.15 * r] as const, outline: `l${fmt(r)} ${fmt(1.85 * r)}h${fmt(-2 * r)}z` }),
  triangleDown: (r: number) => ({ start: [0, 1.15 * r] as const, outline: `l${fmt(r)} ${fmt(-1.85 * r)}h${fmt(-2 * r)}z` }),
  diamond: (r: number) => ({ start: [0, -1.2 * r] as const, outline: `l${fmt(r)} ${fmt(1.2 * r)}l${fmt(-r)} ${fmt(1.2 * r)}l${fmt(-r)} ${fmt(-1.2 * r)}z` }),
  square: (r: number) => ({ start: [-r, -r] as const, outline: `h${fmt(2 * r)}v${fmt(2 * r)}h${fmt(-2 * r)}z` }),
} as const;

/** Many markers of one shape as one path. */
export function markerPath(points: [number, number][], marker: keyof typeof MARKERS, size: number): string {
  const { start, outline } = MARKERS[marker](size);
  return points.map(([x, y]) => `M${fmt(x + start[0])} ${fmt(y + start[1])}${outline}`).join('');
}
