/**
 * Phase diagrams from parameter sweeps: a map of one computed quantity over one or
 * two parameters. Integer quantities (invariants) get one fill per value; real
 * quantities (minimal gaps) a light-to-dark ramp; unsettled points (null) are
 * hatched grey so they are never mistaken for a phase. Over one parameter, a real
 * quantity is drawn as a curve instead.
 */
import { escapeHtml } from '../markdown.ts';
import { drawAxes, formatCoordinate as f, makeFrame, svgDocument, type Axis } from './svg-frame.ts';

export interface SweepAxisInput {
  parameter: string;
  values: number[];
}

export interface PhaseDiagramInput {
  title: string;
  quantity: string;
  axes: SweepAxisInput[];
  /** Values in grid order, first axis varying fastest; null = unsettled. */
  values: (number | null)[];
}

export interface LegendEntry {
  fill: string;
  text: string;
}

export interface PhaseDiagram {
  svg: string;
  legend: LegendEntry[];
}

const PALETTE = ['#e8e3d3', '#7fb3a8', '#d9a441', '#2f6f73', '#a4502f', '#6b5b95', '#3c4f76', '#9bb547'];
export const UNSETTLED_FILL = 'url(#unsettled-hatch)';

/** Fill for an integer value: 0 pale, then 1, −1, 2, −2, … through the palette. */
export function fillForInteger(value: number): string {
  if (value === 0) return PALETTE[0];
  const index = value > 0 ? 2 * value - 1 : -2 * value;
  return PALETTE[1 + ((index - 1) % (PALETTE.length - 1))];
}

/** Light-to-dark ramp for a real value in [min, max]. */
export function fillForReal(value: number, min: number, max: number): string {
  const x = max > min ? Math.min(1, Math.max(0, (value - min) / (max - min))) : 0.5;
  const from = [240, 236, 222], to = [31, 85, 90];
  const channel = (i: number) => Math.round(from[i] + (to[i] - from[i]) * x);
  return `rgb(${channel(0)}, ${channel(1)}, ${channel(2)})`;
}

const round = (v: number) => String(Math.round(v * 1000) / 1000);

function sampleAxis(values: number[], label: string, lo: number, hi: number): Axis {
  const first = values[0] ?? 0, last = values[values.length - 1] ?? 1;
  const ticks = values.length > 1 ? [first, (first + last) / 2, last] : [first];
  return { label, min: lo, max: hi, ticks: ticks.map((v) => ({ value: v, label: round(v) })) };
}

/** Cell edges around sample points, so each sample owns one rectangle. */
function cellEdges(values: number[]): number[] {
  if (values.length === 1) return [values[0] - 0.5, values[0] + 0.5];
  const edges = [values[0] - (values[1] - values[0]) / 2];
  for (let i = 0; i < values.length - 1; i++) edges.push((values[i] + values[i + 1]) / 2);
  edges.push(values[values.length - 1] + (values[values.length - 1] - values[values.length - 2]) / 2);
  return edges;
}

const HATCH = '<defs><pattern id="unsettled-hatch" width="6" height="6" patternUnits="userSpaceOnUse" patternTransform="rotate(45)"><rect width="6" height="6" fill="#dddddd"/><line x1="0" y1="0" x2="0" y2="6" stroke="#999999" stroke-width="2"/></pattern></defs>';

function curve(input: PhaseDiagramInput): PhaseDiagram {
  const xs = input.axes[0].values;
  const settled = input.values.filter((v): v is number => v !== null);
  const top = settled.length ? Math.max(...settled) : 1;
  const xAxis = sampleAxis(xs, input.axes[0].parameter, xs[0], xs[xs.length - 1]);
  const yAxis: Axis = { label: input.quantity, min: 0, max: top * 1.05 || 1, ticks: [0, top].map((v) => ({ value: v, label: round(v) })) };
  const frame = makeFrame(520, 240, xAxis, yAxis);
  const segments: string[] = [];
  let current: string[] = [];
  input.values.forEach((v, i) => {
    if (v === null) {
      if (current.length) segments.push(current.join(' '));
      current = [];
    } else current.push(`${f(frame.x(xs[i]))},${f(frame.y(v))}`);
  });
  if (current.length) segments.push(current.join(' '));
  const gaps = input.values
    .map((v, i) => (v === null ? `<circle cx="${f(frame.x(xs[i]))}" cy="${f(frame.y(0))}" r="3" fill="#999999"><title>${escapeHtml(`${input.axes[0].parameter}=${xs[i]}: unsettled`)}</title></circle>` : ''))
    .join('');
  const body = drawAxes(frame, xAxis, yAxis) + segments.map((points) => `<polyline points="${points}" fill="none" stroke="#2f6f73" stroke-width="1.5"/>`).join('') + gaps;
  return { svg: svgDocument(frame, input.title, body), legend: [{ fill: '#999999', text: 'unsettled point' }] };
}

export function phaseDiagramPlot(input: PhaseDiagramInput): PhaseDiagram {
  const settled = input.values.filter((v): v is number => v !== null);
  const integer = settled.every((v) => Number.isInteger(v));
  if (input.axes.length === 1 && !integer) return curve(input);
  const [first, second] = input.axes;
  const xs = first.values;
  const ys = second ? second.values : [0];
  const xEdges = cellEdges(xs);
  const yEdges = second ? cellEdges(ys) : [0, 1];
  const xAxis = sampleAxis(xs, first.parameter, xEdges[0], xEdges[xEdges.length - 1]);
  const yAxis: Axis = second ? sampleAxis(ys, second.parameter, yEdges[0], yEdges[yEdges.length - 1]) : { label: '', min: 0, max: 1, ticks: [] };
  const frame = makeFrame(520, second ? 420 : 150, xAxis, yAxis);
  const lo = settled.length ? Math.min(...settled) : 0;
  const hi = settled.length ? Math.max(...settled) : 1;
  const fill = (v: number) => (integer ? fillForInteger(v) : fillForReal(v, lo, hi));
  const cells: string[] = [];
  for (let j = 0; j < ys.length; j++) {
    for (let i = 0; i < xs.length; i++) {
      const value = input.values[j * xs.length + i] ?? null;
      const x0 = frame.x(xEdges[i]), x1 = frame.x(xEdges[i + 1]);
      const y0 = frame.y(yEdges[j + 1]), y1 = frame.y(yEdges[j]);
      const where = `${first.parameter}=${xs[i]}${second ? `, ${second.parameter}=${ys[j]}` : ''}`;
      cells.push(`<rect x="${f(x0)}" y="${f(y0)}" width="${f(x1 - x0 + 0.3)}" height="${f(y1 - y0 + 0.3)}" fill="${value === null ? UNSETTLED_FILL : fill(value)}"><title>${escapeHtml(`${where}: ${value === null ? 'unsettled' : round(value)}`)}</title></rect>`);
    }
  }
  const legend: LegendEntry[] = integer
    ? [...new Set(settled)].sort((a, b) => a - b).map((v) => ({ fill: fillForInteger(v), text: `${input.quantity} = ${v}` }))
    : [{ fill: fillForReal(lo, lo, hi), text: `${input.quantity} = ${round(lo)}` }, { fill: fillForReal(hi, lo, hi), text: `${input.quantity} = ${round(hi)}` }];
  if (settled.length < input.values.length) legend.push({ fill: '#cccccc', text: 'unsettled (hatched)' });
  return { svg: svgDocument(frame, input.title, HATCH + cells.join('') + drawAxes(frame, xAxis, yAxis)), legend };
}
