/**
 * The 2D engine against published results for driven lattices: the circularly
 * driven honeycomb lattice at high frequency, the three-step honeycomb drive,
 * invariance under a shift of the time origin, and the accuracy of the
 * time-dependent propagator. Published statements are from memory of the cited
 * papers; every number compared against is derived in the test.
 */
import { describe, expect, it } from 'vitest';
import type { LatticeDrive } from '../../../src/numerics/evolution/drive.ts';
import type { ComplexMatrix } from '../../../src/numerics/linalg/complex-matrix.ts';
import { distance, multiply, unitarityDefect, zeros } from '../../../src/numerics/linalg/complex-matrix.ts';
import { UnitaryEigen } from '../../../src/numerics/linalg/unitary-eigen.ts';
import { prepareBloch } from '../../../src/numerics/evolution/bloch.ts';
import { evolutionOperators, floquetOperator } from '../../../src/numerics/evolution/propagator.ts';
import type { PropagatorOptions } from '../../../src/numerics/evolution/propagator.ts';
import { circularDifference, quasienergiesFromEigenphases } from '../../../src/numerics/quasienergy-bands.ts';
import { analyseSheet, edgeSign } from '../../../src/numerics/sheet/sheet-analysis.ts';
import type { SheetPortrait } from '../../../src/numerics/portrait.ts';
import { circularHoneycombDrive, HONEYCOMB_BONDS, HONEYCOMB_STATES, HONEYCOMB_VECTORS, threeStepHoneycombDrive } from '../../support/drives/honeycomb.ts';
import { checkerboardDrive } from '../../support/drives/checkerboard.ts';
import { reverseSegments, rotateSegments, shiftTimeOrigin } from '../../support/drives/driven-extra.ts';
import { seededRandom } from '../../support/random.ts';
import { expectBelow, expectWithin } from '../linalg/comparisons.ts';

// ---------------------------------------------------------------------------
// Small utilities
// ---------------------------------------------------------------------------

/** Quasienergies (units π/T, ascending in (−1, 1]) of U(s, T) and the propagator's accuracy bound (radians). */
function floquetSpectrum(drive: LatticeDrive, s: number[], options: PropagatorOptions = {}): { values: Float64Array; eigen: UnitaryEigen; order: number[]; accuracy: number } {
  const p = floquetOperator(drive, s, options);
  if (!p.converged) expect.fail(`propagator did not converge at s = (${s.join(', ')}): ${p.caveat}`);
  const eigen = new UnitaryEigen(p.operator);
  const { values, order } = quasienergiesFromEigenphases(eigen.phases);
  return { values, eigen, order, accuracy: p.accuracy };
}

function commutator(a: ComplexMatrix, b: ComplexMatrix): ComplexMatrix {
  const ab = multiply(a, b), ba = multiply(b, a);
  const c = zeros(a.rows, a.cols);
  for (let p = 0; p < c.re.length; p++) {
    c.re[p] = ab.re[p] - ba.re[p];
    c.im[p] = ab.im[p] - ba.im[p];
  }
  return c;
}

/** Bessel function J_m(x) from its power series Σ_k (−1)^k (x/2)^{2k+|m|} / (k!(k+|m|)!), J_{−m} = (−1)^m J_m. */
function besselJ(m: number, x: number): number {
  const n = Math.abs(m);
  let term = 1;
  for (let j = 1; j <= n; j++) term *= x / 2 / j;
  let sum = term;
  for (let k = 1; k < 40; k++) {
    term *= -(x * x) / 4 / (k * (k + n));
    sum += term;
  }
  return m < 0 && n % 2 === 1 ? -sum : sum;
}

// ---------------------------------------------------------------------------
// 1. Circularly driven honeycomb lattice at high frequency
// ---------------------------------------------------------------------------

