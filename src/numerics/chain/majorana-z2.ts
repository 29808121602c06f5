/**
 * Class D invariants of a driven superconducting chain: the Z₂ indices M₀ and
 * M_π (−1 means an odd number of Majorana end modes at quasienergy 0, resp. π/T).
 *
 * Setting (Jiang et al., PRL 106, 220402 (2011); Kitaev, Phys. Usp. 44, 131
 * (2001)): at the particle–hole symmetric momenta k* ∈ {0, π} the BdG Floquet
 * operator in the Majorana basis, U_M = V U V† with V = (1/√2)[[1, 1], [−i, i]] ⊗ 1_n,
 * is real orthogonal with det = 1, U_M = O diag(R(θ_j)) Oᵀ, O ∈ SO(2n), |θ_j| ≤ π.
 *
 * Formulation used here (derived in docs/conventions.md, 1D chains):
 * - q(k*) = sign Pf[(U_M − U_Mᵀ)/2] = Π sign sin θ_j = sign Pf[log U_M] — the
 *   Kitaev Pfaffian sign of the effective Hamiltonian with the cut at π;
 *   it flips whenever an eigenvalue pair passes +1 or −1;
 * - s(k*) = sign Tr Û(k*), the sign of the spin lift of the whole path
 *   t ↦ U_M(k*, t) (fock-spin-lift.ts); it flips only when a pair passes −1.
 * Then
 *     M_π = s(0) s(π),   M₀ = q(0) q(π) s(0) s(π).
 * M_π changes exactly at π-gap closings at k*, M₀ exactly at 0-gap closings,
 * and an undriven chain with bandwidth below π/T has s = +1 and M₀ equal to
 * Kitaev's static index. This makes concrete the statement that products of
 * Pfaffian signs of the Majorana-basis generators replace the static index.
 */
import type { ComplexMatrix } from '../linalg/complex-matrix.ts';
import type { LatticeDrive } from '../evolution/drive.ts';
import type { PropagatorOptions } from '../evolution/propagator.ts';
import { adjoint, multiply, identity, distance, zeros } from '../linalg/complex-matrix.ts';
import { LuDecomposition } from '../linalg/lu.ts';
import { expMinusIHt } from '../linalg/exponential.ts';
import { floquetOperator } from '../evolution/propagator.ts';
import { prepareBloch } from '../evolution/bloch.ts';
import { segmentStartTimes } from '../evolution/drive.ts';
import { nambuParticleHole } from '../evolution/bdg.ts';
import { realSkewPfaffian } from './pfaffian.ts';
import { fockHamiltonian, majoranaOperators, majoranaProducts, MAX_FOCK_MODES } from './fock-spin-lift.ts';
import { isTimeDependent } from '../symmetry/reflection-residual.ts';
import { formatNumber } from '../number-format.ts';

export interface MajoranaParity {
  /** +1: even number (usually none) of Majorana modes per end; −1: odd. null when unsettled. */
  sign: 1 | -1 | null;
  /** The smallest magnitude the sign rests on (|Pf| or |Tr Û|/2ⁿ products); near 0 means a gap closes at k*. */
  margin: number;
  tolerance: number;
  caveat?: string;
}

export interface MajoranaMomentumRecord {
  /** Reduced momentum, 0 or 0.5. */
  momentum: number;
  /** Tr Û / 2ⁿ = s Π cos(θ_j/2). */
  spinTrace: number;
  /** Pf[(U_M − U_Mᵀ)/2] = Π sin θ_j. */
  pfaffian: number;
  /** ‖Im U_M‖_F: how far the Majorana-basis Floquet operator is from real. */
  realityDefect: number;
  /** |(Tr Û/2ⁿ)² − det((1 + U_M)/2)|: agreement of the many-body and single-particle evolutions. */
  liftConsistency: number;
  /** Time slices used in the Fock-space evolution (sum over segments). */
  slices: number;
}

export interface MajoranaInvariants {
  status: 'computed' | 'not-nambu' | 'too-many-orbitals';
  zero?: MajoranaParity;
  pi?: MajoranaParity;
  points: MajoranaMomentumRecord[];
  reason?: string;
}

export interface MajoranaOptions {
  /** Margins below this make the parity unsettled (default 1e-8). */
  tolerance?: number;
  propagator?: PropagatorOptions;
}

/** V = (1/√2)[[1, 1], [−i, i]] ⊗ 1_n. */
export function majoranaTransform(n: number): ComplexMatrix {
  const v = zeros(2 * n, 2 * n);
  const r = Math.SQRT1_2;
  for (let a = 0; a < n; a++) {
    v.re[a * 2 * n + a] = r;
    v.re[a * 2 * n + n + a] = r;
    v.im[(n + a) * 2 * n + a] = -r;
    v.im[(n + a) * 2 * n + n + a] = r;
  }
  return v;
}

