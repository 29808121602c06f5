/**
 * Geometry of two-dimensional Bravais lattices for band plots: the lattice
 * type (square, hexagonal, rectangular, centred rectangular, oblique) and a
 * path through the first Brillouin zone along its high-symmetry points.
 *
 * The first Brillouin zone is the Wigner–Seitz cell of the reciprocal lattice
 * (bᵢ·aⱼ = 2πδᵢⱼ): the set of k closer to Γ than to any other reciprocal
 * lattice vector G, i.e. the intersection of the half-planes k·G ≤ |G|²/2.
 * Its edge midpoints and vertices are the high-symmetry points the usual
 * paths run through (square: Γ–X–M–Γ; hexagonal: Γ–M–K–Γ; rectangular:
 * Γ–X–S–Y–Γ), common practice in band-structure plots.
 *
 * Plot geometry only: no verdict depends on it.
 */

export type Vec2 = [number, number];
export type BravaisKind = 'square' | 'hexagonal' | 'rectangular' | 'centred-rectangular' | 'oblique';

const dot = (a: Vec2, b: Vec2) => a[0] * b[0] + a[1] * b[1];
const norm = (a: Vec2) => Math.hypot(a[0], a[1]);
const add = (a: Vec2, b: Vec2): Vec2 => [a[0] + b[0], a[1] + b[1]];
const sub = (a: Vec2, b: Vec2): Vec2 => [a[0] - b[0], a[1] - b[1]];
const scale = (a: Vec2, s: number): Vec2 => [a[0] * s, a[1] * s];

/** Reciprocal vectors bᵢ with bᵢ·aⱼ = 2πδᵢⱼ. */
export function reciprocalVectors(a1: Vec2, a2: Vec2): [Vec2, Vec2] {
  const det = a1[0] * a2[1] - a1[1] * a2[0];
  if (Math.abs(det) < 1e-12) throw new RangeError('lattice vectors are parallel');
  const f = (2 * Math.PI) / det;
  return [[a2[1] * f, -a2[0] * f], [-a1[1] * f, a1[0] * f]];
}

/** Lagrange–Gauss reduction: the two shortest independent lattice vectors. */
function reducedBasis(a1: Vec2, a2: Vec2): [Vec2, Vec2] {
  let u = a1, v = a2;
  for (let guard = 0; guard < 100; guard++) {
    if (norm(u) > norm(v)) [u, v] = [v, u];
    const m = Math.round(dot(u, v) / dot(u, u));
    if (m === 0) break;
    v = sub(v, scale(u, m));
  }
  return norm(u) <= norm(v) ? [u, v] : [v, u];
}

/** The Bravais type of the lattice spanned by a₁, a₂ (relative tolerance 1e-6). */
export function bravaisKind(a1: Vec2, a2: Vec2): BravaisKind {
  const [u, v] = reducedBasis(a1, a2);
  const lu = norm(u), lv = norm(v);
  const cos = Math.abs(dot(u, v)) / (lu * lv);
  const equal = Math.abs(lu - lv) <= 1e-6 * lv;
  const right = cos <= 1e-6;
  if (equal && right) return 'square';
  if (equal && Math.abs(cos - 0.5) <= 1e-6) return 'hexagonal';
  if (right) return 'rectangular';
  // A rhombic reduced cell, or one whose diagonal is perpendicular to a side, is centred rectangular.
  if (equal || Math.abs(dot(u, sub(scale(v, 2), u))) <= 1e-6 * lu * lv || Math.abs(dot(v, sub(scale(u, 2), v))) <= 1e-6 * lu * lv) return 'centred-rectangular';
  return 'oblique';
}

/** Clips a convex polygon to the half-plane k·g ≤ c (Sutherland–Hodgman). */
function clip(polygon: Vec2[], g: Vec2, c: number): Vec2[] {
  const out: Vec2[] = [];
  for (let i = 0; i < polygon.length; i++) {
    const p = polygon[i], q = polygon[(i + 1) % polygon.length];
    const fp = dot(p, g) - c, fq = dot(q, g) - c;
    if (fp <= 0) out.push(p);
    if ((fp < 0 && fq > 0) || (fp > 0 && fq < 0)) out.push(add(p, scale(sub(q, p), fp / (fp - fq))));
  }
  return out;
}