/**
 * First-order high-frequency (van Vleck / Floquet–Magnus) effective Hamiltonian.
 *
 * Write H(t) = Σ_m H_m e^{imωt}, H_m = (1/T)∫₀ᵀ H(t) e^{−imωt} dt, H_{−m} = H_m†.
 * The Magnus expansion of U(T) = exp(−iT H_F) gives
 *   H_F = H₀ − (i/2T)∫₀ᵀdt₁∫₀^{t₁}dt₂ [H(t₁), H(t₂)] + O(1/ω²).
 * Inserting the Fourier series, ∫₀ᵀdt₁ e^{imωt₁}∫₀^{t₁}dt₂ e^{inωt₂} equals
 * T(δ_{m+n,0} − δ_{m,0})/(inω) for n ≠ 0 and T/(imω) for n = 0, m ≠ 0, so
 *   H_F = H₀ + Σ_{m≥1} [H_m, H_{−m}]/(mω) + (1/ω) Σ_{m≠0} [H₀, H_m]/m + O(1/ω²).
 * The last sum is a first-order unitary change of frame (the kick operator,
 * dependent on the time origin); the frame-independent (van Vleck) Hamiltonian
 *   H_eff = H₀ + Σ_{m≥1} [H_m, H_{−m}]/(mω) + O(1/ω²)
 * has the same quasienergies as U(T) order by order (Eckardt & Anisimovas,
 * New J. Phys. 17, 093039 (2015); Goldman & Dalibard, PRX 4, 031027 (2014);
 * from memory). Sign check on a spin in a rotating field,
 * H = (Δ/2)σ_z + (Ω/2)(σ₊e^{−iωt} + σ₋e^{iωt}): H₁ = (Ω/2)σ₋, and
 * [H₁, H₋₁]/ω = −(Ω²/4ω)σ_z, the Bloch–Siegert-like shift of the exact
 * rotating-frame solution (Δ/2 − Ω²/4ω + …)σ_z (expanding √((Δ−ω)² + Ω²)).
 *
 * The Fourier components are computed by the trapezoidal rule on `nodes` equally
 * spaced times of H(s, t) from the engine's Bloch Hamiltonian; for a
 * trigonometric series the rule is exact up to aliasing of harmonics ±nodes,
 * whose weight here is ≈ J_nodes(A₀) (below 1e-90 for nodes = 64, A₀ ≤ 1).
 */
function fourierComponents(drive: LatticeDrive, s: number[], harmonics: number, nodes = 64): Map<number, ComplexMatrix> {
  const bloch = prepareBloch(drive, s);
  const n = bloch.size;
  const T = drive.period, omega = (2 * Math.PI) / T;
  const out = new Map<number, ComplexMatrix>();
  for (let m = -harmonics; m <= harmonics; m++) out.set(m, zeros(n, n));
  for (let j = 0; j < nodes; j++) {
    const t = (j * T) / nodes;
    const h = bloch.at(t);
    for (let m = -harmonics; m <= harmonics; m++) {
      const c = Math.cos(m * omega * t) / nodes, sn = -Math.sin(m * omega * t) / nodes;
      const target = out.get(m)!;
      for (let p = 0; p < h.re.length; p++) {
        target.re[p] += h.re[p] * c - h.im[p] * sn;
        target.im[p] += h.re[p] * sn + h.im[p] * c;
      }
    }
  }
  return out;
}

/** H_eff = H₀ + Σ_{m=1}^{M} [H_m, H_{−m}]/(mω); M = 8 leaves out terms ∝ J_9(A₀)² < 1e-17 for A₀ ≤ 1. */
function highFrequencyHamiltonian(drive: LatticeDrive, s: number[], harmonics = 8): ComplexMatrix {
  const h = fourierComponents(drive, s, harmonics);
  const omega = (2 * Math.PI) / drive.period;
  const eff = h.get(0)!;
  for (let m = 1; m <= harmonics; m++) {
    const c = commutator(h.get(m)!, h.get(-m)!);
    for (let p = 0; p < eff.re.length; p++) {
      eff.re[p] += c.re[p] / (m * omega);
      eff.im[p] += c.im[p] / (m * omega);
    }
  }
  return eff;
}

/**
 * Dirac points of the honeycomb builder (reduced momenta). With the cell gauge
 * the bond phases are e^{−2πi s·n_j}, n₁ = (0,0), n₂ = (0,−1), n₃ = (1,−1), i.e.
 * (1, e^{2πis₂}, e^{2πi(s₂−s₁)}). They sum to zero when they are the three cube
 * roots of unity: s = (2/3, 1/3) gives phases (1, ω₃, ω₃²) (call it K),
 * s = (1/3, 2/3) gives (1, ω₃², ω₃) (K′), with ω₃ = e^{2πi/3}.
 */
const K = [2 / 3, 1 / 3];
const K_PRIME = [1 / 3, 2 / 3];

/** Angle θ_j of the bond vector δ_j (unit length), computed from the builder's geometry. */
function bondAngles(): number[] {
  return HONEYCOMB_BONDS.map(([n1, n2]) => {
    const d = [0, 1].map((c) => n1 * HONEYCOMB_VECTORS[0][c] + n2 * HONEYCOMB_VECTORS[1][c] + HONEYCOMB_STATES[1].position[c] - HONEYCOMB_STATES[0].position[c]);
    return Math.atan2(d[1], d[0]);
  });
}

/** (B, A) element of a 2×2 matrix, as [re, im]. */
const offDiagonal = (h: ComplexMatrix): [number, number] => [h.re[2], h.im[2]];
/** Coefficient of σ_z (A = first state) of a Hermitian 2×2 matrix. */
const massOf = (h: ComplexMatrix): number => (h.re[0] - h.re[3]) / 2;

