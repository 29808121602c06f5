/**
 * Sweeps over one parameter: each integer invariant as a step plot in its own
 * strip (values can only jump where a gap closes), unsettled points hatched,
 * and the smallest gap of every gap beneath on the same axis, so a reader
 * sees each jump line up with a gap closing. The model's own value is marked
 * by a vertical line through every panel.
 */
import type { Series, SweepData } from '../sweeps.ts';
import { cellEdges as cellEdgesOf, scaleMaximum } from './phase-map.ts';
import { drawAxes, fmt, FIGURE_WIDTH, hatchPattern, makeFrame, niceTicks, parameterTicks, SERIES, svgDocument, svgText, type Axis } from './svg.ts';

const STRIP = 40, STRIP_GAP = 10, GAP_PANEL = 150, PANEL_GAP = 12, TOP = 24, BOTTOM = 46, LEFT = 72, RIGHT = 14;
/** Strips drawn at most (the others are listed in the caption). */
export const MAX_STRIPS = 6;

function range(series: Series): [number, number] {
  const settled = series.values.filter((v): v is number => v !== null);
  return settled.length ? [Math.min(...settled), Math.max(...settled)] : [0, 0];
}

/** Height of a strip: room for a tick label per integer value, at least STRIP. */
function stripHeight(series: Series): number {
  const [lo, hi] = range(series);
  return Math.max(STRIP, Math.min(5, hi - lo + 1) * 19 + 6);
}

function strip(series: Series, index: number, xs: number[], cellEdges: number[], x: (v: number) => number, top: number, hatchId: string): string {
  const [lo, hi] = range(series);
  const height = stripHeight(series);
  const [min, max] = [lo - 0.5, hi + 0.5];
  const y = (v: number) => top + (1 - (v - min) / (max - min)) * height;
  const { colour } = SERIES[index % SERIES.length];
  const parts: string[] = [`<rect x="${LEFT}" y="${fmt(top)}" width="${fmt(FIGURE_WIDTH - LEFT - RIGHT)}" height="${height}" class="plot-box"/>`];
  // Unsettled cells: hatched across the strip.
  series.values.forEach((v, i) => {
    if (v === null) parts.push(`<rect x="${fmt(x(cellEdges[i]))}" y="${fmt(top)}" width="${fmt(x(cellEdges[i + 1]) - x(cellEdges[i]) + 0.3)}" height="${height}" fill="url(#${hatchId})"/>`);
  });
  let d = '';
  for (let i = 0; i < xs.length; i++) {
    const v = series.values[i];
    if (v === null) continue;
    const prev = i > 0 ? series.values[i - 1] : null;
    d += prev !== null && i > 0 ? `V${fmt(y(v))}` : `M${fmt(x(cellEdges[i]))} ${fmt(y(v))}`;
    d += `H${fmt(x(cellEdges[i + 1]))}`;
  }
  parts.push(`<path d="${d}" fill="none" stroke="${colour}" stroke-width="2.2"/>`);
  const ticks = hi - lo <= 4 ? Array.from({ length: hi - lo + 1 }, (_, k) => lo + k) : [lo, hi];
  for (const t of ticks) parts.push(`<text x="${LEFT - 6}" y="${fmt(y(t))}" dy="0.35em" text-anchor="end" class="plot-tick-label">${String(t).replace('-', '−')}</text>`);
  parts.push(`<text x="4" y="${fmt(top + height / 2)}" dy="0.35em" class="plot-axis-label">${svgText(series.name.symbol ?? series.id)}</text>`);
  return parts.join('');
}

