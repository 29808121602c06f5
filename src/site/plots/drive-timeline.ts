/**
 * The drive over one period: segments as numbered blocks on a time axis from
 * 0 to T (ticks at the segment boundaries, as fractions of T where they are
 * simple), kicks as spikes, and beneath, the time dependence of modulated
 * terms and of the vector potential, each scaled to its largest value.
 */
import type { ModelDocument, Quantity, HarmonicComponent, Modulation } from '../../catalogue/model-types.generated.ts';
import { escapeHtml } from '../render/escape.ts';
import { fmt, FIGURE_WIDTH, SERIES, svgDocument, svgText, type Tick } from './svg.ts';

export interface TimelineSegment {
  index: number;
  label: string | null;
  start: number;
  duration: number;
}

export interface TimelineCurve {
  /** What is plotted: "f(t) of J (segment 2)", "A_x(t)". */
  label: string;
  /** Times and values (scaled to a maximum of 1 in magnitude). */
  points: [number, number][];
}

export interface Timeline {
  period: number;
  segments: TimelineSegment[];
  curves: TimelineCurve[];
}

const MAX_CURVES = 4;

function harmonicValue(components: (HarmonicComponent | { amplitude: number; harmonic: number; function: 'cos' | 'sin'; phase?: Quantity })[], mean: number, t: number, period: number, value: (q: Quantity) => number): number {
  const omega = (2 * Math.PI) / period;
  let f = mean;
  for (const c of components) {
    const argument = c.harmonic * omega * t + value(c.phase ?? 0);
    f += value(c.amplitude) * (c.function === 'cos' ? Math.cos(argument) : Math.sin(argument));
  }
  return f;
}

function sample(start: number, duration: number, f: (t: number) => number): [number, number][] {
  const n = 48;
  return Array.from({ length: n + 1 }, (_, i) => {
    const t = start + (duration * i) / n;
    return [t, f(t)] as [number, number];
  });
}

function scaled(points: [number, number][]): [number, number][] {
  const top = Math.max(...points.map(([, v]) => Math.abs(v)), 1e-300);
  return points.map(([t, v]) => [t, v / top]);
}

/** Segment windows and the curves of modulated terms and vector potentials. */
export function timeline(doc: ModelDocument, value: (q: Quantity) => number): Timeline {
  const period = value(doc.drive.period);
  let start = 0;
  const segments: TimelineSegment[] = [];
  const curves: TimelineCurve[] = [];
  doc.drive.segments.forEach((s, i) => {
    const duration = value(s.duration);
    segments.push({ index: i + 1, label: s.label ?? null, start, duration });
    if (duration > 0) {
      const seen = new Set<string>();
      const terms: { name: string; modulation: Modulation | undefined }[] = [
        ...(s.onsite ?? []).map((t) => ({ name: `on-site ${t.orbital}`, modulation: t.modulation })),
        ...(s.hoppings ?? []).map((t) => ({ name: `hopping ${t.from}→${t.to}`, modulation: t.modulation })),
        ...(s.pairings ?? []).map((t) => ({ name: `pairing ${t.from}→${t.to}`, modulation: t.modulation })),
      ];
      for (const term of terms) {
        const m = term.modulation;
        if (!m || m.kind !== 'harmonic') continue;
        const key = JSON.stringify(m);
        if (seen.has(key)) continue;
        seen.add(key);
        const mean = m.mean === undefined ? 0 : value(m.mean);
        curves.push({ label: `f(t) of the ${term.name} term, segment ${i + 1}`, points: scaled(sample(start, duration, (t) => harmonicValue(m.components, mean, t, period, value))) });
      }
      const potential = s.vectorPotential ?? [];
      if (potential.some((c) => c.harmonic !== 0)) {
        const axes = doc.lattice.dimension === 1 ? ['x'] : ['x', 'y'];
        axes.forEach((axis, k) => {
          const components = potential.map((c) => ({ amplitude: value(c.amplitude[k] ?? 0), harmonic: c.harmonic, function: c.function, phase: c.phase }));
          if (components.every((c) => c.amplitude === 0)) return;
          curves.push({ label: `A_${axis}(t), segment ${i + 1}`, points: scaled(sample(start, duration, (t) => harmonicValue(components, 0, t, period, value))) });
        });
      }
    }
    start += Number.isFinite(duration) ? duration : 0;
  });
  return { period, segments, curves: curves.slice(0, MAX_CURVES) };
}