describe('circularly driven honeycomb lattice at high frequency (Oka & Aoki, PRB 79, 081406(R) (2009); Kitagawa, Oka, Brataas, Fu, Demler, PRB 84, 235108 (2011))', () => {
  /**
   * Jacobi–Anger. With A(t) = A₀(cos ωt, χ sin ωt) and a unit bond vector at
   * angle θ_j, A(t)·δ_j = A₀ cos(ωt − χθ_j), and e^{iz cos φ} = Σ_m i^m J_m(z) e^{imφ}.
   * The (B, A) element of H(s, t) is −t Σ_j e^{iA(t)·δ_j} e^{−2πi s·n_j}, so
   *   f_m(s) := (H_m)_{BA} = −t i^m J_m(A₀) Σ_j e^{−imχθ_j} e^{−2πi s·n_j}.
   */
  it('has Fourier components of H(s, t) equal to the Jacobi–Anger (Bessel) form', () => {
    const theta = bondAngles();
    for (const chi of [1, -1] as const) {
      const [t, A0] = [1.1, 0.8];
      const drive = circularHoneycombDrive({ hopping: t, amplitude: A0, frequency: 9, helicity: chi });
      for (const s of [K, K_PRIME, [0.137, 0.621]]) {
        const h = fourierComponents(drive, s, 4);
        for (let m = -4; m <= 4; m++) {
          let re = 0, im = 0;
          HONEYCOMB_BONDS.forEach(([n1, n2], j) => {
            const phase = -m * chi * theta[j] - 2 * Math.PI * (s[0] * n1 + s[1] * n2);
            re += Math.cos(phase);
            im += Math.sin(phase);
          });
          // −t i^m J_m (re + i im)
          const jm = -t * besselJ(m, A0);
          const [ir, ii] = [Math.cos((m * Math.PI) / 2), Math.sin((m * Math.PI) / 2)];
          const expected = [jm * (ir * re - ii * im), jm * (ir * im + ii * re)];
          const actual = offDiagonal(h.get(m)!);
          const label = `χ = ${chi}, s = (${s.map((x) => x.toFixed(3)).join(', ')}), m = ${m}`;
          expectWithin(`Re f_m, ${label}`, actual[0], expected[0], 1e-13);
          expectWithin(`Im f_m, ${label}`, actual[1], expected[1], 1e-13);
        }
      }
    }
  });

  /**
   * Gap at the Dirac points. At K, H₀(K) = −tJ₀(A₀)Σ_j e^{−2πiK·n_j} = 0 (the time
   * average renormalises every bond by the same J₀), so every H_m(K) is purely
   * off-diagonal and [H_m, H_{−m}] = (|f_{−m}|² − |f_m|²)σ_z:
   *   H_eff(K) = M_K σ_z,   gap Δ_eff = 2|M_K|.
   * Only harmonics m ≡ 1 (mod 3) survive at K for χ = +1 (phases e^{i(2π/3)(j−1)(1−m)}
   * summed over j), so M_K = (9t²/ω)(−J₁² + J₂²/2 − J₄²/4 + …) and, to leading
   * order in A₀, Δ = 18t²J₁(A₀)²/ω ≈ 9t²A₀²/(2ω) = 2v²A₀²/ω with v = 3t/2 the Dirac
   * velocity: the mass v²A₀²/ω of the circularly driven Dirac cone (Oka & Aoki;
   * Kitagawa et al.; from memory).
   *
   * Neglected terms (the tolerance). The O(1/ω²) term of H_eff is a sum of
   * nested commutators of three H_m(K) with total harmonic 0 (the terms with H₀
   * vanish at K). Every H_m(K) is off-diagonal, so only alternating products
   * |B⟩⟨A|·|A⟩⟨B|·|B⟩⟨A| (or the reverse) survive, and by the same mod-3 rule the
   * harmonics of |B⟩⟨A| factors are ≡ 1 and of |A⟩⟨B| factors ≡ 2 (mod 3): their
   * sum is ≡ 1 or 2, never 0. So the O(1/ω²) term is zero at K, and the first
   * neglected term is O(A⁴/ω³). Keeping only the leading harmonic, H(K, t)
   * is a field of modulus b = 3tJ₁(A₀) rotating at ω, solved exactly in the rotating
   * frame: Δ = √(ω² + 4b²) − ω = 2b²/ω − 2b⁴/ω³ + O(b⁶/ω⁵). So the engine's gap
   * should differ from Δ_eff by δ ≈ −2b⁴/ω³; the other harmonics change δ by a
   * relative amount of order (J₂/J₁)² and the next order by (b/ω)². We require
   *   |Δ_engine − Δ_eff| ≤ 4b⁴/ω³          (twice the leading neglected term)
   *   |Δ_engine − Δ_eff + 2b⁴/ω³| ≤ 2b⁴/ω³ · 2((J₂/J₁)² + (b/ω)²)
   * and, for the leading-order closed form, whose first neglected terms are
   * −(81/64)t²A₀⁴/ω (from J₁² = A₀²/4 − A₀⁴/16 + … and J₂² = A₀⁴/64):
   *   |Δ_engine − 9t²A₀²/(2ω)| ≤ 2 · (81/64)t²A₀⁴/ω + 4b⁴/ω³.
   */
  it('opens a quasienergy gap at K and K′ equal to that of the first-order H_eff, within the neglected O(A⁴/ω³) terms', () => {
    const t = 1;
    for (const [A0, omega, chi] of [
      [0.3, 10, 1],
      [0.5, 10, 1],
      [0.5, 20, 1],
      [1.0, 12, 1],
      [0.5, 10, -1],
    ] as const) {
      const drive = circularHoneycombDrive({ hopping: t, amplitude: A0, frequency: omega, helicity: chi });
      const unit = Math.PI / drive.period; // quasienergy unit π/T in absolute energy
      const b = 3 * t * besselJ(1, A0);
      const leading = (2 * b ** 4) / omega ** 3;
      const ratio = besselJ(2, A0) / besselJ(1, A0);
      for (const [name, s] of [['K', K], ['K′', K_PRIME]] as const) {
        const label = `A₀ = ${A0}, ω = ${omega}, χ = ${chi}, ${name}`;
        const eff = highFrequencyHamiltonian(drive, s);
        const [fr, fi] = offDiagonal(eff);
        expectBelow(`|H_eff(${name})_BA| (must vanish at a Dirac point), ${label}`, Math.hypot(fr, fi), 1e-12);
        const gapEff = 2 * Math.abs(massOf(eff));
        const { values } = floquetSpectrum(drive, s);
        expect(values.length).toBe(2);
        const gapEngine = circularDifference(values[1], values[0]) * unit;
        expectWithin(`engine gap vs H_eff gap, ${label}`, gapEngine, gapEff, 2 * leading);
        expectWithin(`engine − H_eff vs the rotating-field term −2b⁴/ω³, ${label}`, gapEngine - gapEff, -leading, leading * 2 * (ratio ** 2 + (b / omega) ** 2));
        expectWithin(`engine gap vs 9t²A₀²/(2ω), ${label}`, gapEngine, (9 * t * t * A0 * A0) / (2 * omega), (2 * 81 * t * t * A0 ** 4) / (64 * omega) + 2 * leading);
      }
    }
  });

  /**
   * Sign of the mass. H_eff(K) = M_K σ_z puts the lower quasienergy state on
   * sublattice A when M_K < 0 and on B when M_K > 0. We check the engine's lower
   * Floquet eigenvector at K and K′ against the sign of the derived mass (which
   * is opposite in the two valleys: a Haldane-like, not a sublattice, mass).
   */
  it('puts the lower quasienergy state at K, K′ on the sublattice selected by the sign of the H_eff mass', () => {
    for (const chi of [1, -1] as const) {
      const drive = circularHoneycombDrive({ hopping: 1, amplitude: 0.6, frequency: 10, helicity: chi });
      const masses: number[] = [];
      for (const s of [K, K_PRIME]) {
        const mass = massOf(highFrequencyHamiltonian(drive, s));
        masses.push(mass);
        const { values, eigen, order } = floquetSpectrum(drive, s);
        // Column order[0] of eigen.vectors belongs to the lower quasienergy values[0].
        const col = order[0];
        const weightA = eigen.vectors.re[col] ** 2 + eigen.vectors.im[col] ** 2;
        expect(values[0]).toBeLessThan(0);
        expect({ chi, s, lowerOnA: weightA > 0.5 }).toEqual({ chi, s, lowerOnA: mass < 0 });
        // |M| ≫ the small off-diagonal admixture: the state is sublattice-polarised to better than 95 %.
        expect(Math.abs(weightA - 0.5)).toBeGreaterThan(0.45);
      }
      expect(Math.sign(masses[0])).toBe(-Math.sign(masses[1]));
    }
  });

  /**
   * Chern number of the lower band of H_eff = d(s)·σ (d_x + i d_y = f the (B, A)
   * element, d_z = M). With C = (1/2πi)∫(⟨∂₁u|∂₂u⟩ − ⟨∂₂u|∂₁u⟩) (docs/conventions.md),
   * the lower band of d·σ has C = −(1/4π)∫ d̂·(∂_x d̂ × ∂_y d̂) d²k = −deg(d̂), and the
   * degree is counted at the poles of the sphere: d̂ reaches the north pole where
   * f = 0 and M > 0, with local orientation χ_v = sign det ∂(Re f, Im f)/∂(k_x, k_y)
   * (the valley chirality); it reaches the south pole where f = 0 and M < 0, with
   * orientation −χ_v. Averaging the two counts,
   *   C_lower = −½ Σ_v χ_v sign(M_v),
   * exact whenever f vanishes only at isolated points (here K and K′: f ∝ J₀(A₀) times
   * the graphene form factor, J₀(1) ≈ 0.77 ≠ 0). The sign is fixed by the QWZ anchor
   * of docs/conventions.md as well: at m = 1 its four Dirac points give
   * −½(1·1 − 1·1 − 2·1·1) = +1. χ_v is computed in reduced momenta and multiplied
   * by sign det(a₁, a₂) (= sign det(b₁, b₂), since bᵢ·aⱼ = 2πδᵢⱼ).
   */
  it('gives the lower band C = ±1 with the sign of −½Σ χ_v sign M_v of H_eff; reversing the helicity flips it', () => {
    const [a1, a2] = HONEYCOMB_VECTORS;
    const orientation = Math.sign(a1[0] * a2[1] - a1[1] * a2[0]);
    const results: number[] = [];
    for (const chi of [1, -1] as const) {
      const drive = circularHoneycombDrive({ hopping: 1, amplitude: 1, frequency: 8, helicity: chi });
      let predicted = 0;
      for (const s of [K, K_PRIME]) {
        const h = 1e-5;
        const f = (ds: number[]) => offDiagonal(highFrequencyHamiltonian(drive, [s[0] + ds[0], s[1] + ds[1]]));
        const [p1, m1, p2, m2] = [f([h, 0]), f([-h, 0]), f([0, h]), f([0, -h])];
        const d1 = [(p1[0] - m1[0]) / (2 * h), (p1[1] - m1[1]) / (2 * h)];
        const d2 = [(p2[0] - m2[0]) / (2 * h), (p2[1] - m2[1]) / (2 * h)];
        const jacobian = d1[0] * d2[1] - d2[0] * d1[1];
        expect(Math.abs(jacobian)).toBeGreaterThan(1); // a Dirac cone, not a quadratic touching
        const chirality = Math.sign(jacobian) * orientation;
        predicted += -0.5 * chirality * Math.sign(massOf(highFrequencyHamiltonian(drive, s)));
      }
      expect(Math.abs(predicted)).toBe(1);
      const p = analyseSheet(drive, { grid: [12, 12], labels: [0, 1], run: { winding: false, edges: false } });
      expect(p.gaps.filter((g) => g.open).map((g) => g.label).sort()).toEqual([0, 1]);
      const lower = p.bands.find((b) => b.gapBelow === 1 && b.gapAbove === 0);
      expect(lower?.chern?.converged).toBe(true);
      expectBelow('FHS residual of the lower band', lower!.chern!.residual, 1e-9);
      expect({ chi, C: lower!.chern!.nearest }).toEqual({ chi, C: predicted });
      results.push(predicted);
    }
    expect(results[1]).toBe(-results[0]);
  });
});

