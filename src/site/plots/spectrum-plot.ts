/**
 * Spectrum figures: quasienergy against the momentum along the edge for
 * ribbons, quasienergy levels of an open chain, bulk bands along the
 * high-symmetry path, and the band ranges with the invariant of every band
 * and gap. Quasienergy is periodic, so states are drawn as points, never
 * joined across ±π/T.
 */
import { drawAxes, fmt, FIGURE_WIDTH, makeFrame, markerPath, MARKERS, OKABE_ITO, quasienergyAxis, svgDocument, svgText, type Axis, type Tick } from './svg.ts';

export type EdgeClass = 'low' | 'high' | 'both' | 'bulk';

/** How each edge class is drawn: colour and marker shape (shape alone tells them apart). */
export const EDGE_STYLE: Record<Exclude<EdgeClass, 'bulk'>, { colour: string; marker: keyof typeof MARKERS }> = {
  low: { colour: OKABE_ITO.blue, marker: 'triangleUp' },
  high: { colour: OKABE_ITO.vermillion, marker: 'triangleDown' },
  both: { colour: OKABE_ITO.purple, marker: 'diamond' },
};
export const BULK_COLOUR = '#8f969e';

export interface SpectrumInput {
  title: string;
  /** Reduced momenta along the edge (ribbon); empty for an open chain. */
  momenta: number[];
  /** quasienergies[i][n]: state n at momentum i (units π/T); one row for an open chain. */
  quasienergies: number[][];
  /** Edge class of each state (same shape), or null to draw every state alike. */
  classes: EdgeClass[][] | null;
  /** Gap labels to mark (units π/T). */
  gapLabels: number[];
  /** Name of the lattice vector along the edge ("a₁"), ribbons only. */
  alongVector?: string;
}

const K_TICKS: Tick[] = [0, 0.25, 0.5, 0.75, 1].map((value, i) => ({ value, label: ['0', 'π/2', 'π', '3π/2', '2π'][i] }));

function gapLines(frame: ReturnType<typeof makeFrame>, labels: number[]): string {
  return labels
    .map((g) => {
      const y = fmt(frame.y(g));
      return `<line x1="${frame.left}" x2="${fmt(frame.width - frame.right)}" y1="${y}" y2="${y}" class="plot-gap-line"/>`;
    })
    .join('');
}

/**
 * Points as zero-length round-capped strokes: one short path for thousands of
 * states. Points that fall on the same spot of the drawing (to 0.5 units, well
 * below a dot) are drawn once, so a ribbon thousands of cells wide costs no
 * more than the figure can show.
 */
function dotPath(points: [number, number][]): string {
  return onePerSpot(points).map(([x, y]) => `M${fmt(x)} ${fmt(y)}h0`).join('');
}

function onePerSpot(points: [number, number][]): [number, number][] {
  const seen = new Set<string>();
  return points.filter(([x, y]) => {
    const key = `${Math.round(x * 2)},${Math.round(y * 2)}`;
    if (seen.has(key)) return false;
    seen.add(key);
    return true;
  });
}

export function spectrumPlot(input: SpectrumInput): string {
  const isChain = input.momenta.length === 0;
  const stateCount = input.quasienergies[0]?.length ?? 0;
  const xAxis: Axis = isChain
    ? { label: 'state number (ordered by ε)', min: -0.5, max: Math.max(1, stateCount - 0.5), ticks: [1, Math.round(stateCount / 2), stateCount].filter((v, i, a) => a.indexOf(v) === i).map((v) => ({ value: v - 1, label: String(v) })) }
    : { label: `k∥·${input.alongVector ?? 'a₁'} (momentum along the edge)`, min: 0, max: 1, ticks: K_TICKS };
  const yAxis = quasienergyAxis();
  const frame = makeFrame(FIGURE_WIDTH, 330, xAxis, yAxis);
  const layers: Record<EdgeClass, [number, number][]> = { bulk: [], low: [], high: [], both: [] };
  for (let i = 0; i < input.quasienergies.length; i++) {
    const row = input.quasienergies[i];
    for (let n = 0; n < row.length; n++) {
      const kind = input.classes?.[i]?.[n] ?? 'bulk';
      layers[kind].push([frame.x(isChain ? n : input.momenta[i]), frame.y(row[n])]);
    }
  }
  const bulkWidth = isChain ? 3 : input.classes ? 2.2 : 2.6;
  const body =
    drawAxes(frame, xAxis, yAxis) +
    gapLines(frame, input.gapLabels) +
    `<path d="${dotPath(layers.bulk)}" stroke="${input.classes ? BULK_COLOUR : '#3d4651'}" stroke-width="${bulkWidth}" stroke-linecap="round" fill="none"/>` +
    (['both', 'low', 'high'] as const)
      .filter((k) => layers[k].length > 0)
      .map((k) => `<path d="${markerPath(onePerSpot(layers[k]), EDGE_STYLE[k].marker, 3)}" fill="${EDGE_STYLE[k].colour}" stroke="#fff" stroke-width="0.4" class="state-${k}"/>`)
      .join('');
  return svgDocument(frame.width, frame.height, input.title, body);
}

