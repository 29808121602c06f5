/**
 * Every figure of a model page, drawn at build time from its record (and,
 * for the lattice and the drive, from its model file): the SVG and the words
 * of its legend and caption. Components only place what is returned here.
 */
import type { ModelRecord } from '../catalogue/records/model-record.ts';
import { edgeName, gapSubscript, ordinal, quasienergyText } from '../catalogue/vocabulary.ts';
import { colouringSentence, edgeClasses, localisationField } from './edge-localisation.ts';
import { gapOrder, invariantProfile } from './invariants.ts';
import { latticeGeometry } from './lattice.ts';
import type { ModelSource } from './model-source.ts';
import { timeline, timelinePlot, timeText } from './plots/drive-timeline.ts';
import { MAX_PANELS, ORBITAL_STYLE, segmentDrawing, unitCellDrawing } from './plots/lattice-drawing.ts';
import { gapHeatMapPlot, phaseMapPlot, type PhaseLegendEntry } from './plots/phase-map.ts';
import { bandPathPlot, bandRangesPlot, BULK_COLOUR, EDGE_STYLE, spectrumPlot } from './plots/spectrum-plot.ts';
import { isPiMultiple, SERIES, swatch } from './plots/svg.ts';
import { gapCurveLegend, MAX_STRIPS, sweepStepsPlot } from './plots/sweep-steps.ts';
import { sweepData, thinned, tupleName, type SweepData } from './sweeps.ts';

export interface LegendItem {
  /** Inline SVG swatch (trusted, built here). */
  swatch: string;
  /** Text with "_" subscripts. */
  text: string;
}

export interface BandFigures {
  path: string | null;
  pathCaption: string;
  ranges: string | null;
  rangesCaption: string;
}

const symbolFor = (kind: 'sheet' | 'chain') => (kind === 'sheet' ? 'W' : 'ν');

/** Band groups between open gaps, from the gap arcs (the circle cut at each open gap). */
function bandsFromGaps(gaps: { label: number; lower: number; upper: number; open: boolean }[]): [number, number][] {
  const open = gaps.filter((g) => g.open).sort((a, b) => a.label - b.label);
  return open.map((g, i) => [g.upper, open[(i + 1) % open.length].lower] as [number, number]);
}

export function bandFigures(record: ModelRecord): BandFigures {
  const a = record.analysis;
  if (!a) return { path: null, pathCaption: '', ranges: null, rangesCaption: '' };
  const openLabels = a.gaps.filter((g) => g.open).map((g) => g.label);
  const chain = a.kind === 'chain';
  const path = a.bandPath
    ? bandPathPlot({ title: 'Bulk quasienergy bands along the high-symmetry path', quasienergies: a.bandPath.quasienergies, corners: a.bandPath.corners, gapLabels: openLabels, chain })
    : null;
  const cornerWords = a.bandPath
    ? a.bandPath.corners
        .filter((c, i, all) => all.findIndex((d) => d.label === c.label) === i)
        .map((c) => `${c.label} = (${a.bandPath!.momenta[c.index].map((x) => Number(x.toFixed(4))).join(', ')})`)
        .join(', ')
    : '';
  const pathCaption = chain
    ? 'Bulk quasienergies of the infinite chain against k·a from −π to π. Dashed lines: open gaps. For plotting only; verdicts use the full grids in the certificates.'
    : `Bulk quasienergies along the high-symmetry path (${cornerWords}, in units of the reciprocal basis b₁, b₂). Dashed lines: open gaps. Points, not lines: a band leaving at π/T re-enters at −π/T. For plotting only; verdicts use the full grids in the certificates.`;
  const profile = invariantProfile(record.portrait, { cut: a.facts.cut ?? null, symmetryClass: record.model?.symmetryClass });
  const bands = a.kind === 'sheet' && a.bands.length > 0 ? [...a.bands].sort((x, y) => x.index - y.index).map((b) => b.range as [number, number]) : bandsFromGaps(a.gaps);
  const bandLabel = (i: number) => (a.kind === 'sheet' && profile.C.length > 0 ? `C_${i + 1} = ${profile.C[i] === null || profile.C[i] === undefined ? '?' : String(profile.C[i]).replace('-', '−')}` : '');
  const gapValues = a.kind === 'sheet' ? profile.W : profile.nu;
  const gaps = [...a.gaps].sort((x, y) => gapOrder(x.label, y.label)).map((g) => {
    const v = gapValues.find(([label]) => Math.abs(label - g.label) < 1e-9);
    const symbol = symbolFor(a.kind);
    return { label: g.label, open: g.open, text: g.open ? (v ? `${symbol}_${gapSubscript(g.label)} = ${v[1] === null ? '?' : String(v[1]).replace('-', '−')}` : `gap at ${quasienergyText(g.label)}`) : `closed at ${quasienergyText(g.label)}` };
  });
  const ranges = bands.length > 0 || gaps.length > 0 ? bandRangesPlot({ title: 'Band ranges and gap invariants', bands: bands.map((range, i) => ({ range, label: bandLabel(i) })), gaps }) : null;
  const rangesCaption =
    a.kind === 'sheet'
      ? `Quasienergy ranges of the band groups (bars; counted upward from the cut at ε = ${quasienergyText(a.facts.cut ?? 1)}) with their Chern numbers, and the winding number W of each gap. "?" marks a value that could not be settled.`
      : 'Quasienergy ranges of the bands (bars) and the chiral or Z₂ invariant ν of each gap. "?" marks a value that could not be settled.';
  return { path, pathCaption, ranges, rangesCaption };
}