// ---------------------------------------------------------------------------
// 2. Three-step honeycomb drive
// ---------------------------------------------------------------------------

/** Settled Chern numbers, winding numbers and edge counts of a portrait; fails on anything unsettled. */
function invariants(p: SheetPortrait): { cherns: number[]; windings: number[]; edges: Record<string, number> } {
  const cherns = p.bands.map((b) => {
    if (!b.chern?.converged) expect.fail(`Chern number of band ${b.index} unsettled: ${b.chern?.caveat}`);
    return b.chern!.nearest + 0;
  });
  const windings = p.windings.map((w) => {
    if (!w.winding.converged) expect.fail(`W in gap ${w.gap} unsettled: ${w.winding.caveat}`);
    expectBelow(`|W − round W| in gap ${w.gap}`, w.winding.residual, 1e-3);
    return w.winding.nearest + 0;
  });
  const edges: Record<string, number> = {};
  for (const r of p.ribbons) {
    for (const c of r.counts) {
      if (c.count === null) expect.fail(`edge count unsettled (f${r.finiteDirection}, ${c.edge}, gap ${c.gap}): ${c.reason}`);
      edges[`f${r.finiteDirection}:${c.edge}:${c.gap.toFixed(3)}`] = c.count + 0;
    }
  }
  return { cherns, windings, edges };
}

