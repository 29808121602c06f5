/**
 * Phase diagrams over two parameters, drawn as papers draw them: one map per
 * sweep, each region filled by the tuple of invariants that names the phase
 * (a tint and a hatch per phase) and labelled with its values, unsettled
 * points hatched grey, the model's own point marked; and a separate heat map
 * of the smallest gap with a scale bar in units of π/T.
 *
 * Compactness: equal neighbouring cells in a row are merged into one run, and
 * all runs of one phase are one <path>, so a 41 × 41 map is a few kilobytes.
 */
import { escapeHtml } from '../render/escape.ts';
import type { SweepData } from '../sweeps.ts';
import { tupleKey, tupleName } from '../sweeps.ts';
import { drawAxes, fmt, FIGURE_WIDTH, hatchPattern, HATCHES, makeFrame, parameterTicks, svgDocument, svgText, type Axis, type Frame, type Hatch } from './svg.ts';

/** Region tints (light Okabe–Ito colours) in order of use; the first is kept for the trivial phase. */
const TINTS = ['#f4f4f1', '#cfe6f5', '#f9d9b9', '#c4e8d9', '#f0d0e3', '#faf3b4', '#b9d3ea', '#f3c9b3'];
const UNSETTLED = 'unsettled';

export interface PhaseLegendEntry {
  key: string;
  fill: string;
  hatch: Hatch;
  text: string;
}

export interface PhaseMap {
  svg: string;
  legend: PhaseLegendEntry[];
  /** Name of the tuple, e.g. "(ν_0, ν_π)". */
  tuple: string;
}

/** Cell edges around sample points, so each sample owns one interval (the ends extend by half a spacing). */
export function cellEdges(values: number[]): number[] {
  if (values.length === 1) return [values[0] - 0.5, values[0] + 0.5];
  const edges = [values[0] - (values[1] - values[0]) / 2];
  for (let i = 0; i < values.length - 1; i++) edges.push((values[i] + values[i + 1]) / 2);
  edges.push(values[values.length - 1] + (values[values.length - 1] - values[values.length - 2]) / 2);
  return edges;
}

function axisFor(values: number[], symbol: string): Axis {
  const edges = cellEdges(values);
  return { label: symbol, min: Math.min(edges[0], edges[edges.length - 1]), max: Math.max(edges[0], edges[edges.length - 1]), ticks: parameterTicks(values) };
}

/** Sorting of phase names: trivial first, then by the numbers in them. */
function keyOrder(a: string, b: string): number {
  const nums = (k: string) => k.replace(/[()]/g, '').split(',').map((x) => Number(x.trim().replace('−', '-')));
  const trivial = (k: string) => nums(k).every((v) => v === 0);
  if (trivial(a) !== trivial(b)) return trivial(a) ? -1 : 1;
  const x = nums(a), y = nums(b);
  for (let i = 0; i < Math.min(x.length, y.length); i++) if (x[i] !== y[i]) return Math.abs(x[i]) - Math.abs(y[i]) || x[i] - y[i];
  return 0;
}

/** Runs of equal cells, row by row, as one path per class: "M x y h w v h h -w z". */
function runPaths(keys: (string | null)[], nx: number, ny: number, frame: Frame, xEdges: number[], yEdges: number[]): Map<string, string> {
  const paths = new Map<string, string[]>();
  for (let j = 0; j < ny; j++) {
    let i = 0;
    while (i < nx) {
      const key = keys[j * nx + i] ?? UNSETTLED;
      let end = i + 1;
      while (end < nx && (keys[j * nx + end] ?? UNSETTLED) === key) end++;
      const x0 = frame.x(xEdges[i]), x1 = frame.x(xEdges[end]);
      const y0 = frame.y(yEdges[j + 1]), y1 = frame.y(yEdges[j]);
      const [left, right] = [Math.min(x0, x1), Math.max(x0, x1)];
      const [top, bottom] = [Math.min(y0, y1), Math.max(y0, y1)];
      // A hair of overlap keeps anti-aliasing seams out of the fill.
      const list = paths.get(key) ?? [];
      list.push(`M${fmt(left)} ${fmt(top)}h${fmt(right - left + 0.4)}v${fmt(bottom - top + 0.4)}h${fmt(-(right - left + 0.4))}z`);
      paths.set(key, list);
      i = end;
    }
  }
  return new Map([...paths].map(([k, v]) => [k, v.join('')]));
}