export function sweepStepsPlot(data: SweepData, figureId: string): string {
  const axis = data.axes[0];
  const xs = axis.values;
  const cellEdges = cellEdgesOf(xs);
  const xMin = Math.min(cellEdges[0], cellEdges[cellEdges.length - 1]), xMax = Math.max(cellEdges[0], cellEdges[cellEdges.length - 1]);
  const strips = [...data.tuple, ...data.others].slice(0, MAX_STRIPS);
  const hasGaps = data.gaps.length > 0;
  const heights = strips.map(stripHeight);
  const tops = heights.map((_, i) => TOP + heights.slice(0, i).reduce((a, h) => a + h + STRIP_GAP, 0));
  const stripsHeight = heights.reduce((a, h) => a + h + STRIP_GAP, 0);
  const height = TOP + stripsHeight + (hasGaps ? PANEL_GAP + GAP_PANEL : 0) + BOTTOM - (hasGaps ? 0 : STRIP_GAP);
  const xAxis: Axis = { label: axis.symbol, min: xMin, max: xMax, ticks: parameterTicks(xs) };
  const hatchId = `${figureId}-u`;
  const parts: string[] = [`<defs>${hatchPattern(hatchId, 'unsettled')}</defs>`];
  const plotWidth = FIGURE_WIDTH - LEFT - RIGHT;
  const x = (v: number) => LEFT + ((v - xMin) / (xMax - xMin || 1)) * plotWidth;
  strips.forEach((s, i) => parts.push(strip(s, i, xs, cellEdges, x, tops[i], hatchId)));
  let bottomFrameTop = tops[tops.length - 1] ?? TOP;
  if (hasGaps) {
    const settled = data.gaps.flatMap((g) => g.values.filter((v): v is number => v !== null));
    const top = scaleMaximum(settled.length ? Math.max(...settled) : 1);
    const yAxis: Axis = { label: 'smallest gap (π/T)', min: 0, max: top, ticks: niceTicks(0, top, 4) };
    const panelTop = TOP + stripsHeight + PANEL_GAP;
    const frame = makeFrame(FIGURE_WIDTH, panelTop + GAP_PANEL + BOTTOM, xAxis, yAxis, { left: LEFT, right: RIGHT, top: panelTop, bottom: BOTTOM });
    parts.push(drawAxes(frame, xAxis, yAxis));
    data.gaps.forEach((g, k) => {
      const style = SERIES[k % SERIES.length];
      let d = '';
      let open = false;
      g.values.forEach((v, i) => {
        if (v === null) {
          open = false;
          return;
        }
        d += `${open ? 'L' : 'M'}${fmt(frame.x(xs[i]))} ${fmt(frame.y(v))}`;
        open = true;
      });
      parts.push(`<path d="${d}" fill="none" stroke="${style.colour}" stroke-width="2"${style.dash ? ` stroke-dasharray="${style.dash}"` : ''}/>`);
    });
    bottomFrameTop = panelTop;
  } else {
    // No gap panel: the x axis goes under the last strip.
    const frame = makeFrame(FIGURE_WIDTH, height, xAxis, { min: 0, max: 1 }, { left: LEFT, right: RIGHT, top: bottomFrameTop, bottom: BOTTOM });
    parts.push(drawAxes(frame, xAxis, { label: '', min: 0, max: 1, ticks: [] }, { box: false, yTitle: false }));
  }
  if (data.modelPoint) {
    const px = x(data.modelPoint[0]);
    const mx = fmt(px);
    // The label sits beside the line, on the side with room.
    const anchor = px > FIGURE_WIDTH - 90 ? 'end' : px < LEFT + 60 ? 'start' : 'middle';
    parts.push(`<line x1="${mx}" x2="${mx}" y1="${TOP - 4}" y2="${fmt(height - BOTTOM)}" class="model-line"/><text x="${fmt(px + (anchor === 'end' ? -4 : anchor === 'start' ? 4 : 0))}" y="${TOP - 9}" text-anchor="${anchor}" class="plot-label">this model</text>`);
  }
  return svgDocument(FIGURE_WIDTH, height, `${data.title}: ${strips.map((s) => s.name.symbol ?? s.id).join(', ')}${hasGaps ? ' and smallest gaps' : ''} against ${axis.parameter}`, parts.join(''));
}

/** Legend entries (colour and dash) of the gap curves, for the caption. */
export function gapCurveLegend(data: SweepData): { colour: string; dash: string; text: string }[] {
  return data.gaps.map((g, k) => ({ ...SERIES[k % SERIES.length], text: g.name.words }));
}

