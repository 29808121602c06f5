/**
 * Phase diagrams from parameter sweeps: a map of one computed quantity over one or
 * two parameters. Integer quantities get one fill per value (legend included);
 * unsettled points (null) are hatched grey so they are never mistaken for a phase.
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

const PALETTE = ['#e8e3d3', '#7fb3a8', '#2f6f73', '#d9a441', '#a4502f', '#6b5b95', '#3c4f76', '#9bb547'];

/** Fill for an integer value: 0 gets the pale fill, others cycle through the palette by value. */
export function fillFor(value: number): string {
  if (!Number.isInteger(value)) return '#bbbbbb';
  if (value === 0) return PALETTE[0];
  const index = value > 0 ? 2 * value - 1 : -2 * value;
  return PALETTE[1 + ((index - 1) % (PALETTE.length - 1))];
}

function axisFor(values: number[], label: string): Axis {
  const min = values[0] ?? 0;
  const max = values[values.length - 1] ?? 1;
  const ticks = [min, (min + max) / 2, max].map((v) => ({ value: v, label: String(Math.round(v * 1000) / 1000) }));
  return { label, min, max, ticks };
}

/** Cell edges around sample points, so each sample owns one rectangle. */
function cellEdges(values: number[]): number[] {
  if (values.length === 1) return [values[0] - 0.5, values[0] + 0.5];
  const edges = [values[0] - (values[1] - values[0]) / 2];
  for (let i = 0; i < values.length - 1; i++) edges.push((values[i] + values[i + 1]) / 2);
  edges.push(values[values.length - 1] + (values[values.length - 1] - values[values.length - 2]) / 2);
  return edges;
}

export function phaseDiagramPlot(input: PhaseDiagramInput): string {
  const [first, second] = input.axes;
  const xs = first.values;
  const ys = second ? second.values : [0];
  const xEdges = cellEdges(xs);
  const yEdges = second ? cellEdges(ys) : [0, 1];
  const xAxis = axisFor([xEdges[0], xEdges[xEdges.length - 1]], first.parameter);
  const yAxis = second ? axisFor([yEdges[0], yEdges[yEdges.length - 1]], second.parameter) : { label: input.quantity, min: 0, max: 1, ticks: [] };
  const frame = makeFrame(520, second ? 420 : 180, xAxis, yAxis);
  const cells: string[] = [];
  const seen = new Set<number>();
  for (let j = 0; j < ys.length; j++) {
    for (let i = 0; i < xs.length; i++) {
      const value = input.values[j * xs.length + i];
      const x0 = frame.x(xEdges[i]), x1 = frame.x(xEdges[i + 1]);
      const y0 = frame.y(yEdges[j + 1]), y1 = frame.y(yEdges[j]);
      const fill = value === null || value === undefined ? 'url(#unsettled-hatch)' : fillFor(value);
      if (value !== null && value !== undefined) seen.add(value);
      const tip = value === null || value === undefined ? 'unsettled' : String(value);
      cells.push(`<rect x="${f(x0)}" y="${f(y0)}" width="${f(x1 - x0 + 0.3)}" height="${f(y1 - y0 + 0.3)}" fill="${fill}"><title>${escapeHtml(`${first.parameter}=${xs[i]}${second ? `, ${second.parameter}=${ys[j]}` : ''}: ${tip}`)}</title></rect>`);
    }
  }
  const defs = '<defs><pattern id="unsettled-hatch" width="6" height="6" patternUnits="userSpaceOnUse" patternTransform="rotate(45)"><rect width="6" height="6" fill="#dddddd"/><line x1="0" y1="0" x2="0" y2="6" stroke="#999999" stroke-width="2"/></pattern></defs>';
  const legendValues = [...seen].sort((a, b) => a - b);
  const legend = legendValues
    .map((v, n) => `<g transform="translate(${frame.left + n * 64} ${frame.height - 2})"><rect y="-10" width="10" height="10" fill="${fillFor(v)}"/><text x="14" class="plot-tick-label">${escapeHtml(`${input.quantity} = ${v}`)}</text></g>`)
    .join('');
  return svgDocument(frame, input.title, defs + cells.join('') + drawAxes(frame, xAxis, yAxis) + legend);
}