/** For each large connected region: the cell deepest inside it (farthest from its border), for the label. */
export function labelCells(keys: (string | null)[], nx: number, ny: number, minimumCells: number): { key: string; cell: number }[] {
  const seen = new Uint8Array(keys.length);
  const out: { key: string; cell: number }[] = [];
  const neighbours = (c: number) => {
    const i = c % nx, j = Math.floor(c / nx);
    return [i > 0 ? c - 1 : -1, i < nx - 1 ? c + 1 : -1, j > 0 ? c - nx : -1, j < ny - 1 ? c + nx : -1];
  };
  for (let start = 0; start < keys.length; start++) {
    const key = keys[start];
    if (seen[start] || key === null) continue;
    const component: number[] = [];
    const queue = [start];
    seen[start] = 1;
    while (queue.length > 0) {
      const c = queue.pop()!;
      component.push(c);
      for (const n of neighbours(c)) if (n >= 0 && !seen[n] && keys[n] === key) (seen[n] = 1), queue.push(n);
    }
    if (component.length < minimumCells) continue;
    // Distance to the border by breadth-first search from the border cells (the grid edge counts as border).
    const inside = new Set(component);
    const distance = new Map<number, number>();
    let frontier = component.filter((c) => neighbours(c).some((n) => n < 0 || !inside.has(n)));
    for (const c of frontier) distance.set(c, 0);
    while (frontier.length > 0) {
      const next: number[] = [];
      for (const c of frontier) for (const n of neighbours(c)) if (n >= 0 && inside.has(n) && !distance.has(n)) (distance.set(n, distance.get(c)! + 1), next.push(n));
      frontier = next;
    }
    let best = component[0];
    for (const c of component) if (distance.get(c)! > distance.get(best)!) best = c;
    out.push({ key, cell: best });
  }
  return out;
}

function modelMarker(frame: Frame, point: number[] | null): string {
  if (!point) return '';
  const x = frame.x(point[0]), y = frame.y(point[1]);
  const right = x > frame.width - frame.right - 90;
  const below = y < frame.top + 20;
  return `<g class="model-point"><circle cx="${fmt(x)}" cy="${fmt(y)}" r="6.5" fill="#fff" stroke="#000" stroke-width="1.6"/><circle cx="${fmt(x)}" cy="${fmt(y)}" r="2.2" fill="#000"/><text x="${fmt(right ? x - 10 : x + 10)}" y="${fmt(below ? y + 18 : y - 8)}" text-anchor="${right ? 'end' : 'start'}" class="plot-label halo">this model</text></g>`;
}

export function phaseMapPlot(data: SweepData, figureId: string): PhaseMap {
  const [ax, ay] = data.axes;
  const nx = ax.values.length, ny = ay.values.length;
  const keys = Array.from({ length: nx * ny }, (_, i) => tupleKey(data.tuple, i));
  const xAxis = axisFor(ax.values, ax.symbol), yAxis = axisFor(ay.values, ay.symbol);
  const frame = makeFrame(FIGURE_WIDTH, 400, xAxis, yAxis);
  const xEdges = cellEdges(ax.values), yEdges = cellEdges(ay.values);
  const distinct = [...new Set(keys.filter((k): k is string => k !== null))].sort(keyOrder);
  const style = new Map<string, { fill: string; hatch: Hatch }>();
  let next = 1;
  for (const key of distinct) {
    const trivial = key.replace(/[()\s,0]/g, '') === '';
    const index = trivial ? 0 : next++;
    style.set(key, { fill: TINTS[index % TINTS.length], hatch: HATCHES[index % HATCHES.length] });
  }
  style.set(UNSETTLED, { fill: '#e4e4e4', hatch: 'unsettled' });
  const defs: string[] = [];
  const fills: string[] = [];
  for (const [key, d] of runPaths(keys, nx, ny, frame, xEdges, yEdges)) {
    const s = style.get(key)!;
    const patternId = `${figureId}-${[...style.keys()].indexOf(key)}`;
    fills.push(`<path d="${d}" fill="${s.fill}"/>`);
    if (s.hatch) {
      defs.push(hatchPattern(patternId, s.hatch));
      fills.push(`<path d="${d}" fill="url(#${patternId})"/>`);
    }
  }
  const minimumCells = Math.max(3, Math.round(nx * ny * 0.012));
  const labels = labelCells(keys, nx, ny, minimumCells).map(({ key, cell }) => {
    const x = frame.x(ax.values[cell % nx]), y = frame.y(ay.values[Math.floor(cell / nx)]);
    return `<text x="${fmt(x)}" y="${fmt(y)}" dy="0.35em" text-anchor="middle" class="region-label halo">${escapeHtml(key)}</text>`;
  });
  const name = tupleName(data.tuple);
  const body = `<defs>${defs.join('')}</defs>${fills.join('')}${drawAxes(frame, xAxis, yAxis)}${labels.join('')}${modelMarker(frame, data.modelPoint)}`;
  const legend: PhaseLegendEntry[] = distinct.map((key) => ({ key, ...style.get(key)!, text: `${name} = ${key}` }));
  if (keys.some((k) => k === null)) legend.push({ key: UNSETTLED, ...style.get(UNSETTLED)!, text: 'unsettled: a gap closed or the value could not be settled' });
  return { svg: svgDocument(frame.width, frame.height, `${data.title}: phases by ${name}`, body), legend, tuple: name };
}