export interface SpectrumFigure {
  anchor: string;
  title: string;
  svg: string;
  legend: LegendItem[];
  caption: string;
}

export function spectrumFigures(record: ModelRecord): SpectrumFigure[] {
  const a = record.analysis;
  if (!a) return [];
  const openLabels = a.gaps.filter((g) => g.open).map((g) => g.label);
  return a.spectra.map((s) => {
    const ribbon = s.kind === 'ribbon';
    const along = s.finiteDirection === 0 ? 'a₂' : 'a₁';
    const title = ribbon ? `Ribbon finite along a${s.finiteDirection === 0 ? '₁' : '₂'}, ${s.width} cells wide` : `Open chain of ${s.width} cells`;
    const classes = edgeClasses(s);
    const field = localisationField(s);
    const legend: LegendItem[] = classes
      ? [
          { swatch: markerSwatch(EDGE_STYLE.low.colour, 'triangleUp'), text: ribbon ? edgeName(s.finiteDirection ?? 1, 'low') : 'bound to the first end of the chain' },
          { swatch: markerSwatch(EDGE_STYLE.high.colour, 'triangleDown'), text: ribbon ? edgeName(s.finiteDirection ?? 1, 'high') : 'bound to the last end of the chain' },
          { swatch: markerSwatch(EDGE_STYLE.both.colour, 'diamond'), text: 'localised at both ends (a degenerate pair mixes the two)' },
          { swatch: dotSwatch(BULK_COLOUR), text: 'not localised at an edge (bulk)' },
        ]
      : [];
    const colouring = colouringSentence(field);
    const stride = s.stride > 1 ? ` Every ${ordinal(s.stride)} computed momentum is shown.` : '';
    const coverage =
      s.coverage === 'near-gap-labels'
        ? ' Only the states nearest ε = 0 and ε = π/T were computed (a long chain is solved near the gap labels only), so the bulk bands are not drawn whole.'
        : '';
    const caption = ribbon
      ? `Quasienergies of a ribbon ${s.width} cells wide, periodic along ${along}, against the momentum along the edge (k∥·${along} from 0 to 2π). Dashed lines: open bulk gaps. ${colouring}${stride}`
      : `Quasienergies of an open chain of ${s.width} cells, ordered by ε. Dashed lines: open bulk gaps; states inside a gap are end modes. ${colouring}${coverage}`;
    return {
      anchor: ribbon ? `ribbon-${(s.finiteDirection ?? 1) + 1}` : 'open-chain',
      title,
      svg: spectrumPlot({ title, momenta: s.momenta, quasienergies: s.quasienergies, classes, gapLabels: openLabels, alongVector: along }),
      legend,
      caption,
    };
  });
}

