/**
 * Lattice drawings: the unit cell with its orbitals and the lattice vectors
 * (with their handedness), and one small panel per drive segment showing the
 * bonds switched on in that segment across a patch of cells — the bond
 * leaving the central cell drawn heavy, its translates light. On-site terms
 * are rings marked + or −; pairings are dashed; bonds whose direction matters
 * (complex amplitudes, Peierls phases) carry an arrow from → to.
 * Orbitals differ by shape as well as colour.
 */
import type { LatticeGeometry, Point, SegmentDrawing } from '../lattice.ts';
import { escapeHtml } from '../render/escape.ts';
import { fmt, markerPath, OKABE_ITO, SERIES, svgDocument, svgText } from './svg.ts';

/** Orbitals differ by colour and by marker shape. */
export const ORBITAL_STYLE = SERIES;

/** Panels drawn at most; further segments are listed in words. */
export const MAX_PANELS = 12;

interface View {
  width: number;
  height: number;
  toScreen(p: Point): Point;
  scale: number;
}

const add = (a: Point, b: Point): Point => [a[0] + b[0], a[1] + b[1]];
const times = (a: Point, s: number): Point => [a[0] * s, a[1] * s];

function cellOrigin(g: LatticeGeometry, n: number[]): Point {
  return g.vectors.reduce<Point>((acc, v, i) => add(acc, times(v, n[i] ?? 0)), [0, 0]);
}

/** Cells of the patch drawn: wide enough for the longest bond, at most 5 per direction. */
function patchCells(g: LatticeGeometry): number[][] {
  const reach = Math.min(2, Math.max(1, ...g.segments.flatMap((s) => s.bonds.flatMap((b) => b.offset.map(Math.abs)))));
  const range = Array.from({ length: 2 * reach + 1 }, (_, i) => i - reach);
  return g.dimension === 1 ? range.map((n) => [n]) : range.flatMap((m) => range.map((n) => [m, n]));
}

/**
 * Screen position of every orbital: orbitals sharing a site are spread a few
 * units apart so each stays visible.
 */
function displayOffsets(g: LatticeGeometry): Point[] {
  const offsets: Point[] = g.orbitals.map(() => [0, 0]);
  const groups = new Map<string, number[]>();
  g.orbitals.forEach((o, i) => {
    const key = o.position.map((x) => x.toFixed(6)).join(',');
    groups.set(key, [...(groups.get(key) ?? []), i]);
  });
  for (const members of groups.values()) {
    if (members.length < 2) continue;
    members.forEach((m, k) => (offsets[m] = [(k - (members.length - 1) / 2) * 9, 0]));
  }
  return offsets;
}

function makeView(g: LatticeGeometry, cells: number[][], width: number, height: number, pad: number): View {
  const points = cells.flatMap((n) => g.orbitals.map((o) => add(cellOrigin(g, n), o.position)));
  const corners = g.dimension === 2 ? [[0, 0], g.vectors[0], g.vectors[1], add(g.vectors[0], g.vectors[1])] : [[0, 0], g.vectors[0]];
  points.push(...(corners as Point[]));
  const xs = points.map((p) => p[0]), ys = points.map((p) => p[1]);
  const [x0, x1, y0, y1] = [Math.min(...xs), Math.max(...xs), Math.min(...ys), Math.max(...ys)];
  const scale = Math.min((width - 2 * pad) / Math.max(x1 - x0, 1e-9), (height - 2 * pad) / Math.max(y1 - y0, 1e-9));
  const cx = (x0 + x1) / 2, cy = (y0 + y1) / 2;
  // Chains sit low in their panel: their bonds arc upwards.
  const middle = g.dimension === 1 ? height * 0.68 : height / 2;
  return { width, height, scale, toScreen: ([x, y]) => [width / 2 + (x - cx) * scale, middle - (y - cy) * scale] };
}

function orbitalMarks(g: LatticeGeometry, view: View, cells: number[][], offsets: Point[], central: boolean): string {
  const parts: string[] = [];
  g.orbitals.forEach((o, i) => {
    const style = ORBITAL_STYLE[i % ORBITAL_STYLE.length];
    const all = cells.map((n) => add(view.toScreen(add(cellOrigin(g, n), o.position)), offsets[i]));
    const centre = add(view.toScreen(o.position), offsets[i]);
    const others = all.filter((p) => Math.hypot(p[0] - centre[0], p[1] - centre[1]) > 0.5);
    parts.push(`<path d="${markerPath(others, style.marker, central ? 3.4 : 4)}" fill="${style.colour}" fill-opacity="0.4"/>`);
    parts.push(`<path d="${markerPath([centre], style.marker, central ? 5.5 : 5.5)}" fill="${style.colour}" stroke="#fff" stroke-width="0.8"/>`);
  });
  return parts.join('');
}