/** Vertices of the first Brillouin zone, counter-clockwise. */
export function brillouinZone(a1: Vec2, a2: Vec2): Vec2[] {
  const [b1, b2] = reciprocalVectors(a1, a2);
  const big = 10 * Math.max(norm(b1), norm(b2));
  let polygon: Vec2[] = [[-big, -big], [big, -big], [big, big], [-big, big]];
  for (let m = -3; m <= 3; m++) {
    for (let n = -3; n <= 3; n++) {
      if (m === 0 && n === 0) continue;
      const g = add(scale(b1, m), scale(b2, n));
      polygon = clip(polygon, g, dot(g, g) / 2);
    }
  }
  // Merge vertices closer than a rounding error (clipping through a vertex duplicates it).
  const tol = 1e-9 * Math.max(norm(b1), norm(b2));
  return polygon.filter((p, i) => norm(sub(p, polygon[(i + 1) % polygon.length])) > tol);
}

export interface PathCorner {
  /** Reduced coordinates s (k = s₁b₁ + s₂b₂) in the basis given. */
  reduced: Vec2;
  label: string;
}

/** Reduced coordinates of a Cartesian momentum: sᵢ = k·aᵢ / 2π. */
function toReduced(k: Vec2, a1: Vec2, a2: Vec2): Vec2 {
  // Rounded to 1e-12: zone points are simple fractions, and exact values keep plot labels and records clean.
  const clean = (x: number) => {
    const r = Math.round(x * 1e12) / 1e12;
    return r === 0 ? 0 : r;
  };
  return [clean(dot(k, a1) / (2 * Math.PI)), clean(dot(k, a2) / (2 * Math.PI))];
}

/**
 * The high-symmetry path for band plots, as reduced momenta in the model's own
 * basis: Γ → edge midpoint → zone corner → Γ, with the names used for each
 * lattice type (rectangular lattices also pass the second edge midpoint).
 */
export function highSymmetryPath(a1: Vec2, a2: Vec2): { kind: BravaisKind; corners: PathCorner[] } {
  const kind = bravaisKind(a1, a2);
  const zone = brillouinZone(a1, a2);
  const [b1, b2] = reciprocalVectors(...reducedBasis(a1, a2));
  const edges = zone.map((p, i) => ({ from: p, to: zone[(i + 1) % zone.length], mid: scale(add(p, zone[(i + 1) % zone.length]), 0.5) }));
  const nearest = Math.min(...edges.map((e) => norm(e.mid)));
  const direction = scale(b1, 1 / norm(b1));
  // The nearest edge midpoint most aligned with b₁ of the reduced basis; then the corner of that edge towards b₂.
  const first = edges.filter((e) => norm(e.mid) <= nearest * (1 + 1e-6)).sort((x, y) => dot(y.mid, direction) - dot(x.mid, direction))[0];
  const corner = dot(first.from, b2) >= dot(first.to, b2) ? first.from : first.to;
  const names: Record<BravaisKind, [string, string]> = {
    square: ['X', 'M'],
    hexagonal: ['M', 'K'],
    rectangular: ['X', 'S'],
    'centred-rectangular': ['X', 'S'],
    oblique: ['X', 'S'],
  };
  const [midName, cornerName] = names[kind];
  const corners: PathCorner[] = [
    { reduced: [0, 0], label: 'Γ' },
    { reduced: toReduced(first.mid, a1, a2), label: midName },
    { reduced: toReduced(corner, a1, a2), label: cornerName },
  ];
  if (kind === 'rectangular') {
    const other = edges.find((e) => Math.abs(dot(e.mid, first.mid)) < 1e-9 * dot(first.mid, first.mid) && (e.from === corner || e.to === corner));
    if (other) corners.push({ reduced: toReduced(other.mid, a1, a2), label: 'Y' });
  }
  corners.push({ reduced: [0, 0], label: 'Γ' });
  return { kind, corners };
}