function markerSwatch(colour: string, marker: 'triangleUp' | 'triangleDown' | 'diamond'): string {
  const d = { triangleUp: 'M6 1.5L10.5 10H1.5Z', triangleDown: 'M6 10.5L10.5 2H1.5Z', diamond: 'M6 0.8L10.5 6L6 11.2L1.5 6Z' }[marker];
  return `<svg class="swatch" viewBox="0 0 12 12" aria-hidden="true"><path d="${d}" fill="${colour}"/></svg>`;
}

function dotSwatch(colour: string): string {
  return `<svg class="swatch" viewBox="0 0 12 12" aria-hidden="true"><circle cx="6" cy="6" r="2.2" fill="${colour}"/></svg>`;
}

export interface SweepFigure {
  anchor: string;
  title: string;
  /** Map of phases (2D) or step plot (1D). */
  main: string;
  mainLegend: LegendItem[];
  /** Smallest-gap heat maps (2D only). */
  heatMaps: { title: string; svg: string }[];
  caption: string;
  errors: { where: string; error: string }[];
}

/** Bytes of SVG all phase diagrams of one page may take; finer scans are drawn on a coarser grid. */
export const SWEEP_FIGURE_BUDGET = 160_000;

/** The figures of a sweep, drawn on the finest grid (every k-th point) that fits the budget. */
function fitted<T>(full: SweepData, budget: number, draw: (data: SweepData) => T, size: (figures: T) => number): { figures: T; step: number } {
  let step = 1;
  let figures = draw(full);
  while (size(figures) > budget && full.axes.every((a) => a.values.length / (step + 1) >= 8)) {
    step++;
    figures = draw(thinned(full, step));
  }
  return { figures, step };
}

export function sweepFigures(record: ModelRecord): SweepFigure[] {
  const budget = SWEEP_FIGURE_BUDGET / Math.max(1, record.sweeps.length);
  return record.sweeps.map((sweep, k) => {
    const full = sweepData(sweep, record);
    const data = full;
    const anchor = `sweep-${sweep.name}`;
    const figureId = `f${k}-${sweep.name}`;
    const axesWords = data.axes.map((a) => `${a.symbol}${a.description ? ` (${a.description})` : ''}`).join(' and ');
    const own = data.modelPoint ? ` The model itself is at ${data.axes.map((a, i) => `${a.symbol} = ${axisValueText(data.modelPoint![i], a.values)}`).join(', ')} (marked).` : ' The model’s own parameter point lies outside the scanned range.';
    const points = sweep.points.length;
    const thinnedNote = (step: number) => (step > 1 ? ` Drawn at every ${step}th point of each axis to keep the page light; the downloadable record holds every point.` : '');
    if (data.axes.length === 2 && data.tuple.length > 0) {
      const { figures, step } = fitted(
        full,
        budget,
        (d) => ({ map: phaseMapPlot(d, figureId), heat: d.gaps.map((g, i) => ({ title: g.name.words, svg: gapHeatMapPlot(d, i, `${figureId}-gap${i}`) })) }),
        (f) => f.map.svg.length + f.heat.reduce((a, h) => a + h.svg.length, 0),
      );
      return {
        anchor,
        title: data.title,
        main: figures.map.svg,
        mainLegend: figures.map.legend.map((e: PhaseLegendEntry, i) => ({ swatch: swatch(e.fill, e.hatch, `${figureId}-legend-${i}`), text: e.text })),
        heatMaps: figures.heat,
        caption: `Phases over ${axesWords}, ${data.axes[0].values.length} × ${data.axes[1].values.length} = ${points} points, each region labelled by ${tupleName(data.tuple)}. Hatched grey: a gap closed or the value could not be settled at that point (phase boundaries).${own} Beneath: the smallest gap at each point on a colour scale in units of π/T (dark = nearly closed).${thinnedNote(step)}`,
        errors: data.errors,
      };
    }
    const strips = [...data.tuple, ...data.others];
    const legend = gapCurveLegend(data).map((g) => ({ swatch: swatch(g.colour, '', '', 'line', g.dash), text: g.text }));
    const left = strips.length > MAX_STRIPS ? ` ${strips.length - MAX_STRIPS} further quantities are in the downloadable record.` : '';
    return {
      anchor,
      title: data.title,
      main: data.axes.length === 1 ? fitted(full, budget, (d) => sweepStepsPlot(d, figureId), (svg) => svg.length).figures : '',
      mainLegend: legend,
      heatMaps: [],
      caption: `${strips.map((s) => s.name.words).join('; ')} against ${axesWords}, ${points} points; each invariant is a step plot in its own strip (hatched: unsettled), the smallest gaps beneath.${own}${left}`,
      errors: data.errors,
    };
  });
}

