/**
 * The Rudner–Lindner–Berg–Levin winding density at one momentum, integrated
 * over the time loop (Rudner, Lindner, Berg, Levin, PRX 3, 031005 (2013)):
 *
 *   ρ_ε(s) = ∫₀^T′ dt Tr(A_t [A₁, A₂]),   A_μ = V⁻¹∂_μV,   W_ε = (o/8π²) ∫ d²s ρ_ε(s),
 *   V(s, t) = U(s, t) E(s, t),   E = e^{iXt},   X = (i/T′) log_ε U(s, T′),
 *
 * with o = sign det(a₁, a₂), s the reduced momenta and T′ the loop length
 * (winding/time-loop.ts). Every derivative is exact, so ρ can be evaluated at
 * any momentum on its own (as adaptive quadrature needs) and is gauge-free:
 * only spectral functions of Hermitian generators and of U(T′) enter.
 *
 * Momentum derivatives. On a piece with constant generator G = Q Λ Q† the
 * propagator is e(τ) = e^{−iGτ}, and (Daleckii–Krein; Higham, Functions of
 * Matrices (2008), thm. 3.11)
 *   e†∂_μe = Q [g_μ ∘ Ψ(τ)] Q†,  g_μ = Q†(∂_μG)Q,
 *   Ψ_ab(τ) = (1 − e^{iδτ})/δ = −iτ e^{iδτ/2} sinc(δτ/2),  δ = λ_a − λ_b.
 * With U = e S (S the propagator at the start of the piece) and B_μ = U†∂_μU,
 *   B_μ(τ) = S†(e†∂_μe)S + B_μ(start).
 * For E = f(U_F), U_F = U(T′) = Q_F diag(u) Q_F†, u_a = e^{−iθ_a} with θ_a the
 * eigenphase branch below the cut, f(u_a) = e^{iθ_a t/T′}: Daleckii–Krein again,
 * with ∂_μU_F = U_F B_μ(T′). Writing every matrix in the basis of Q_F and
 * removing the unitary diag(e^{iθt/T′}) (the trace is invariant), one finds
 *   Â_μ = Y†(g_μ ∘ Ψ(τ))Y + β_μ + b_μ ∘ Z(t),    Â_t = −i Y†ΛY + i diag(θ/T′),
 *   Y = Q†SQ_F,  β_μ = Q_F†B_μ(start)Q_F,  b_μ = Q_F†B_μ(T′)Q_F,
 *   Z_ab(t) = (e^{iδt/T′} − 1)/(1 − e^{iδ}) = −e^{iδ(t/T′ − 1)/2} sin(δt/2T′)/sin(δ/2),  δ = θ_a − θ_b,
 * (A_t = −iV†GV + iX, and U†GU = S†GS on the piece). Z is the only place where
 * the gap enters: δ → ±2π for two eigenvalues facing each other across a small
 * gap, so ρ is peaked there, smooth and periodic as long as the gap is open.
 *
 * Time: Gauss–Legendre on each piece, where the integrand is a trigonometric
 * polynomial in t (the node counts are the caller's, gap-winding.ts checks them).
 */
import type { ComplexMatrix } from '../../linalg/complex-matrix.ts';
import { multiply, multiplyAdjointLeft, zeros } from '../../linalg/complex-matrix.ts';
import { HermitianEigen } from '../../linalg/hermitian-eigen.ts';
import { UnitaryEigen } from '../../linalg/unitary-eigen.ts';
import { quasienergyBelowCut } from '../../evolution/effective-hamiltonian.ts';
import type { GeneratorSeries, LoopPlan } from './time-loop.ts';
import { generatorGradientAt } from './time-loop.ts';
import { gaussLegendre } from './quadrature-rules.ts';
import { unitaryEigenTwo } from './two-band-kernel.ts';