/** A time as text: 0, T, T/5, 2T/5, else a decimal multiple of T. */
export function timeText(t: number, period: number): string {
  const x = t / period;
  if (Math.abs(x) < 1e-9) return '0';
  if (Math.abs(x - 1) < 1e-9) return 'T';
  for (let q = 2; q <= 12; q++) {
    const p = Math.round(x * q);
    if (p > 0 && Math.abs(x * q - p) < 1e-9) {
      const g = gcdOf(p, q);
      return `${p / g === 1 ? '' : p / g}T/${q / g}`;
    }
  }
  return `${Number(x.toPrecision(3))}T`;
}

function gcdOf(a: number, b: number): number {
  return b === 0 ? a : gcdOf(b, a % b);
}

export function timelinePlot(t: Timeline): string {
  const left = 62, right = 14, barTop = 26, barHeight = 34;
  const curvePanel = t.curves.length > 0 ? 96 : 0;
  const axisY = barTop + barHeight + (curvePanel ? curvePanel + 12 : 0);
  const height = axisY + 40;
  const width = FIGURE_WIDTH;
  const x = (time: number) => left + (time / (t.period || 1)) * (width - left - right);
  const parts: string[] = [];
  const boundaries = [...new Set([0, ...t.segments.map((s) => s.start + s.duration), t.period].map((v) => Number(v.toPrecision(12))))].sort((a, b) => a - b);
  const ticks: Tick[] = (boundaries.length <= 9 ? boundaries : [0, t.period / 2, t.period]).map((v) => ({ value: v, label: timeText(v, t.period) }));
  t.segments.forEach((s, i) => {
    if (s.duration === 0) {
      const kx = fmt(x(s.start));
      parts.push(`<path d="M${kx} ${barTop - 6}V${barTop + barHeight}" class="kick-line"/><path d="M${kx} ${barTop - 12}l5 8h-10z" class="kick-head"/><text x="${kx}" y="${barTop - 15}" text-anchor="middle" class="plot-label">${s.index}</text>`);
      return;
    }
    const x0 = x(s.start), x1 = x(s.start + s.duration);
    parts.push(`<rect x="${fmt(x0)}" y="${barTop}" width="${fmt(Math.max(0.5, x1 - x0))}" height="${barHeight}" class="segment-block segment-${i % 2 === 0 ? 'even' : 'odd'}"/>`);
    if (x1 - x0 >= 14) parts.push(`<text x="${fmt((x0 + x1) / 2)}" y="${barTop + barHeight / 2}" dy="0.35em" text-anchor="middle" class="plot-label">${s.index}</text>`);
  });
  if (curvePanel) {
    const top = barTop + barHeight + 12, mid = top + curvePanel / 2, amp = curvePanel / 2 - 6;
    parts.push(`<rect x="${left}" y="${top}" width="${width - left - right}" height="${curvePanel}" class="plot-box"/><line x1="${left}" x2="${width - right}" y1="${mid}" y2="${mid}" class="plot-grid-line"/>`);
    parts.push(`<text transform="translate(15 ${mid}) rotate(-90)" text-anchor="middle" class="plot-axis-label">scaled</text>`);
    t.curves.forEach((c, k) => {
      const style = SERIES[k % SERIES.length];
      const d = c.points.map(([time, v], i) => `${i === 0 ? 'M' : 'L'}${fmt(x(time))} ${fmt(mid - v * amp)}`).join('');
      parts.push(`<path d="${d}" fill="none" stroke="${style.colour}" stroke-width="2"${style.dash ? ` stroke-dasharray="${style.dash}"` : ''}/>`);
    });
  }
  parts.push(`<line x1="${left}" x2="${width - right}" y1="${axisY}" y2="${axisY}" class="plot-tick"/>`);
  for (const tick of ticks) {
    const tx = fmt(x(tick.value));
    parts.push(`<line x1="${tx}" x2="${tx}" y1="${axisY}" y2="${axisY + 5}" class="plot-tick"/><text x="${tx}" y="${axisY + 19}" text-anchor="middle" class="plot-tick-label">${escapeHtml(tick.label)}</text>`);
  }
  parts.push(`<text x="${fmt(left + (width - left - right) / 2)}" y="${height - 4}" text-anchor="middle" class="plot-axis-label">${svgText('time t in one period')}</text>`);
  return svgDocument(width, height, `Drive over one period: ${t.segments.length} segment(s)`, parts.join(''));
}