function cellOutline(g: LatticeGeometry, view: View): string {
  if (g.dimension === 1) {
    const [a, b] = [view.toScreen([0, 0]), view.toScreen(g.vectors[0])];
    return `<path d="M${fmt(a[0])} ${fmt(a[1] - 14)}V${fmt(a[1] + 14)}M${fmt(b[0])} ${fmt(b[1] - 14)}V${fmt(b[1] + 14)}" class="cell-outline"/>`;
  }
  const p = [[0, 0], g.vectors[0], add(g.vectors[0], g.vectors[1]), g.vectors[1]].map((q) => view.toScreen(q as Point));
  return `<path d="M${p.map((q) => `${fmt(q[0])} ${fmt(q[1])}`).join('L')}Z" class="cell-outline"/>`;
}

function arrowDefs(id: string, colour: string): string {
  return `<marker id="${id}" viewBox="0 0 10 10" refX="9" refY="5" markerWidth="7" markerHeight="7" orient="auto-start-reverse"><path d="M0 0L10 5L0 10z" fill="${colour}"/></marker>`;
}

/** Overview: unit cell, orbitals labelled, lattice vectors a₁, a₂ and the sense of rotation from a₁ to a₂. */
export function unitCellDrawing(g: LatticeGeometry, figureId: string): string {
  const [width, height] = g.dimension === 1 ? [420, 96] : [260, 260];
  const cells = patchCells(g);
  const view = makeView(g, cells, width, height, 34);
  const offsets = displayOffsets(g);
  const arrowId = `${figureId}-arrow`;
  const origin = view.toScreen([0, 0]);
  const parts: string[] = [`<defs>${arrowDefs(arrowId, '#1d2430')}</defs>`, cellOutline(g, view)];
  g.vectors.forEach((v, i) => {
    const tip = view.toScreen(v);
    const label = add(tip, times(add(tip, times(origin, -1)), 14 / Math.max(1, Math.hypot(tip[0] - origin[0], tip[1] - origin[1]))));
    parts.push(`<line x1="${fmt(origin[0])}" y1="${fmt(origin[1])}" x2="${fmt(tip[0])}" y2="${fmt(tip[1])}" class="lattice-vector" marker-end="url(#${arrowId})"/>`);
    parts.push(`<text x="${fmt(label[0])}" y="${fmt(label[1])}" dy="0.35em" text-anchor="middle" class="plot-label halo">${svgText(g.dimension === 1 ? 'a' : `a_${i + 1}`)}</text>`);
  });
  if (g.dimension === 2) {
    // Sense of rotation from a₁ to a₂: a short arc near the origin.
    const angle = (v: Point) => Math.atan2(v[1], v[0]);
    const [t1, t2] = [angle(g.vectors[0]), angle(g.vectors[1])];
    let sweep = t2 - t1;
    while (sweep > Math.PI) sweep -= 2 * Math.PI;
    while (sweep < -Math.PI) sweep += 2 * Math.PI;
    const shortest = Math.min(...g.vectors.map((v) => Math.hypot(v[0], v[1]))) * view.scale;
    const r = Math.max(18, Math.min(44, shortest * 0.32));
    const start: Point = [origin[0] + r * Math.cos(t1 + sweep * 0.12), origin[1] - r * Math.sin(t1 + sweep * 0.12)];
    const end: Point = [origin[0] + r * Math.cos(t1 + sweep * 0.88), origin[1] - r * Math.sin(t1 + sweep * 0.88)];
    parts.push(`<path d="M${fmt(start[0])} ${fmt(start[1])}A${r} ${r} 0 0 ${sweep > 0 ? 0 : 1} ${fmt(end[0])} ${fmt(end[1])}" class="handedness-arc" marker-end="url(#${arrowId})"/>`);
  }
  parts.push(orbitalMarks(g, view, cells, offsets, true));
  // Labels point away from the middle of the cell, clear of the lattice vectors drawn from its corner.
  const middle = view.toScreen(g.vectors.reduce<Point>((acc, v) => add(acc, times(v, 0.5)), [0, 0]));
  g.orbitals.forEach((o, i) => {
    const p = add(view.toScreen(o.position), offsets[i]);
    let d: Point = [p[0] - middle[0], p[1] - middle[1]];
    const length = Math.hypot(d[0], d[1]);
    d = length < 1 ? [0.7, -0.7] : [d[0] / length, d[1] / length];
    parts.push(`<text x="${fmt(p[0] + d[0] * 16)}" y="${fmt(p[1] + d[1] * 16)}" dy="0.35em" text-anchor="middle" class="orbital-label halo">${escapeHtml(o.name)}</text>`);
  });
  return svgDocument(width, height, `Unit cell with orbitals ${g.orbitals.map((o) => o.name).join(', ')} and lattice vectors`, parts.join(''), 'plot-lattice');
}