interface PieceData {
  lambda: Float64Array;
  q: ComplexMatrix;
  g1: ComplexMatrix;
  g2: ComplexMatrix;
  /** Propagator and B_μ at the start of the piece. */
  start: ComplexMatrix;
  b1: ComplexMatrix;
  b2: ComplexMatrix;
}

/** sin(x)/x, accurate near 0. */
function sinc(x: number): number {
  return Math.abs(x) < 1e-4 ? 1 - (x * x) / 6 : Math.sin(x) / x;
}

/** out = A ∘ W for a complex weight matrix given as (wr, wi). */
function hadamard(a: ComplexMatrix, wr: Float64Array, wi: Float64Array, out: ComplexMatrix): void {
  for (let p = 0; p < a.re.length; p++) {
    const xr = a.re[p], xi = a.im[p];
    out.re[p] = xr * wr[p] - xi * wi[p];
    out.im[p] = xr * wi[p] + xi * wr[p];
  }
}

/** out = Y† M Y via a scratch matrix. */
function congruence(y: ComplexMatrix, m: ComplexMatrix, scratch: ComplexMatrix, out: ComplexMatrix): void {
  multiplyAdjointLeft(y, m, scratch);
  multiply(scratch, y, out);
}

/** What the adaptive quadrature calls: ρ_ε(s) for several cuts at once. */
export interface DensityEvaluator {
  readonly size: number;
  /** Momenta evaluated so far. */
  evaluations: number;
  evaluate(s1: number, s2: number, out: Float64Array, imaginary: Float64Array, distance: Float64Array): void;
}

/**
 * Evaluator of ρ_ε(s) for several cuts at once, any number of bands
 * (two-band-density.ts is the 2×2 path). Allocates its work space once;
 * each call overwrites it.
 */
export class WindingDensity implements DensityEvaluator {
  readonly size: number;
  /** Momenta evaluated so far. */
  evaluations = 0;
  private readonly pieces: PieceData[];
  private readonly cutTheta: number[];
  private readonly nodes: { x: Float64Array; w: Float64Array }[];
  private readonly m: () => ComplexMatrix;
  private readonly work: Record<string, ComplexMatrix>;
  private readonly psiRe: Float64Array;
  private readonly psiIm: Float64Array;
  private readonly theta: Float64Array[];
  private readonly phases: Float64Array;

  constructor(
    private readonly plan: LoopPlan,
    private readonly series: GeneratorSeries[],
    cuts: number[],
    nodesPerPiece: number[],
  ) {
    const n = series[0].size;
    this.size = n;
    this.m = () => zeros(n, n);
    this.pieces = plan.pieces.map(() => ({
      lambda: new Float64Array(n), q: this.m(), g1: this.m(), g2: this.m(), start: this.m(), b1: this.m(), b2: this.m(),
    }));
    this.cutTheta = cuts.map((c) => c * Math.PI);
    this.nodes = nodesPerPiece.map((k) => {
      const rule = gaussLegendre(k);
      return { x: rule.nodes, w: rule.weights };
    });
    const names = ['gen', 'd1', 'd2', 'tmp', 'tmp2', 'e', 'u', 'qf', 'y', 'beta1', 'beta2', 'bf1', 'bf2', 'at', 'c1', 'c2', 'a1', 'a2', 'comm', 'had', 'ylam', 'bb1', 'bb2'];
    this.work = Object.fromEntries(names.map((k) => [k, this.m()]));
    this.psiRe = new Float64Array(n * n);
    this.psiIm = new Float64Array(n * n);
    this.theta = cuts.map(() => new Float64Array(n));
    this.phases = new Float64Array(n);
  }

