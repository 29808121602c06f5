/**
 * What kind of lattice and drive a model has, for browsing and search: read
 * off the geometry and the segments of its file. The lattice is named from
 * its Bravais type and the distances between its sites (a honeycomb lattice
 * is a hexagonal Bravais lattice with two sites a/√3 apart, kagome has three
 * sites a/2 apart, Lieb three sites on the corners and edge centres of a
 * square, a checkerboard two sites a/√2 apart), common names of the trade.
 */
import { bravaisKind, type Vec2 } from '../catalogue/records/brillouin-zone.ts';
import type { ModelSource } from './model-source.ts';

export type LatticeKind = 'chain' | 'square' | 'checkerboard' | 'Lieb' | 'triangular' | 'honeycomb' | 'kagome' | 'rectangular' | 'centred rectangular' | 'oblique';
export type DriveKind = 'static' | 'step drive' | 'kicked' | 'harmonic modulation' | 'light field';

const DRIVE_KINDS: DriveKind[] = ['static', 'step drive', 'kicked', 'harmonic modulation', 'light field'];

export const DRIVE_MEANING: Record<DriveKind, string> = {
  static: 'one constant Hamiltonian over the whole period (a static model run as a drive)',
  'step drive': 'piecewise constant: several segments, each with constant terms',
  kicked: 'at least one instantaneous kick (a segment of zero duration)',
  'harmonic modulation': 'terms modulated in time by harmonics of ω = 2π/T',
  'light field': 'a time-dependent vector potential entering every hopping as a Peierls phase',
};

/** Kebab-case slug for URLs: "centred rectangular" → "centred-rectangular", "Lieb" → "lieb". */
export function slug(text: string): string {
  return text.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-+|-+$/g, '') || 'other';
}

/** Distinct site positions of one cell (orbitals on the same site count once). */
function sites(positions: Vec2[]): Vec2[] {
  const out: Vec2[] = [];
  for (const p of positions) if (!out.some((q) => Math.hypot(p[0] - q[0], p[1] - q[1]) < 1e-6)) out.push(p);
  return out;
}

/** Shortest distance between two sites over all lattice translations (|n| ≤ 2). */
function imageDistance(p: Vec2, q: Vec2, a1: Vec2, a2: Vec2): number {
  let best = Infinity;
  for (let m = -2; m <= 2; m++) {
    for (let n = -2; n <= 2; n++) {
      best = Math.min(best, Math.hypot(q[0] - p[0] + m * a1[0] + n * a2[0], q[1] - p[1] + m * a1[1] + n * a2[1]));
    }
  }
  return best;
}

const near = (x: number, y: number) => Math.abs(x - y) <= 1e-6 * Math.max(1, Math.abs(y));

export function latticeKind(source: ModelSource): LatticeKind | null {
  const lattice = source.document.lattice;
  if (!lattice) return null;
  if (lattice.dimension === 1) return 'chain';
  const [a1, a2] = lattice.vectors.map((v) => v.map((x) => source.value(x)) as Vec2);
  if (![...a1, ...a2].every(Number.isFinite)) return null;
  let bravais;
  try {
    bravais = bravaisKind(a1, a2);
  } catch {
    return null;
  }
  const points = sites(lattice.orbitals.map((o) => o.position.map((x) => source.value(x)) as Vec2).filter((p) => p.every(Number.isFinite)));
  const a = Math.min(Math.hypot(...a1), Math.hypot(...a2));
  const pairs: number[] = [];
  for (let i = 0; i < points.length; i++) for (let j = i + 1; j < points.length; j++) pairs.push(imageDistance(points[i], points[j], a1, a2));
  pairs.sort((x, y) => x - y);
  if (bravais === 'hexagonal') {
    if (points.length === 2 && near(pairs[0], a / Math.sqrt(3))) return 'honeycomb';
    if (points.length === 3 && pairs.every((d) => near(d, a / 2))) return 'kagome';
    return 'triangular';
  }
  if (bravais === 'square') {
    if (points.length === 2 && near(pairs[0], a / Math.SQRT2)) return 'checkerboard';
    if (points.length === 3 && near(pairs[0], a / 2) && near(pairs[1], a / 2) && near(pairs[2], a / Math.SQRT2)) return 'Lieb';
    return 'square';
  }
  return bravais === 'centred-rectangular' ? 'centred rectangular' : bravais;
}

export function driveKinds(source: ModelSource): DriveKind[] {
  const drive = source.document.drive;
  if (!drive) return [];
  const kinds = new Set<DriveKind>();
  const period = source.value(drive.period);
  const durations = drive.segments.map((s) => source.value(s.duration));
  const modulated = drive.segments.some((s) => [...(s.onsite ?? []), ...(s.hoppings ?? []), ...(s.pairings ?? [])].some((t) => t.modulation?.kind === 'harmonic'));
  const light = drive.segments.some((s) => (s.vectorPotential ?? []).some((c) => c.harmonic !== 0));
  if (durations.some((d) => d === 0)) kinds.add('kicked');
  if (modulated) kinds.add('harmonic modulation');
  if (light) kinds.add('light field');
  const timed = durations.filter((d) => d > 0).length;
  if (timed >= 2) kinds.add('step drive');
  if (kinds.size === 0 && timed === 1 && near(durations.find((d) => d > 0) ?? 0, period)) kinds.add('static');
  return DRIVE_KINDS.filter((k) => kinds.has(k));
}
