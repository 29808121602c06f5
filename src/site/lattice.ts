/**
 * The lattice of a model file as drawing data: lattice vectors, orbital
 * positions and, per drive segment, the bonds switched on (hoppings and
 * pairings, with their cell offsets) and the orbitals with an on-site term.
 * Values are evaluated with the model's parameters; a term whose amplitude
 * evaluates to zero is still drawn (it is in the file), but marked.
 */
import type { Amplitude, ModelDocument, Quantity } from '../catalogue/model-types.generated.ts';

export type Point = [number, number];

export interface BondData {
  from: number;
  to: number;
  offset: number[];
  kind: 'hopping' | 'pairing';
  /** Complex amplitude or a Peierls phase: the direction from → to matters. */
  directed: boolean;
  modulated: boolean;
}

export interface SegmentDrawing {
  index: number;
  label: string | null;
  kick: boolean;
  bonds: BondData[];
  /** Orbitals with an on-site term and the sign of its value (0 when modulated around 0 or unknown). */
  onsite: { orbital: number; sign: -1 | 0 | 1; modulated: boolean }[];
  light: boolean;
}

export interface LatticeGeometry {
  dimension: 1 | 2;
  vectors: Point[];
  orbitals: { name: string; position: Point }[];
  /** a₁ × a₂ > 0 (2D only). */
  handedness: 'right' | 'left' | null;
  segments: SegmentDrawing[];
}

function directed(amplitude: Amplitude): boolean {
  return typeof amplitude === 'object' && amplitude !== null;
}

export function latticeGeometry(doc: ModelDocument, value: (q: Quantity) => number): LatticeGeometry | null {
  const lattice = doc.lattice;
  const dimension = lattice.dimension;
  const point = (v: Quantity[]): Point => (dimension === 1 ? [value(v[0]), 0] : [value(v[0]), value(v[1])]);
  const vectors = lattice.vectors.map(point);
  const orbitals = lattice.orbitals.map((o) => ({ name: o.name, position: point(o.position) }));
  if (![...vectors, ...orbitals.map((o) => o.position)].every((p) => p.every(Number.isFinite))) return null;
  const index = new Map(orbitals.map((o, i) => [o.name, i]));
  const handedness = dimension === 2 ? (vectors[0][0] * vectors[1][1] - vectors[0][1] * vectors[1][0] > 0 ? 'right' : 'left') : null;
  const segments = doc.drive.segments.map((s, i): SegmentDrawing => {
    const light = (s.vectorPotential ?? []).some((c) => c.harmonic !== 0 || c.amplitude.some((a) => a !== 0));
    const bonds: BondData[] = [];
    for (const [kind, terms] of [['hopping', s.hoppings ?? []], ['pairing', s.pairings ?? []]] as const) {
      for (const t of terms) {
        const from = index.get(t.from), to = index.get(t.to);
        if (from === undefined || to === undefined) continue;
        bonds.push({ from, to, offset: [...t.offset], kind, directed: directed(t.amplitude) || (kind === 'hopping' && light), modulated: t.modulation?.kind === 'harmonic' });
      }
    }
    const onsite = (s.onsite ?? []).flatMap((t) => {
      const orbital = index.get(t.orbital);
      if (orbital === undefined) return [];
      const v = value(t.energy);
      const modulated = t.modulation?.kind === 'harmonic';
      return [{ orbital, sign: (!Number.isFinite(v) || v === 0 ? 0 : Math.sign(v)) as -1 | 0 | 1, modulated }];
    });
    return { index: i + 1, label: s.label ?? null, kick: value(s.duration) === 0, bonds, onsite, light };
  });
  return { dimension, vectors, orbitals, handedness, segments };
}