const SHEET = { grid: [10, 10], labels: [0, 1], ribbon: { width: 10, momenta: 48 } };

describe('three-step honeycomb drive (Kitagawa, Berg, Rudner, Demler, PRB 82, 235114 (2010))', () => {
  /**
   * Full transfer, derived. A step with bond j on and no offset is
   * exp(−iJτ(e^{−iφ_j}|B⟩⟨A| + h.c.)) = −i(e^{−iφ_j}|B⟩⟨A| + e^{iφ_j}|A⟩⟨B|) at Jτ = π/2
   * (φ_j = 2π s·n_j). The product of three such off-diagonal unitaries is
   * (−i)³ times an off-diagonal matrix with entries e^{±iΦ(s)} (mutually conjugate),
   * whose eigenvalues are ±1: U(s, T) has eigenvalues ±i at every s, i.e. flat bands
   * at quasienergy ε = ∓π/(2T), ±1/2 in units of π/T.
   */
  it('has flat bands at ε = ±π/(2T) at full transfer Jτ = π/2 without offset', () => {
    const drive = threeStepHoneycombDrive({ hopping: Math.PI / 2, stepDuration: 1 });
    const random = seededRandom(2010);
    for (let i = 0; i < 6; i++) {
      const s = [random(), random()];
      const { values } = floquetSpectrum(drive, s);
      expectWithin(`lower quasienergy at s = (${s.map((x) => x.toFixed(3))})`, values[0], -0.5, 1e-12);
      expectWithin(`upper quasienergy at s = (${s.map((x) => x.toFixed(3))})`, values[1], 0.5, 1e-12);
    }
  });

  /**
   * Near full transfer (the paper's anomalous regime, from memory): each band has
   * C = 0, yet the gaps at 0 and π/T both carry |W| = 1 and one chiral mode on each
   * edge, running the same way in both gaps (W(0) − W(π) = C of the band between
   * = 0). With a right-handed basis the counts follow the sign table of
   * docs/conventions.md (count = edgeSign · W).
   */
  for (const fraction of [1, 0.9]) {
    it(`is Chern-trivial anomalous at Jτ = ${fraction}·π/2 with a small sublattice offset`, () => {
      const drive = threeStepHoneycombDrive({ hopping: (fraction * Math.PI) / 2, stepDuration: 1, mass: 0.3 });
      const p = analyseSheet(drive, SHEET);
      const { cherns, windings } = invariants(p);
      expect(cherns).toEqual([0, 0]);
      expect(windings.map(Math.abs)).toEqual([1, 1]);
      expect(windings[1]).toBe(windings[0]);
      for (const r of p.ribbons) {
        for (const c of r.counts) {
          const w = windings[p.windings.findIndex((x) => x.gap === c.gap)];
          expect({ f: r.finiteDirection, edge: c.edge, gap: c.gap, count: c.count }).toEqual({ f: r.finiteDirection, edge: c.edge, gap: c.gap, count: edgeSign(r.finiteDirection, c.edge) * w });
        }
      }
      expect(p.consistency.filter((c) => !c.holds)).toEqual([]);
    });
  }

  /**
   * Weak hopping: U ≈ exp(−iT H̄) with H̄ a gapped, sublattice-massive honeycomb
   * Hamiltonian of bandwidth ≪ 2π/T; its bands have C = 0 (a trivial mass, no
   * flux), so W = 0 in the gap at π/T (top/bottom of a static spectrum) and
   * W(0) = C of the lower band = 0 (docs/conventions.md), with no edge modes.
   */
  it('is trivial at weak hopping: C = 0, W = 0 in both gaps, no edge modes', () => {
    const p = analyseSheet(threeStepHoneycombDrive({ hopping: 0.3, stepDuration: 1, mass: 0.3 }), SHEET);
    const { cherns, windings, edges } = invariants(p);
    expect(cherns).toEqual([0, 0]);
    expect(windings).toEqual([0, 0]);
    expect(Object.values(edges).every((c) => c === 0)).toBe(true);
    expect(Object.keys(edges).length).toBe(8);
  });
});

