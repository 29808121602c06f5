/**
 * Bogoliubov–de Gennes (Nambu) form of a superconducting drive.
 *
 * Convention (stated once here and in docs/conventions.md): with
 * Ψ_R = (c_{1,R} … c_{n,R}, c†_{1,R} … c†_{n,R})ᵀ the many-body Hamiltonian is
 *     H = ½ Σ Ψ† H_BdG Ψ   (+ a constant),
 * so the BdG matrix has particle block h(k), hole block −h(−k)* and pairing
 * blocks. Nambu states: particles 0 … n−1 (labels as in the normal drive,
 * charge q), holes n … 2n−1 (labels "h:X", charge −q), positions unchanged.
 *
 * Each normal term t c†_{b,R+n} c_{a,R} (+ h.c.) yields the particle term
 * (a → b, offset n, amplitude t) and the hole term (h:b → h:a, offset −n,
 * amplitude −t): −½ t c_{a,R} c†_{b,R+n} = −½ t h†_{a,R} h_{b,R+n}. The Peierls
 * phase of the hole term, e^{i(−q)A·(−d)}, equals the particle's, as the hole
 * block −h(−k)* requires. An onsite ε becomes +ε on a and −ε on h:a.
 *
 * A pairing term Δ c†_{to,R+n} c†_{from,R} + h.c. is split symmetrically,
 * ½Δ c†_{to}c†_{from} − ½Δ c†_{from}c†_{to}, giving the two Nambu terms
 * (h:from → to, offset n, amplitude Δ) and (h:to → from, offset −n, amplitude −Δ).
 * Pairing terms carry no Peierls phase (bloch.ts gives a particle–hole term the
 * mean charge 0).
 *
 * Particle–hole symmetry: C = U_C K with U_C = τ_x ⊗ 1_n,
 *     U_C H_BdG(k)* U_C† = −H_BdG(−k).
 */
import type { Complex, ComplexMatrix } from '../linalg/complex-matrix.ts';
import type { DriveSegment, DriveTerm, LatticeDrive, Modulation } from './drive.ts';
import { zeros } from '../linalg/complex-matrix.ts';

/** Δ c†_{to,R+n} c†_{from,R} + h.c., with modulation f(t) multiplying Δ. */
export interface PairingTerm {
  from: number;
  to: number;
  offset: number[];
  amplitude: Complex;
  modulation: Modulation;
}

export class NambuInputError extends RangeError {
  override name = 'NambuInputError';
}

export function nambuDrive(normal: LatticeDrive, pairings: PairingTerm[][]): LatticeDrive {
  const n = normal.states.length;
  if (pairings.length !== normal.segments.length) {
    throw new NambuInputError(
      `nambuDrive: ${pairings.length} pairing lists for ${normal.segments.length} segments; give one list (possibly empty) per segment`,
    );
  }
  const states = [
    ...normal.states.map((s) => ({ label: s.label, position: s.position.slice(), charge: s.charge })),
    ...normal.states.map((s) => ({ label: `h:${s.label}`, position: s.position.slice(), charge: -s.charge })),
  ];
  const negate = (v: number[]) => v.map((x) => (x === 0 ? 0 : -x));
  const segments: DriveSegment[] = normal.segments.map((segment, si) => {
    const terms: DriveTerm[] = [];
    for (const t of segment.terms) {
      terms.push({ ...t, offset: t.offset.slice() });
      terms.push({
        from: n + t.to,
        to: n + t.from,
        offset: negate(t.offset),
        amplitude: { re: -t.amplitude.re, im: -t.amplitude.im },
        modulation: t.modulation,
      });
    }
    pairings[si].forEach((p, pi) => {
      const where = `segment ${si}, pairing ${pi}`;
      if (!(Number.isInteger(p.from) && p.from >= 0 && p.from < n && Number.isInteger(p.to) && p.to >= 0 && p.to < n)) {
        throw new NambuInputError(`nambuDrive: ${where}: state indices ${p.from} → ${p.to} outside 0…${n - 1}`);
      }
      if (p.offset.length !== normal.dimension) {
        throw new NambuInputError(`nambuDrive: ${where}: offset has ${p.offset.length} components, the lattice has dimension ${normal.dimension}`);
      }
      if (p.from === p.to && p.offset.every((x) => x === 0)) {
        throw new NambuInputError(`nambuDrive: ${where}: pairing a state with itself in the same cell vanishes for spinless fermions (c†c† = 0)`);
      }
      terms.push({ from: n + p.from, to: p.to, offset: p.offset.slice(), amplitude: { ...p.amplitude }, modulation: p.modulation });
      terms.push({
        from: n + p.to,
        to: p.from,
        offset: negate(p.offset),
        amplitude: { re: -p.amplitude.re, im: -p.amplitude.im },
        modulation: p.modulation,
      });
    });
    const out: DriveSegment = { duration: segment.duration, terms };
    if (segment.label !== undefined) out.label = segment.label;
    if (segment.vectorPotential !== undefined) out.vectorPotential = segment.vectorPotential;
    return out;
  });
  return { ...normal, states, segments };
}

/** U_C = τ_x ⊗ 1_n of the antiunitary particle–hole operator C = U_C K in the Nambu basis of `nambuDrive`. */
export function nambuParticleHole(n: number): ComplexMatrix {
  const u = zeros(2 * n, 2 * n);
  for (let i = 0; i < n; i++) {
    u.re[i * 2 * n + n + i] = 1;
    u.re[(n + i) * 2 * n + i] = 1;
  }
  return u;
}