/** A parameter value as the axis reads it: in units of π when the axis has π ticks. */
function axisValueText(value: number, values: number[]): string {
  const min = Math.min(...values), max = Math.max(...values);
  if (isPiMultiple(min) && isPiMultiple(max) && max - min >= Math.PI / 4) return `${Number((value / Math.PI).toPrecision(3))}π`;
  return String(Number(value.toPrecision(4)));
}

export interface LatticeFigures {
  unitCell: string;
  legend: LegendItem[];
  panels: { svg: string; index: number; label: string | null }[];
  omitted: number;
  handedness: string | null;
  chain: boolean;
}

export function latticeFigures(source: ModelSource): LatticeFigures | null {
  const g = latticeGeometry(source.document, (q) => source.value(q));
  if (!g) return null;
  const shown = g.segments.slice(0, MAX_PANELS);
  const legend = g.orbitals.map((o, i) => {
    const style = ORBITAL_STYLE[i % ORBITAL_STYLE.length];
    const shape = { circle: '<circle cx="6" cy="6" r="4.5"', square: '<rect x="1.5" y="1.5" width="9" height="9"', triangleUp: '<path d="M6 1L11 10.5H1Z"', diamond: '<path d="M6 0.5L11 6L6 11.5L1 6Z"', triangleDown: '<path d="M6 11L11 1.5H1Z"' }[style.marker];
    return { swatch: `<svg class="swatch" viewBox="0 0 12 12" aria-hidden="true">${shape} fill="${style.colour}"/></svg>`, text: `${o.name} at (${o.position.slice(0, g.dimension).map((x) => Number(x.toFixed(4))).join(', ')})` };
  });
  const cross = g.dimension === 2 ? g.vectors[0][0] * g.vectors[1][1] - g.vectors[0][1] * g.vectors[1][0] : 0;
  return {
    unitCell: unitCellDrawing(g, 'lattice-cell'),
    legend,
    panels: shown.map((s) => ({ svg: segmentDrawing(g, s, `lattice-seg${s.index}`), index: s.index, label: s.label })),
    omitted: g.segments.length - shown.length,
    chain: g.dimension === 1,
    handedness: g.handedness === null ? null : `a₁ × a₂ = ${Number(cross.toPrecision(4))} ${g.handedness === 'right' ? '> 0: a right-handed basis' : '< 0: a left-handed basis (C and W are still reported in the Cartesian orientation; edge counts follow the lattice vectors)'}`,
  };
}

export interface TimelineFigure {
  svg: string;
  legend: LegendItem[];
  segments: { index: number; label: string | null; window: string }[];
}

export function timelineFigure(source: ModelSource): TimelineFigure {
  const t = timeline(source.document, (q) => source.value(q));
  return {
    svg: timelinePlot(t),
    legend: t.curves.map((c, k) => ({ swatch: swatch(SERIES[k % SERIES.length].colour, '', '', 'line', SERIES[k % SERIES.length].dash), text: c.label })),
    segments: t.segments.map((s) => ({ index: s.index, label: s.label, window: s.duration === 0 ? `kick at t = ${timeText(s.start, t.period)}` : `${timeText(s.start, t.period)} ≤ t < ${timeText(s.start + s.duration, t.period)}` })),
  };
}