export interface BandPathInput {
  title: string;
  /** Quasienergies (units π/T) at each point of the path. */
  quasienergies: number[][];
  /** Named corners: index into the path and label. */
  corners: { index: number; label: string }[];
  gapLabels: number[];
  /** Chains: the axis is k·a from −π to π. */
  chain: boolean;
}

/** Bulk quasienergy bands along the high-symmetry path (dots: bands wrap through ±π/T). */
export function bandPathPlot(input: BandPathInput): string {
  const last = Math.max(1, input.quasienergies.length - 1);
  const xAxis: Axis = {
    label: input.chain ? 'k·a' : `wave vector along ${input.corners.map((c) => c.label).join('–')}`,
    min: 0,
    max: last,
    ticks: input.corners.map((c) => ({ value: c.index, label: input.chain ? c.label.replace('/a', '') : c.label })),
  };
  const yAxis = quasienergyAxis();
  const frame = makeFrame(FIGURE_WIDTH, 320, xAxis, yAxis);
  const corners = input.corners
    .slice(1, -1)
    .map((c) => `<line x1="${fmt(frame.x(c.index))}" x2="${fmt(frame.x(c.index))}" y1="${frame.top}" y2="${fmt(frame.height - frame.bottom)}" class="plot-grid-line"/>`)
    .join('');
  const points: [number, number][] = [];
  input.quasienergies.forEach((row, i) => row.forEach((e) => points.push([frame.x(i), frame.y(e)])));
  const body = drawAxes(frame, xAxis, yAxis) + corners + gapLines(frame, input.gapLabels) + `<path d="${dotPath(points)}" stroke="${OKABE_ITO.blue}" stroke-width="2.6" stroke-linecap="round" fill="none"/>`;
  return svgDocument(frame.width, frame.height, input.title, body);
}

export interface BandRangesInput {
  title: string;
  /** Band groups: quasienergy range (units π/T, may wrap through π: lower > upper) and a label. */
  bands: { range: [number, number]; label: string }[];
  /** Gaps: label (units π/T), open or not, and the invariant text to print in it. */
  gaps: { label: number; text: string; open: boolean }[];
}

/**
 * The quasienergy circle cut open at ±π/T: bands as bars with their Chern
 * numbers, gaps with their winding numbers (or chain invariants). A band
 * through ±π/T appears at both ends.
 */
export function bandRangesPlot(input: BandRangesInput): string {
  const yAxis = quasienergyAxis();
  const frame = makeFrame(260, 320, { min: 0, max: 1 }, yAxis, { left: 70, right: 100, top: 14, bottom: 20 });
  const x0 = frame.left + 18, x1 = frame.left + 58;
  const bars: string[] = [];
  const labels: string[] = [];
  for (const band of input.bands) {
    const [lo, hi] = band.range;
    const spans: [number, number][] = lo <= hi ? [[lo, hi]] : [[lo, 1], [-1, hi]];
    for (const [a, b] of spans) {
      const top = frame.y(b), bottom = frame.y(a);
      const height = Math.max(2.5, bottom - top);
      bars.push(`<rect x="${x0}" y="${fmt(Math.min(top, (top + bottom) / 2 - 1.25))}" width="${x1 - x0}" height="${fmt(height)}" class="band-bar"/>`);
    }
    const centre = lo <= hi ? (lo + hi) / 2 : (lo + 1 <= 1 - lo ? (lo + 1) / 2 : (hi - 1) / 2);
    labels.push(`<text x="${x1 + 8}" y="${fmt(frame.y(centre))}" dy="0.35em" class="band-label">${svgText(band.label)}</text>`);
  }
  for (const gap of input.gaps) {
    const y = fmt(frame.y(gap.label));
    bars.push(`<line x1="${x0 - 8}" x2="${x1 + 4}" y1="${y}" y2="${y}" class="plot-gap-line"/>`);
    labels.push(`<text x="${x1 + 8}" y="${y}" dy="0.35em" class="gap-label${gap.open ? '' : ' gap-closed'}">${svgText(gap.text)}</text>`);
    if (Math.abs(gap.label - 1) < 1e-9) {
      const yb = fmt(frame.y(-1));
      bars.push(`<line x1="${x0 - 8}" x2="${x1 + 4}" y1="${yb}" y2="${yb}" class="plot-gap-line"/>`);
      labels.push(`<text x="${x1 + 8}" y="${yb}" dy="0.35em" class="gap-label${gap.open ? '' : ' gap-closed'}">${svgText(gap.text)}</text>`);
    }
  }
  const axis = drawAxes(frame, { label: '', min: 0, max: 1, ticks: [] }, yAxis, { box: false });
  const spine = `<line x1="${frame.left}" x2="${frame.left}" y1="${frame.top}" y2="${fmt(frame.height - frame.bottom)}" class="plot-tick"/>`;
  return svgDocument(frame.width, frame.height, input.title, axis + spine + bars.join('') + labels.join(''), 'plot-narrow');
}
