/**
 * The invariants of a model as a reader scans them: Chern numbers per band,
 * W per gap, ν₀/ν_π, edge and end counts, taken from the computed portrait of
 * the record (claimed or not; a value the engine could not settle is null).
 * The profile is plain JSON so the browser can filter on it, and this module
 * imports nothing that does not run in a browser.
 */
import { edgeName, gapSubscript } from '../catalogue/vocabulary.ts';

export interface InvariantProfile {
  /** Chern numbers of the bands, counted upward from the cut; null = unsettled. */
  C: (number | null)[];
  /** Gap label (units π/T) the bands are counted from. */
  cut: number | null;
  /** [gap label, W] per gap. */
  W: [number, number | null][];
  /** [gap label, ν] per gap (chains). */
  nu: [number, number | null][];
  /** [gap label, finite along, edge, signed count]. */
  edge: [number, number, 'low' | 'high', number | null][];
  /** [gap label, end modes per end]. */
  end: [number, number | null][];
  /** Chain invariants are Z₂ indices (class D). */
  z2: boolean;
}

export interface PortraitLike {
  id: string;
  quantity: string;
  gap: number | null;
  value: number | null;
  settled: boolean;
}

/** Gaps in reading order: 0 first, then π, then the others by label. */
export function gapOrder(a: number, b: number): number {
  const rank = (x: number) => (Math.abs(x) < 1e-9 ? 0 : Math.abs(x - 1) < 1e-9 ? 1 : 2);
  return rank(a) - rank(b) || a - b;
}

export function invariantProfile(portrait: PortraitLike[], options: { cut?: number | null; symmetryClass?: string | null } = {}): InvariantProfile {
  const value = (e: PortraitLike) => (e.settled ? e.value : null);
  const profile: InvariantProfile = { C: [], cut: options.cut ?? null, W: [], nu: [], edge: [], end: [], z2: options.symmetryClass === 'D' };
  for (const e of portrait) {
    const band = /^band-(\d+)\/chern/.exec(e.id);
    if (e.quantity === 'chern' && band) profile.C[Number(band[1])] = value(e);
    else if (e.quantity === 'winding' && e.gap !== null) profile.W.push([e.gap, value(e)]);
    else if (e.quantity === 'gap-invariant' && e.gap !== null) profile.nu.push([e.gap, value(e)]);
    else if (e.quantity === 'end-modes' && e.gap !== null) profile.end.push([e.gap, value(e)]);
    else if (e.quantity === 'edge-modes' && e.gap !== null) {
      const m = /edge-(\d)-(low|high)/.exec(e.id);
      if (m) profile.edge.push([e.gap, Number(m[1]), m[2] as 'low' | 'high', value(e)]);
    }
  }
  for (let i = 0; i < profile.C.length; i++) if (profile.C[i] === undefined) profile.C[i] = null;
  profile.W.sort((a, b) => gapOrder(a[0], b[0]));
  profile.nu.sort((a, b) => gapOrder(a[0], b[0]));
  profile.end.sort((a, b) => gapOrder(a[0], b[0]));
  profile.edge.sort((a, b) => gapOrder(a[0], b[0]) || a[1] - b[1] || (a[2] === b[2] ? 0 : a[2] === 'low' ? -1 : 1));
  return profile;
}

const num = (v: number | null) => (v === null ? '?' : String(v).replace('-', '−'));
const signed = (v: number | null) => (v === null ? '?' : v > 0 ? `+${v}` : String(v).replace('-', '−'));

/**
 * The profile as short lines of text with "_" subscripts, e.g.
 * ["C = (0, 0)", "W_0 = 1, W_π = 1", "edge modes along a₂ (low/high): 0: +1/−1; π: +1/−1"].
 * "?" marks a value the engine could not settle.
 */
export function invariantLines(p: InvariantProfile): string[] {
  const lines: string[] = [];
  if (p.C.length > 0) lines.push(`C = (${p.C.map(num).join(', ')})`);
  if (p.W.length > 0) lines.push(p.W.map(([g, v]) => `W_${gapSubscript(g)} = ${num(v)}`).join(', '));
  if (p.nu.length > 0) lines.push(p.nu.map(([g, v]) => `ν_${gapSubscript(g)} = ${num(v)}`).join(', ') + (p.z2 ? ' (Z₂)' : ''));
  const directions = [...new Set(p.edge.map((e) => e[1]))];
  for (const f of directions) {
    const gaps = [...new Set(p.edge.filter((e) => e[1] === f).map((e) => e[0]))];
    const parts = gaps.map((g) => {
      const low = p.edge.find((e) => e[0] === g && e[1] === f && e[2] === 'low');
      const high = p.edge.find((e) => e[0] === g && e[1] === f && e[2] === 'high');
      return `${gapSubscript(g)}: ${signed(low?.[3] ?? null)}/${signed(high?.[3] ?? null)}`;
    });
    lines.push(`edge modes low/high, finite along ${edgeName(f, 'low').slice(-2)}: ${parts.join('; ')}`);
  }
  if (p.end.length > 0) lines.push(`end modes per end: ${p.end.map(([g, v]) => `${num(v)} at ${gapSubscript(g)}`).join(', ')}`);
  return lines;
}

/** Words and values for the search index: "W_π = 1 Wπ=1 W ≠ 0 …". */
export function invariantSearchText(p: InvariantProfile): string {
  const words: string[] = [];
  for (const [g, v] of p.W) if (v !== null) words.push(`W${gapSubscript(g)}=${v}`);
  for (const [g, v] of p.nu) if (v !== null) words.push(`ν${gapSubscript(g)}=${v}`, `nu${gapSubscript(g).replace('π', 'pi')}=${v}`);
  p.C.forEach((v, i) => v !== null && words.push(`C${i + 1}=${v}`));
  return words.join(' ');
}