// ---------------------------------------------------------------------------
// 3. Shift of the time origin and reversal of the step order
// ---------------------------------------------------------------------------

/**
 * Time origin. Starting the period at t₀ gives U′(T) = U(t₀ + T, t₀) = P U(T) P⁻¹
 * with P = U(t₀, 0): the same quasienergies at every k. P(s) is continuous and
 * periodic in s (cell gauge), so conjugation maps each band bundle to an
 * isomorphic one: same Chern numbers. On a ribbon the conjugating P is a
 * finite-range unitary, so ribbon quasienergies are identical and edge states
 * stay at their edge: same edge counts, hence the same W (Rudner et al. 2013
 * identify W with the edge count).
 *
 * Step-order reversal. The checkerboard and three-step drives have real
 * amplitudes, so H_j(s)* = H_j(−s) for every step (cell gauge). For the
 * reversed order U_rev(s) = U₁U₂⋯U_n(s) and
 *   U(−s)* = (U_n(−s)⋯U₁(−s))* = e^{+iH_n(s)τ}⋯e^{+iH₁(s)τ} = U_rev(s)†,
 * so U_rev(s) = U(−s)ᵀ: ε_rev(s) = ε(−s). The reversed protocol is the
 * time-reversed one (complex conjugation with k → −k); it maps a chiral edge
 * mode with dε/dk∥ > 0 to one at −k∥ with the same ε and dε/dk∥ < 0, on the
 * same edge (|ψ|² unchanged), so every signed edge count and every W flips
 * sign, and each C flips sign (Berry curvature Ω(k) → −Ω(−k)).
 */