  evaluate(s1: number, s2: number, out: Float64Array, imaginary: Float64Array, distance: Float64Array): void {
    this.evaluations++;
    const n = this.size, nn = n * n;
    const w = this.work;
    const { gen, d1, d2, tmp, tmp2, e, u } = w;
    // Pass 1: U and B_μ at the start of every piece, U_F = U(T′) and B_μ(T′).
    u.re.fill(0);
    u.im.fill(0);
    for (let a = 0; a < n; a++) u.re[a * n + a] = 1;
    const b1 = w.bb1, b2 = w.bb2;
    b1.re.fill(0); b1.im.fill(0); b2.re.fill(0); b2.im.fill(0);
    this.plan.pieces.forEach((piece, p) => {
      const data = this.pieces[p];
      data.start.re.set(u.re); data.start.im.set(u.im);
      data.b1.re.set(b1.re); data.b1.im.set(b1.im);
      data.b2.re.set(b2.re); data.b2.im.set(b2.im);
      generatorGradientAt(this.series[p], s1, s2, gen, d1, d2);
      const eig = new HermitianEigen(gen);
      data.lambda.set(eig.values);
      data.q.re.set(eig.vectors.re); data.q.im.set(eig.vectors.im);
      congruence(data.q, d1, tmp, data.g1);
      congruence(data.q, d2, tmp, data.g2);
      const tau = piece.duration;
      this.fillPsi(data.lambda, tau);
      // B_μ ← S†(Q(g∘Ψ)Q†)S + B_μ = (Q†S)†(g∘Ψ)(Q†S) + B_μ.
      multiplyAdjointLeft(data.q, u, w.y);
      for (const [g, b] of [[data.g1, b1], [data.g2, b2]] as const) {
        hadamard(g, this.psiRe, this.psiIm, w.had);
        congruence(w.y, w.had, tmp, tmp2);
        for (let k = 0; k < nn; k++) {
          b.re[k] += tmp2.re[k];
          b.im[k] += tmp2.im[k];
        }
      }
      // U ← e(τ)U, e = Q diag(e^{−iλτ}) Q†.
      for (let a = 0; a < n; a++) {
        const c = Math.cos(data.lambda[a] * tau), sn = -Math.sin(data.lambda[a] * tau);
        for (let r = 0; r < n; r++) {
          const k = r * n + a;
          tmp.re[k] = data.q.re[k] * c - data.q.im[k] * sn;
          tmp.im[k] = data.q.re[k] * sn + data.q.im[k] * c;
        }
      }
      multiply(tmp, w.y, e); // Q diag(e^{−iλτ}) (Q†U)
      u.re.set(e.re);
      u.im.set(e.im);
    });
    // Eigen-decomposition of U_F, branches θ below each cut, b_μ = Q_F†B_μ(T′)Q_F.
    const qf = w.qf;
    if (n === 2) unitaryEigenTwo(u.re, u.im, 0, this.phases, 0, qf.re, qf.im);
    else {
      const eig = new UnitaryEigen(u);
      this.phases.set(eig.phases);
      qf.re.set(eig.vectors.re);
      qf.im.set(eig.vectors.im);
    }
    congruence(qf, b1, tmp, w.bf1);
    congruence(qf, b2, tmp, w.bf2);
    const length = this.plan.length;
    this.cutTheta.forEach((cut, j) => {
      let d = Infinity;
      for (let a = 0; a < n; a++) {
        const th = quasienergyBelowCut(this.phases[a], 1, cut);
        this.theta[j][a] = th;
        d = Math.min(d, cut - th, th - cut + 2 * Math.PI);
      }
      distance[j] = d / Math.PI;
      out[j] = 0;
      imaginary[j] = 0;
    });
    // Pass 2: the time integral, piece by piece.
    let t0 = 0;
    this.plan.pieces.forEach((piece, p) => {
      const data = this.pieces[p];
      multiplyAdjointLeft(data.q, data.start, tmp);
      multiply(tmp, qf, w.y); // Y = Q†SQ_F
      congruence(qf, data.b1, tmp, w.beta1);
      congruence(qf, data.b2, tmp, w.beta2);
      // −iY†ΛY.
      for (let a = 0; a < n; a++) {
        for (let c = 0; c < n; c++) {
          const k = a * n + c;
          tmp2.re[k] = a === c ? data.lambda[a] : 0;
          tmp2.im[k] = 0;
        }
      }
      congruence(w.y, tmp2, tmp, w.ylam);
      const rule = this.nodes[p];
      const half = piece.duration / 2;
      for (let i = 0; i < rule.x.length; i++) {
        const tau = half * (1 + rule.x[i]);
        const weight = half * rule.w[i];
        const fraction = (t0 + tau) / length;
        this.fillPsi(data.lambda, tau);
        hadamard(data.g1, this.psiRe, this.psiIm, w.had);
        congruence(w.y, w.had, tmp, w.c1);
        hadamard(data.g2, this.psiRe, this.psiIm, w.had);
        congruence(w.y, w.had, tmp, w.c2);
        for (let k = 0; k < nn; k++) {
          w.c1.re[k] += w.beta1.re[k]; w.c1.im[k] += w.beta1.im[k];
          w.c2.re[k] += w.beta2.re[k]; w.c2.im[k] += w.beta2.im[k];
        }
        this.cutTheta.forEach((_, j) => {
          const th = this.theta[j];
          // Â_μ = C_μ + b_μ ∘ Z, Â_t = −iY†ΛY + i diag(θ/T′).
          for (let a = 0; a < n; a++) {
            for (let c = 0; c < n; c++) {
              const k = a * n + c;
              const delta = th[a] - th[c];
              let zr: number, zi: number;
              if (Math.abs(delta) < 1e-12) {
                zr = -fraction;
                zi = 0;
              } else {
                const mag = -Math.sin((delta * fraction) / 2) / Math.sin(delta / 2);
                const ang = (delta * (fraction - 1)) / 2;
                zr = mag * Math.cos(ang);
                zi = mag * Math.sin(ang);
              }
              const x1r = w.bf1.re[k], x1i = w.bf1.im[k], x2r = w.bf2.re[k], x2i = w.bf2.im[k];
              w.a1.re[k] = w.c1.re[k] + x1r * zr - x1i * zi;
              w.a1.im[k] = w.c1.im[k] + x1r * zi + x1i * zr;
              w.a2.re[k] = w.c2.re[k] + x2r * zr - x2i * zi;
              w.a2.im[k] = w.c2.im[k] + x2r * zi + x2i * zr;
              // −i·(Y†ΛY) = (im, −re).
              w.at.re[k] = w.ylam.im[k];
              w.at.im[k] = -w.ylam.re[k] + (a === c ? th[a] / length : 0);
            }
          }
          multiply(w.a1, w.a2, w.comm);
          multiply(w.a2, w.a1, tmp);
          // Tr(Â_t (A₁A₂ − A₂A₁)).
          let tr = 0, ti = 0;
          for (let a = 0; a < n; a++) {
            for (let c = 0; c < n; c++) {
              const k = a * n + c, kt = c * n + a;
              const yr = w.comm.re[kt] - tmp.re[kt], yi = w.comm.im[kt] - tmp.im[kt];
              const xr = w.at.re[k], xi = w.at.im[k];
              tr += xr * yr - xi * yi;
              ti += xr * yi + xi * yr;
            }
          }
          out[j] += weight * tr;
          imaginary[j] += weight * ti;
        });
      }
      t0 += piece.duration;
    });
  }

  /** Ψ_ab(τ) = −iτ e^{iδτ/2} sinc(δτ/2), δ = λ_a − λ_b. */
  private fillPsi(lambda: Float64Array, tau: number): void {
    const n = this.size;
    for (let a = 0; a < n; a++) {
      for (let b = 0; b < n; b++) {
        const half = ((lambda[a] - lambda[b]) * tau) / 2;
        const mag = tau * sinc(half);
        // −i·mag·(cos + i sin) = mag·(sin − i cos).
        this.psiRe[a * n + b] = mag * Math.sin(half);
        this.psiIm[a * n + b] = -mag * Math.cos(half);
      }
    }
  }
}