export function majoranaInvariants(drive: LatticeDrive, particleHole: ComplexMatrix, options: MajoranaOptions = {}): MajoranaInvariants {
  const size = drive.states.length;
  const tolerance = options.tolerance ?? 1e-8;
  if (size % 2 !== 0 || particleHole.rows !== size || particleHole.cols !== size || distance(particleHole, nambuParticleHole(size / 2)) > 1e-12) {
    return { status: 'not-nambu', points: [], reason: 'the particle–hole operator is not τ_x ⊗ 1 in the Nambu order of bdg.ts; the Majorana-basis Z₂ needs that form' };
  }
  const n = size / 2;
  if (n > MAX_FOCK_MODES) {
    return { status: 'too-many-orbitals', points: [], reason: `${n} fermion modes per cell exceed the ${MAX_FOCK_MODES} the spin-lift sign is computed for` };
  }
  const v = majoranaTransform(n);
  const vd = adjoint(v);
  const products = majoranaProducts(majoranaOperators(n));
  const points = [0, 0.5].map((k): MajoranaMomentumRecord => {
    const u = floquetOperator(drive, [k], options.propagator).operator;
    const um = multiply(multiply(v, u), vd);
    const m = 2 * n;
    const skew = new Float64Array(m * m);
    let realityDefect = 0;
    for (let i = 0; i < m; i++) {
      for (let j = 0; j < m; j++) {
        skew[i * m + j] = 0.5 * (um.re[i * m + j] - um.re[j * m + i]);
        realityDefect += um.im[i * m + j] ** 2;
      }
    }
    const pfaffian = realSkewPfaffian(skew, m, 1e-8);
    const { trace, slices } = fockTrace(drive, k, v, vd, products);
    const spinTrace = trace / (1 << n);
    // det((1 + U_M)/2) = Π cos²(θ_j/2).
    const onePlus = identity(m);
    for (let q = 0; q < m * m; q++) onePlus.re[q] = 0.5 * (onePlus.re[q] + um.re[q]);
    const det = new LuDecomposition(onePlus).determinant.re;
    return { momentum: k, spinTrace, pfaffian, realityDefect: Math.sqrt(realityDefect), liftConsistency: Math.abs(spinTrace * spinTrace - det), slices };
  });
  const sign = (x: number): 1 | -1 => (x < 0 ? -1 : 1);
  const parity = (value: 1 | -1, margins: number[], what: string): MajoranaParity => {
    const margin = Math.min(...margins);
    if (margin > tolerance) return { sign: value, margin, tolerance };
    const where = margins.indexOf(margin) % 2 === 0 ? '0' : 'π';
    return { sign: null, margin, tolerance, caveat: `${what} is ${formatNumber(margin)} at k = ${where} (tolerance ${formatNumber(tolerance)}): a gap closes there` };
  };
  const s = points.map((p) => sign(p.spinTrace));
  const q = points.map((p) => sign(p.pfaffian));
  const traces = points.map((p) => Math.abs(p.spinTrace));
  const pfaffians = points.map((p) => Math.abs(p.pfaffian));
  return {
    status: 'computed',
    zero: parity((q[0] * q[1] * s[0] * s[1]) as 1 | -1, [Math.min(pfaffians[0], traces[0]), Math.min(pfaffians[1], traces[1])], 'min(|Pf|, |Tr Û|/2ⁿ)'),
    pi: parity((s[0] * s[1]) as 1 | -1, traces, '|Tr Û|/2ⁿ'),
    points,
  };
}

/** Tr Û(k*, T) of the many-body evolution; time-dependent segments use the midpoint rule, refined until the trace settles. */
function fockTrace(drive: LatticeDrive, k: number, v: ComplexMatrix, vd: ComplexMatrix, products: ComplexMatrix[][]): { trace: number; slices: number } {
  const bloch = prepareBloch(drive, [k]);
  const starts = segmentStartTimes(drive);
  const d = products[0][0].rows;
  const toFock = (h: ComplexMatrix) => {
    const f = fockHamiltonian(multiply(multiply(v, h), vd), products);
    // Symmetrise against rounding.
    for (let i = 0; i < d; i++) {
      for (let j = 0; j <= i; j++) {
        const re = 0.5 * (f.re[i * d + j] + f.re[j * d + i]), im = 0.5 * (f.im[i * d + j] - f.im[j * d + i]);
        f.re[i * d + j] = re; f.re[j * d + i] = re; f.im[i * d + j] = im; f.im[j * d + i] = -im;
      }
    }
    return f;
  };
  const evolve = (refine: number): { u: ComplexMatrix; slices: number } => {
    let u = identity(d), slices = 0;
    drive.segments.forEach((seg, i) => {
      if (seg.duration === 0) {
        u = multiply(expMinusIHt(toFock(bloch.segmentAt(i, starts[i])), 1), u);
        slices++;
        return;
      }
      if (!isTimeDependent(drive, i)) {
        u = multiply(expMinusIHt(toFock(bloch.segmentAt(i, starts[i])), seg.duration), u);
        slices++;
        return;
      }
      const m = 32 * refine;
      const dt = seg.duration / m;
      for (let j = 0; j < m; j++) u = multiply(expMinusIHt(toFock(bloch.segmentAt(i, starts[i] + (j + 0.5) * dt)), dt), u);
      slices += m;
    });
    return { u, slices };
  };
  const traceOf = (u: ComplexMatrix) => {
    let t = 0;
    for (let i = 0; i < d; i++) t += u.re[i * d + i];
    return t;
  };
  let refine = 1;
  let last = evolve(refine);
  if (drive.segments.every((_, i) => !isTimeDependent(drive, i))) return { trace: traceOf(last.u), slices: last.slices };
  for (;;) {
    refine *= 2;
    const next = evolve(refine);
    const a = traceOf(last.u), b = traceOf(next.u);
    if ((Math.sign(a) === Math.sign(b) && Math.abs(a - b) < 0.05 * Math.abs(b)) || refine >= 64) return { trace: b, slices: next.slices };
    last = next;
  }
}