describe('invariance under a shift of the time origin; reversal of the step order (Rudner, Lindner, Berg, Levin, PRX 3, 031005 (2013))', () => {
  const checker = () => checkerboardDrive({ hopping: 0.8 * (Math.PI / 2), offset: 0.5, stepDuration: 1 });
  const threeStep = () => threeStepHoneycombDrive({ hopping: 0.9 * (Math.PI / 2), stepDuration: 1, mass: 0.3 });
  const momenta = (n: number) => Array.from({ length: n * n }, (_, i) => [Math.floor(i / n) / n + 0.013, (i % n) / n + 0.029]);

  function expectSameSpectra(a: LatticeDrive, b: LatticeDrive, reflect: boolean, label: string): void {
    for (const s of momenta(5)) {
      const x = floquetSpectrum(a, s).values;
      const y = floquetSpectrum(b, reflect ? [1 - s[0], 1 - s[1]] : s).values;
      for (let i = 0; i < x.length; i++) expectWithin(`${label}: ε_${i} at s = (${s.map((v) => v.toFixed(3))})`, circularDifference(x[i], y[i]), 0, 1e-12);
    }
  }

  for (const [name, build, shifts] of [
    ['five-step checkerboard', checker, [1, 3]],
    ['three-step honeycomb', threeStep, [1, 2]],
  ] as const) {
    it(`${name}: cyclic shifts of the steps keep quasienergies, C, W and edge counts; reversing the order flips W and edge counts`, () => {
      const base = build();
      const reference = invariants(analyseSheet(base, SHEET));
      expect(reference.windings.map(Math.abs)).toEqual([1, 1]);
      for (const k of shifts) {
        const shifted = rotateSegments(base, k);
        expectSameSpectra(base, shifted, false, `${name} shifted by ${k} steps`);
        expect(invariants(analyseSheet(shifted, SHEET))).toEqual(reference);
      }
      const reversed = reverseSegments(base);
      expectSameSpectra(base, reversed, true, `${name} reversed`);
      const r = invariants(analyseSheet(reversed, SHEET));
      expect(r.cherns).toEqual(reference.cherns.map((c) => -c + 0));
      expect(r.windings).toEqual(reference.windings.map((w) => -w + 0));
      expect(Object.keys(r.edges).sort()).toEqual(Object.keys(reference.edges).sort());
      for (const key of Object.keys(reference.edges)) expect({ key, count: r.edges[key] }).toEqual({ key, count: -reference.edges[key] + 0 });
    });
  }

  it('circular drive: starting the period at t₀ = 0.37T leaves the quasienergies unchanged (within the propagator bounds)', () => {
    const drive = circularHoneycombDrive({ hopping: 1, amplitude: 1, frequency: 6 });
    const shifted = shiftTimeOrigin(drive, 0.37 * drive.period);
    expect(shifted.segments.length).toBe(2);
    const random = seededRandom(37);
    for (let i = 0; i < 6; i++) {
      const s = [random(), random()];
      const x = floquetSpectrum(drive, s), y = floquetSpectrum(shifted, s);
      // Each accuracy bounds the eigenphase change in radians; quasienergies are in units of π/T.
      const tolerance = (x.accuracy + y.accuracy) / Math.PI + 1e-13;
      for (let j = 0; j < 2; j++) expectWithin(`ε_${j} at s = (${s.map((v) => v.toFixed(3))})`, circularDifference(x.values[j], y.values[j]), 0, tolerance);
    }
  });
});

// ---------------------------------------------------------------------------
// 4. Propagator of the circularly driven honeycomb (time-dependent Magnus path)
// ---------------------------------------------------------------------------

/**
 * Independent reference: classical fourth-order Runge–Kutta on i dU/dt = H(t)U with
 * `steps` equal steps (common practice). It shares only the Hamiltonian with the
 * engine, not the integrator; its global error is O((h‖H‖)⁴), and is estimated
 * in the test from two step counts.
 */
function rungeKuttaPropagator(drive: LatticeDrive, s: number[], steps: number): ComplexMatrix {
  const bloch = prepareBloch(drive, s);
  const n = bloch.size;
  const h = drive.period / steps;
  // −iH·X
  const rhs = (t: number, x: ComplexMatrix): ComplexMatrix => {
    const hx = multiply(bloch.at(Math.min(t, drive.period)), x);
    const out = zeros(n, n);
    for (let p = 0; p < out.re.length; p++) {
      out.re[p] = hx.im[p];
      out.im[p] = -hx.re[p];
    }
    return out;
  };
  const axpy = (x: ComplexMatrix, a: number, y: ComplexMatrix): ComplexMatrix => {
    const out = zeros(n, n);
    for (let p = 0; p < out.re.length; p++) {
      out.re[p] = x.re[p] + a * y.re[p];
      out.im[p] = x.im[p] + a * y.im[p];
    }
    return out;
  };
  let u = zeros(n, n);
  for (let i = 0; i < n; i++) u.re[i * n + i] = 1;
  for (let k = 0; k < steps; k++) {
    const t = k * h;
    const k1 = rhs(t, u);
    const k2 = rhs(t + h / 2, axpy(u, h / 2, k1));
    const k3 = rhs(t + h / 2, axpy(u, h / 2, k2));
    const k4 = rhs(t + h, axpy(u, h, k3));
    const next = zeros(n, n);
    for (let p = 0; p < next.re.length; p++) {
      next.re[p] = u.re[p] + (h / 6) * (k1.re[p] + 2 * k2.re[p] + 2 * k3.re[p] + k4.re[p]);
      next.im[p] = u.im[p] + (h / 6) * (k1.im[p] + 2 * k2.im[p] + 2 * k3.im[p] + k4.im[p]);
    }
    u = next;
  }
  return u;
}