/** Sequential colours for the gap heat map (viridis, 8 steps: dark = small gap). */
const GAP_LEVELS = ['#440154', '#46327e', '#365c8d', '#277f8e', '#1fa187', '#4ac16d', '#a0da39', '#fde725'];

/** A round upper end for the colour scale (units π/T). */
export function scaleMaximum(max: number): number {
  if (!(max > 0)) return 1;
  const power = 10 ** Math.floor(Math.log10(max));
  return ([1, 1.2, 1.5, 2, 2.5, 3, 4, 5, 6, 8, 10].map((m) => m * power).find((m) => m >= max - 1e-12) ?? max);
}

export function gapHeatMapPlot(data: SweepData, seriesIndex: number, figureId: string): string {
  const [ax, ay] = data.axes;
  const series = data.gaps[seriesIndex];
  const nx = ax.values.length, ny = ay.values.length;
  const settled = series.values.filter((v): v is number => v !== null);
  const top = scaleMaximum(settled.length ? Math.max(...settled) : 1);
  const level = (v: number | null) => (v === null ? null : String(Math.min(GAP_LEVELS.length - 1, Math.floor((v / top) * GAP_LEVELS.length))));
  const keys = series.values.map(level);
  const xAxis = axisFor(ax.values, ax.symbol), yAxis = axisFor(ay.values, ay.symbol);
  const frame = makeFrame(FIGURE_WIDTH, 400, xAxis, yAxis, { left: 70, right: 78, top: 14, bottom: 46 });
  const xEdges = cellEdges(ax.values), yEdges = cellEdges(ay.values);
  const fills: string[] = [];
  let defs = '';
  for (const [key, d] of runPaths(keys, nx, ny, frame, xEdges, yEdges)) {
    if (key === UNSETTLED) {
      defs = hatchPattern(`${figureId}-u`, 'unsettled');
      fills.push(`<path d="${d}" fill="url(#${figureId}-u)"/>`);
    } else fills.push(`<path d="${d}" fill="${GAP_LEVELS[Number(key)]}"/>`);
  }
  // Scale bar: one block per level, ticks at 0, half and the top, in units of π/T.
  const barX = frame.width - frame.right + 18, barW = 14;
  const blockH = frame.plotHeight / GAP_LEVELS.length;
  const blocks = GAP_LEVELS.map((c, i) => `<rect x="${barX}" y="${fmt(frame.top + frame.plotHeight - (i + 1) * blockH)}" width="${barW}" height="${fmt(blockH + 0.3)}" fill="${c}"/>`).join('');
  const barTicks = [0, top / 2, top]
    .map((v) => {
      const y = frame.top + frame.plotHeight * (1 - v / top);
      return `<line x1="${barX + barW}" x2="${barX + barW + 4}" y1="${fmt(y)}" y2="${fmt(y)}" class="plot-tick"/><text x="${barX + barW + 6}" y="${fmt(y)}" dy="0.35em" class="plot-tick-label">${Number(v.toPrecision(3))}</text>`;
    })
    .join('');
  const barTitle = `<text transform="translate(${fmt(frame.width - 6)} ${fmt(frame.top + frame.plotHeight / 2)}) rotate(-90)" text-anchor="middle" class="plot-axis-label">${svgText(`${series.name.symbol ?? 'Δ'} (units of π/T)`)}</text>`;
  const bar = `<rect x="${barX}" y="${frame.top}" width="${barW}" height="${fmt(frame.plotHeight)}" fill="none" stroke="#8a939d"/>`;
  const body = `<defs>${defs}</defs>${fills.join('')}${drawAxes(frame, xAxis, yAxis)}${blocks}${bar}${barTicks}${barTitle}${modelMarker(frame, data.modelPoint)}`;
  return svgDocument(frame.width, frame.height, `${data.title}: ${series.name.words}`, body);
}

