/**
 * Spectrum figures: quasienergy against momentum for ribbons (each state shaded by
 * its weight on the low and high edge), and quasienergy levels of an open chain
 * against state index. Gap labels are drawn as dashed lines.
 */
import { drawAxes, formatCoordinate as f, makeFrame, momentumAxis, quasienergyAxis, svgDocument, type Axis } from './svg-frame.ts';

export interface SpectrumInput {
  title: string;
  /** Reduced momenta (ribbon); empty for an open chain. */
  momenta: number[];
  /** quasienergies[i][n]: state n at momentum i (units π/T); one row for an open chain. */
  quasienergies: number[][];
  lowEdgeWeight: number[][];
  highEdgeWeight: number[][];
  /** Quasienergies of the gaps to mark (units π/T). */
  gapLabels: number[];
  /** Weight above which a state is drawn as an edge state. */
  edgeThreshold?: number;
}

export type EdgeClass = 'low' | 'high' | 'both' | 'bulk';

/**
 * Classification used for colour. A state whose weight on the two edge regions
 * together reaches the threshold is an edge state; it belongs to one edge when
 * that edge holds at least three quarters of it, else to both (degenerate end
 * states of the two ends mix arbitrarily, so only their sum is meaningful).
 */
export function edgeClass(low: number, high: number, threshold: number): EdgeClass {
  const edge = low + high;
  if (edge < threshold) return 'bulk';
  if (low >= 0.75 * edge) return 'low';
  if (high >= 0.75 * edge) return 'high';
  return 'both';
}

export function spectrumPlot(input: SpectrumInput): string {
  const threshold = input.edgeThreshold ?? 0.5;
  const isChain = input.momenta.length === 0;
  const stateCount = input.quasienergies[0]?.length ?? 0;
  const xAxis: Axis = isChain
    ? { label: 'state index (sorted by quasienergy)', min: 0, max: Math.max(1, stateCount - 1), ticks: [0, Math.max(1, stateCount - 1)].map((v) => ({ value: v, label: String(v) })) }
    : momentumAxis('momentum along the edge k∥ (reduced)');
  const yAxis = quasienergyAxis();
  const frame = makeFrame(640, 380, xAxis, yAxis);
  const layers: Record<EdgeClass, string[]> = { bulk: [], low: [], high: [], both: [] };
  for (let i = 0; i < input.quasienergies.length; i++) {
    const row = input.quasienergies[i];
    for (let n = 0; n < row.length; n++) {
      const x = isChain ? n : input.momenta[i];
      const kind = edgeClass(input.lowEdgeWeight[i]?.[n] ?? 0, input.highEdgeWeight[i]?.[n] ?? 0, threshold);
      const radius = kind === 'bulk' ? 1.2 : 2;
      layers[kind].push(`<circle cx="${f(frame.x(x))}" cy="${f(frame.y(row[n]))}" r="${radius}"/>`);
    }
  }
  const gapLines = input.gapLabels
    .map((g) => `<line x1="${frame.left}" x2="${frame.width - frame.right}" y1="${f(frame.y(g))}" y2="${f(frame.y(g))}" class="plot-gap-line"/>`)
    .join('');
  const body =
    drawAxes(frame, xAxis, yAxis) +
    gapLines +
    `<g class="state-bulk">${layers.bulk.join('')}</g>` +
    `<g class="state-low-edge">${layers.low.join('')}</g>` +
    `<g class="state-high-edge">${layers.high.join('')}</g>` +
    `<g class="state-both-edges">${layers.both.join('')}</g>`;
  return svgDocument(frame, input.title, body);
}

export interface BandPathInput {
  title: string;
  /** Quasienergies (units π/T) at each point of the path. */
  quasienergies: number[][];
  /** Named corners: index into the path and label. */
  corners: { index: number; label: string }[];
  gapLabels: number[];
}

/**
 * Bulk quasienergy bands along a path through the Brillouin zone. Drawn as dots,
 * not lines: quasienergy is periodic, and a band leaving at π/T re-enters at −π/T.
 */
export function bandPathPlot(input: BandPathInput): string {
  const last = Math.max(1, input.quasienergies.length - 1);
  const xAxis: Axis = { label: 'path through the Brillouin zone', min: 0, max: last, ticks: input.corners.map((c) => ({ value: c.index, label: c.label })) };
  const yAxis = quasienergyAxis();
  const frame = makeFrame(640, 340, xAxis, yAxis);
  const corners = input.corners
    .map((c) => `<line x1="${f(frame.x(c.index))}" x2="${f(frame.x(c.index))}" y1="${frame.top}" y2="${frame.height - frame.bottom}" class="plot-gap-line"/>`)
    .join('');
  const gapLines = input.gapLabels
    .map((g) => `<line x1="${frame.left}" x2="${frame.width - frame.right}" y1="${f(frame.y(g))}" y2="${f(frame.y(g))}" class="plot-gap-line"/>`)
    .join('');
  const dots: string[] = [];
  input.quasienergies.forEach((row, i) => {
    for (const e of row) dots.push(`<circle cx="${f(frame.x(i))}" cy="${f(frame.y(e))}" r="1.8"/>`);
  });
  return svgDocument(frame, input.title, drawAxes(frame, xAxis, yAxis) + corners + gapLines + `<g class="state-band">${dots.join('')}</g>`);
}