describe('propagator of the circularly driven honeycomb (fourth-order commutator-free Magnus, Blanes & Moan 2002)', () => {
  // High frequency (ω above the bandwidth 6t) and low frequency (ω below it).
  const drives = [
    circularHoneycombDrive({ hopping: 1, amplitude: 1, frequency: 8 }),
    circularHoneycombDrive({ hopping: 1, amplitude: 1.5, frequency: 3, helicity: -1 }),
  ];

  /**
   * Each CF4 slice is a product of two exponentials of Hermitian matrices, unitary
   * to rounding (≈ 1e-16); a few thousand factors accumulate at most a few 1e-13.
   * Tolerance: ‖U†U − 1‖_F ≤ 1e-12 and |‖U(t)ψ‖ − 1| ≤ 1e-12.
   */
  it('keeps U(k, T) unitary and conserves the norm along U(k, t)', () => {
    const random = seededRandom(81406);
    for (const drive of drives) {
      const times = Array.from({ length: 17 }, (_, i) => (i * drive.period) / 16);
      for (let i = 0; i < 4; i++) {
        const s = [random(), random()];
        const p = floquetOperator(drive, s);
        expectBelow(`‖U†U − 1‖ at s = (${s.map((v) => v.toFixed(3))}), T = ${drive.period.toFixed(3)}`, unitarityDefect(p.operator), 1e-12);
        const psi = zeros(2, 1);
        for (let r = 0; r < 2; r++) [psi.re[r], psi.im[r]] = [random() - 0.5, random() - 0.5];
        const norm = Math.hypot(...psi.re, ...psi.im);
        for (let r = 0; r < 2; r++) [psi.re[r], psi.im[r]] = [psi.re[r] / norm, psi.im[r] / norm];
        const path = evolutionOperators(drive, s, times);
        path.forEach((u, j) => {
          expectBelow(`‖U(t)†U(t) − 1‖ at t = ${times[j].toFixed(3)}`, unitarityDefect(u), 1e-12);
          const v = multiply(u, psi);
          expectWithin(`‖U(t)ψ‖ at t = ${times[j].toFixed(3)}`, Math.hypot(...v.re, ...v.im), 1, 1e-12);
        });
        expectBelow('‖U(T) from the path − floquetOperator‖', distance(path[path.length - 1], p.operator), 1e-9);
      }
    }
  });

  /**
   * The reported accuracy (‖U_2N − U_N‖_F of the last slice doubling) should bound
   * the actual error ‖U − U_ref‖_F and the eigenphase errors (Hoffman–Wielandt).
   * Reference: RK4 with 2¹³ steps; its own error is estimated as |U_{2¹³} − U_{2¹²}|/15
   * and must be below 1e-12 for the comparison to mean anything.
   */
  it('reports an accuracy that bounds the actual error against a much finer reference integration', () => {
    const random = seededRandom(235108);
    for (const drive of drives) {
      const s = [random(), random()];
      const fine = rungeKuttaPropagator(drive, s, 1 << 13);
      const coarse = rungeKuttaPropagator(drive, s, 1 << 12);
      expectBelow('estimated error of the RK4 reference', distance(fine, coarse) / 15, 1e-12);
      const referencePhases = new UnitaryEigen(fine, { unitarityTolerance: 1e-9 }).phases;
      for (const tolerance of [1e-4, 1e-6, 1e-8, 1e-10]) {
        const p = floquetOperator(drive, s, { tolerance });
        expect(p.converged).toBe(true);
        expect(p.accuracy).toBeLessThanOrEqual(tolerance);
        const error = distance(p.operator, fine);
        expectBelow(`‖U − U_ref‖_F at tolerance ${tolerance} (reported accuracy ${p.accuracy.toExponential(2)})`, error, p.accuracy + 1e-12);
        const phases = new UnitaryEigen(p.operator).phases;
        for (let j = 0; j < 2; j++) {
          const d = Math.abs(Math.atan2(Math.sin(phases[j] - referencePhases[j]), Math.cos(phases[j] - referencePhases[j])));
          expectBelow(`eigenphase ${j} error at tolerance ${tolerance}`, d, p.accuracy + 1e-12);
        }
      }
    }
  });
});