function bondPath(g: LatticeGeometry, view: View, offsets: Point[], from: number, to: number, cell: number[], offset: number[]): { d: string; mid: Point; angle: number } {
  const a = add(view.toScreen(add(cellOrigin(g, cell), g.orbitals[from].position)), offsets[from]);
  const b = add(view.toScreen(add(cellOrigin(g, cell.map((n, i) => n + (offset[i] ?? 0))), g.orbitals[to].position)), offsets[to]);
  const angle = Math.atan2(b[1] - a[1], b[0] - a[0]);
  if (g.dimension === 1) {
    // Chains: bonds as arcs above the line, so bonds of different length do not hide each other.
    const lift = Math.min(40, 8 + Math.abs(b[0] - a[0]) * 0.25);
    const mid: Point = [(a[0] + b[0]) / 2, (a[1] + b[1]) / 2 - lift];
    return { d: `M${fmt(a[0])} ${fmt(a[1])}Q${fmt(mid[0])} ${fmt(mid[1] - lift)} ${fmt(b[0])} ${fmt(b[1])}`, mid, angle };
  }
  if (Math.hypot(b[0] - a[0], b[1] - a[1]) < 1) {
    // A bond between two orbitals on one site: a small loop.
    return { d: `M${fmt(a[0])} ${fmt(a[1])}c-6 -16 18 -16 12 0`, mid: [a[0] + 6, a[1] - 12], angle: 0 };
  }
  return { d: `M${fmt(a[0])} ${fmt(a[1])}L${fmt(b[0])} ${fmt(b[1])}`, mid: [(a[0] + b[0]) / 2, (a[1] + b[1]) / 2], angle };
}

function inPatch(cells: number[][], n: number[]): boolean {
  return cells.some((c) => c.every((x, i) => x === n[i]));
}

/** One segment: bonds switched on (central cell heavy), on-site rings, kicks and light noted. */
export function segmentDrawing(g: LatticeGeometry, segment: SegmentDrawing, figureId: string): string {
  const [width, height] = g.dimension === 1 ? [300, 96] : [200, 200];
  const cells = patchCells(g);
  const view = makeView(g, cells, width, height, 22);
  const offsets = displayOffsets(g);
  const arrowId = `${figureId}-arrow`;
  const light: string[] = [], heavy: string[] = [], lightPairs: string[] = [], heavyPairs: string[] = [], arrows: string[] = [];
  const origin = g.dimension === 1 ? [0] : [0, 0];
  for (const bond of segment.bonds) {
    for (const cell of cells) {
      const target = cell.map((n, i) => n + (bond.offset[i] ?? 0));
      if (!inPatch(cells, target)) continue;
      const central = cell.every((n, i) => n === origin[i]);
      const { d, mid, angle } = bondPath(g, view, offsets, bond.from, bond.to, cell, bond.offset);
      (bond.kind === 'pairing' ? (central ? heavyPairs : lightPairs) : central ? heavy : light).push(d);
      if (central && bond.directed) {
        const len = 6;
        const back: Point = [mid[0] - len * Math.cos(angle), mid[1] - len * Math.sin(angle)];
        arrows.push(`<line x1="${fmt(back[0])}" y1="${fmt(back[1])}" x2="${fmt(mid[0])}" y2="${fmt(mid[1])}" class="bond-arrow" marker-end="url(#${arrowId})"/>`);
      }
    }
  }
  const parts: string[] = [`<defs>${arrowDefs(arrowId, OKABE_ITO.blue)}</defs>`, cellOutline(g, view)];
  if (light.length) parts.push(`<path d="${light.join('')}" class="bond bond-translate"/>`);
  if (lightPairs.length) parts.push(`<path d="${lightPairs.join('')}" class="bond bond-translate bond-pairing"/>`);
  if (heavy.length) parts.push(`<path d="${heavy.join('')}" class="bond bond-central"/>`);
  if (heavyPairs.length) parts.push(`<path d="${heavyPairs.join('')}" class="bond bond-central bond-pairing"/>`);
  parts.push(arrows.join(''));
  parts.push(orbitalMarks(g, view, cells, offsets, false));
  for (const o of segment.onsite) {
    const p = add(view.toScreen(g.orbitals[o.orbital].position), offsets[o.orbital]);
    const sign = o.modulated ? '~' : o.sign > 0 ? '+' : o.sign < 0 ? '−' : '0';
    parts.push(`<circle cx="${fmt(p[0])}" cy="${fmt(p[1])}" r="9" class="onsite-ring"/><text x="${fmt(p[0] + 11)}" y="${fmt(p[1] + 12)}" class="onsite-sign halo">${sign}</text>`);
  }
  const notes = [segment.kick ? 'kick' : '', segment.light ? 'light field' : ''].filter(Boolean).join(', ');
  if (notes) parts.push(`<text x="6" y="${height - 8}" class="plot-label">${escapeHtml(notes)}</text>`);
  if (segment.bonds.length === 0 && segment.onsite.length === 0) parts.push(`<text x="${width / 2}" y="${height / 2}" text-anchor="middle" class="plot-label halo">no terms</text>`);
  return svgDocument(width, height, `Segment ${segment.index}${segment.label ? ` (${segment.label})` : ''}: ${segment.bonds.length} bond(s), ${segment.onsite.length} on-site term(s)`, parts.join(''), 'plot-lattice');
}
