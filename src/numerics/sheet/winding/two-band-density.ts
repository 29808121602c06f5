/**
 * The winding density of winding/density.ts for two bands, written out on
 * 2×2 matrices: the same formulas (derived there), with closed-form
 * eigen-decompositions and no allocation per momentum. Matrices are stored
 * interleaved, eight numbers per matrix: (re, im) of entries 00, 01, 10, 11.
 * The general-size evaluator computes the same quantity; the tests compare them.
 */
import type { GeneratorSeries, LoopPlan } from './time-loop.ts';
import { quasienergyBelowCut } from '../../evolution/effective-hamiltonian.ts';
import { gaussLegendre } from './quadrature-rules.ts';
import { pauliEigenvector, unitaryEigenTwo } from './two-band-kernel.ts';
import type { DensityEvaluator } from './density.ts';

/** c = a·b (2×2, interleaved, offsets in numbers). c must not alias a or b. */
function mul(a: Float64Array, ao: number, b: Float64Array, bo: number, c: Float64Array, co: number): void {
  for (let i = 0; i < 2; i++) {
    for (let j = 0; j < 2; j++) {
      const x0r = a[ao + 4 * i], x0i = a[ao + 4 * i + 1], x1r = a[ao + 4 * i + 2], x1i = a[ao + 4 * i + 3];
      const y0r = b[bo + 2 * j], y0i = b[bo + 2 * j + 1], y1r = b[bo + 4 + 2 * j], y1i = b[bo + 4 + 2 * j + 1];
      c[co + 4 * i + 2 * j] = x0r * y0r - x0i * y0i + x1r * y1r - x1i * y1i;
      c[co + 4 * i + 2 * j + 1] = x0r * y0i + x0i * y0r + x1r * y1i + x1i * y1r;
    }
  }
}

/** c = a†·b. */
function adjMul(a: Float64Array, ao: number, b: Float64Array, bo: number, c: Float64Array, co: number): void {
  for (let i = 0; i < 2; i++) {
    for (let j = 0; j < 2; j++) {
      // (a†)_{ik} = conj(a_{ki}).
      const x0r = a[ao + 2 * i], x0i = -a[ao + 2 * i + 1], x1r = a[ao + 4 + 2 * i], x1i = -a[ao + 4 + 2 * i + 1];
      const y0r = b[bo + 2 * j], y0i = b[bo + 2 * j + 1], y1r = b[bo + 4 + 2 * j], y1i = b[bo + 4 + 2 * j + 1];
      c[co + 4 * i + 2 * j] = x0r * y0r - x0i * y0i + x1r * y1r - x1i * y1i;
      c[co + 4 * i + 2 * j + 1] = x0r * y0i + x0i * y0r + x1r * y1i + x1i * y1r;
    }
  }
}

/** out = y† m y via scratch t (8 numbers at offset to of t). */
function congruence(y: Float64Array, yo: number, m: Float64Array, mo: number, t: Float64Array, to: number, out: Float64Array, oo: number): void {
  adjMul(y, yo, m, mo, t, to);
  mul(t, to, y, yo, out, oo);
}

/** w[a] = w[c] + w[bf] ∘ Z with Z = [[−f, z01], [z10, −f]]. */
function addTimesZ(w: Float64Array, c: number, bf: number, a: number, f: number, z01r: number, z01i: number, z10r: number, z10i: number): void {
  w[a] = w[c] - f * w[bf];
  w[a + 1] = w[c + 1] - f * w[bf + 1];
  w[a + 2] = w[c + 2] + w[bf + 2] * z01r - w[bf + 3] * z01i;
  w[a + 3] = w[c + 3] + w[bf + 2] * z01i + w[bf + 3] * z01r;
  w[a + 4] = w[c + 4] + w[bf + 4] * z10r - w[bf + 5] * z10i;
  w[a + 5] = w[c + 5] + w[bf + 4] * z10i + w[bf + 5] * z10r;
  w[a + 6] = w[c + 6] - f * w[bf + 6];
  w[a + 7] = w[c + 7] - f * w[bf + 7];
}

function sinc(x: number): number {
  return Math.abs(x) < 1e-4 ? 1 - (x * x) / 6 : Math.sin(x) / x;
}

export class TwoBandWindingDensity implements DensityEvaluator {
  readonly size = 2;
  evaluations = 0;
  private readonly count: number;
  /** Per piece: eigenvalues (2), eigenvectors Q, g₁, g₂, start U, B₁, B₂ at the start (8 numbers each). */
  private readonly lambda: Float64Array;
  private readonly q: Float64Array;
  private readonly g1: Float64Array;
  private readonly g2: Float64Array;
  private readonly start: Float64Array;
  private readonly b1: Float64Array;
  private readonly b2: Float64Array;
  private readonly cutTheta: number[];
  private readonly nodes: { x: Float64Array; w: Float64Array }[];
  private readonly s = new Float64Array(8 * 24);
  private readonly spinor = new Float64Array(4);
  private readonly theta: Float64Array;
  private readonly split = { re: new Float64Array(4), im: new Float64Array(4), vre: new Float64Array(4), vim: new Float64Array(4), phases: new Float64Array(2) };
  /** Largest |n₁|, |n₂| of the series and the Bloch phases e^{−2πi s_μ n} for n = −M … M (re, im interleaved). */
  private readonly reach: [number, number];
  private readonly phase1: Float64Array;
  private readonly phase2: Float64Array;

  constructor(private readonly plan: LoopPlan, private readonly series: GeneratorSeries[], cuts: number[], nodesPerPiece: number[]) {
    if (series[0].size !== 2) throw new RangeError(`TwoBandWindingDensity: needs 2 bands, got ${series[0].size}`);
    this.count = plan.pieces.length;
    const block = () => new Float64Array(8 * this.count);
    this.lambda = new Float64Array(2 * this.count);
    this.q = block();
    this.g1 = block();
    this.g2 = block();
    this.start = block();
    this.b1 = block();
    this.b2 = block();
    this.cutTheta = cuts.map((c) => c * Math.PI);
    this.nodes = nodesPerPiece.map((k) => {
      const rule = gaussLegendre(k);
      return { x: rule.nodes, w: rule.weights };
    });
    this.theta = new Float64Array(2 * cuts.length);
    let m1 = 0, m2 = 0;
    for (const sr of series) {
      for (let q = 0; q < sr.n1.length; q++) {
        m1 = Math.max(m1, Math.abs(sr.n1[q]));
        m2 = Math.max(m2, Math.abs(sr.n2[q]));
      }
    }
    this.reach = [m1, m2];
    this.phase1 = new Float64Array(2 * (2 * m1 + 1));
    this.phase2 = new Float64Array(2 * (2 * m2 + 1));
  }

  /** e^{−2πi s n} for n = −M … M, by powers of e^{−2πi s} (the momentum phases are shared by every piece). */
  private static fillPhases(table: Float64Array, reach: number, s: number): void {
    const c = Math.cos(-2 * Math.PI * s), sn = Math.sin(-2 * Math.PI * s);
    table[2 * reach] = 1;
    table[2 * reach + 1] = 0;
    for (let n = 1; n <= reach; n++) {
      const pr = table[2 * (reach + n - 1)], pi = table[2 * (reach + n - 1) + 1];
      table[2 * (reach + n)] = pr * c - pi * sn;
      table[2 * (reach + n) + 1] = pr * sn + pi * c;
      table[2 * (reach - n)] = table[2 * (reach + n)];
      table[2 * (reach - n) + 1] = -table[2 * (reach + n) + 1];
    }
  }

  evaluate(s1: number, s2: number, out: Float64Array, imaginary: Float64Array, distance: Float64Array): void {
    this.evaluations++;
    const w = this.s;
    // Scratch slots (8 numbers each).
    const G = 0, D1 = 8, D2 = 16, T = 24, Y = 32, M = 40, X = 48, U = 56, B1 = 64, B2 = 72, QF = 80, BF1 = 88, BF2 = 96, BETA1 = 104, BETA2 = 112, YLAM = 120, C1 = 128, C2 = 136, A1 = 144, A2 = 152, K = 160, K2 = 168;
    w.fill(0, U, U + 8);
    w[U] = 1;
    w[U + 6] = 1;
    w.fill(0, B1, B2 + 8);
    const pieces = this.plan.pieces;
    TwoBandWindingDensity.fillPhases(this.phase1, this.reach[0], s1);
    TwoBandWindingDensity.fillPhases(this.phase2, this.reach[1], s2);
    for (let p = 0; p < this.count; p++) {
      const po = 8 * p;
      for (let e = 0; e < 8; e++) {
        this.start[po + e] = w[U + e];
        this.b1[po + e] = w[B1 + e];
        this.b2[po + e] = w[B2 + e];
      }
      this.generator(p, G, D1, D2);
      // Closed-form eigen-decomposition of G = h₀ + h·σ (ascending eigenvalues h₀ ∓ |h|).
      const hx = w[G + 2], hy = -w[G + 3], h0 = 0.5 * (w[G] + w[G + 6]), hz = 0.5 * (w[G] - w[G + 6]);
      const r = Math.sqrt(hx * hx + hy * hy + hz * hz);
      this.lambda[2 * p] = h0 - r;
      this.lambda[2 * p + 1] = h0 + r;
      pauliEigenvector(hx, hy, hz, this.spinor);
      const x0r = this.spinor[0], x0i = this.spinor[1], x1r = this.spinor[2], x1i = this.spinor[3];
      const q = this.q;
      // Columns: v₋ = (−conj x1, conj x0) for h₀ − r, v₊ = (x0, x1) for h₀ + r.
      q[po] = -x1r; q[po + 1] = x1i; q[po + 2] = x0r; q[po + 3] = x0i;
      q[po + 4] = x0r; q[po + 5] = -x0i; q[po + 6] = x1r; q[po + 7] = x1i;
      congruence(q, po, w, D1, w, T, this.g1, po);
      congruence(q, po, w, D2, w, T, this.g2, po);
      const tau = pieces[p].duration;
      adjMul(q, po, w, U, w, Y); // Y = Q†U
      this.hadamardPsi(this.g1, po, p, tau, w, M);
      congruence(w, Y, w, M, w, T, w, X);
      for (let e = 0; e < 8; e++) w[B1 + e] += w[X + e];
      this.hadamardPsi(this.g2, po, p, tau, w, M);
      congruence(w, Y, w, M, w, T, w, X);
      for (let e = 0; e < 8; e++) w[B2 + e] += w[X + e];
      // U ← Q diag(e^{−iλτ}) Y.
      for (let a = 0; a < 2; a++) {
        const c = Math.cos(this.lambda[2 * p + a] * tau), sn = -Math.sin(this.lambda[2 * p + a] * tau);
        for (let rr = 0; rr < 2; rr++) {
          const k = po + 4 * rr + 2 * a;
          w[T + 4 * rr + 2 * a] = q[k] * c - q[k + 1] * sn;
          w[T + 4 * rr + 2 * a + 1] = q[k] * sn + q[k + 1] * c;
        }
      }
      mul(w, T, w, Y, w, U);
    }
    // U_F = Q_F diag(u) Q_F†, its branches θ below every cut, b_μ = Q_F†B_μ(T′)Q_F.
    const sp = this.split;
    for (let e = 0; e < 4; e++) {
      sp.re[e] = w[U + 2 * e];
      sp.im[e] = w[U + 2 * e + 1];
    }
    unitaryEigenTwo(sp.re, sp.im, 0, sp.phases, 0, sp.vre, sp.vim);
    for (let e = 0; e < 4; e++) {
      w[QF + 2 * e] = sp.vre[e];
      w[QF + 2 * e + 1] = sp.vim[e];
    }
    congruence(w, QF, w, B1, w, T, w, BF1);
    congruence(w, QF, w, B2, w, T, w, BF2);
    const length = this.plan.length;
    const cuts = this.cutTheta.length;
    for (let j = 0; j < cuts; j++) {
      let d = Infinity;
      for (let a = 0; a < 2; a++) {
        const th = quasienergyBelowCut(sp.phases[a], 1, this.cutTheta[j]);
        this.theta[2 * j + a] = th;
        d = Math.min(d, this.cutTheta[j] - th, th - this.cutTheta[j] + 2 * Math.PI);
      }
      distance[j] = d / Math.PI;
      out[j] = 0;
      imaginary[j] = 0;
    }
    let t0 = 0;
    for (let p = 0; p < this.count; p++) {
      const po = 8 * p;
      // Y = Q†·S·Q_F, β_μ = Q_F†B_μ(start)Q_F, Y†ΛY.
      adjMul(this.q, po, this.start, po, w, T);
      mul(w, T, w, QF, w, Y);
      congruence(w, QF, this.b1, po, w, T, w, BETA1);
      congruence(w, QF, this.b2, po, w, T, w, BETA2);
      w.fill(0, M, M + 8);
      w[M] = this.lambda[2 * p];
      w[M + 6] = this.lambda[2 * p + 1];
      congruence(w, Y, w, M, w, T, w, YLAM);
      const rule = this.nodes[p];
      const half = pieces[p].duration / 2;
      for (let i = 0; i < rule.x.length; i++) {
        const tau = half * (1 + rule.x[i]);
        const weight = half * rule.w[i];
        const fraction = (t0 + tau) / length;
        this.hadamardPsi(this.g1, po, p, tau, w, M);
        congruence(w, Y, w, M, w, T, w, C1);
        this.hadamardPsi(this.g2, po, p, tau, w, M);
        congruence(w, Y, w, M, w, T, w, C2);
        for (let e = 0; e < 8; e++) {
          w[C1 + e] += w[BETA1 + e];
          w[C2 + e] += w[BETA2 + e];
        }
        for (let j = 0; j < cuts; j++) {
          const th0 = this.theta[2 * j], th1 = this.theta[2 * j + 1];
          // Z: diagonal −t/T′; off-diagonal for δ = θ₀ − θ₁ (entry 01) and −δ (entry 10).
          const delta = th0 - th1;
          let z01r = -fraction, z01i = 0, z10r = -fraction, z10i = 0;
          if (Math.abs(delta) >= 1e-12) {
            const mag = -Math.sin((delta * fraction) / 2) / Math.sin(delta / 2);
            const ang = (delta * (fraction - 1)) / 2;
            z01r = mag * Math.cos(ang);
            z01i = mag * Math.sin(ang);
            // δ → −δ: mag is even in δ, the phase odd.
            z10r = z01r;
            z10i = -z01i;
          }
          addTimesZ(w, C1, BF1, A1, fraction, z01r, z01i, z10r, z10i);
          addTimesZ(w, C2, BF2, A2, fraction, z01r, z01i, z10r, z10i);
          mul(w, A1, w, A2, w, K);
          mul(w, A2, w, A1, w, K2);
          // Â_t = −i·YΛY + i diag(θ/T′): entries (re, im) = (ylam.im, −ylam.re + θ_a/T′ on the diagonal).
          let tr = 0, ti = 0;
          for (let a = 0; a < 2; a++) {
            for (let c = 0; c < 2; c++) {
              const k = 4 * a + 2 * c, kt = 4 * c + 2 * a;
              const xr = w[YLAM + k + 1], xi = -w[YLAM + k] + (a === c ? this.theta[2 * j + a] / length : 0);
              const yr = w[K + kt] - w[K2 + kt], yi = w[K + kt + 1] - w[K2 + kt + 1];
              tr += xr * yr - xi * yi;
              ti += xr * yi + xi * yr;
            }
          }
          out[j] += weight * tr;
          imaginary[j] += weight * ti;
        }
      }
      t0 += pieces[p].duration;
    }
  }

  /** Writes G(s), ∂₁G, ∂₂G of piece p into scratch slots (interleaved), from the phase tables of the current momentum. */
  private generator(p: number, g: number, d1: number, d2: number): void {
    const w = this.s;
    const sr = this.series[p];
    const m1 = this.reach[0], m2 = this.reach[1];
    w.fill(0, g, g + 8);
    w.fill(0, d1, d1 + 8);
    w.fill(0, d2, d2 + 8);
    for (let q = 0; q < sr.n1.length; q++) {
      const n1 = sr.n1[q], n2 = sr.n2[q];
      const ar = this.phase1[2 * (m1 + n1)], ai = this.phase1[2 * (m1 + n1) + 1];
      const br = this.phase2[2 * (m2 + n2)], bi = this.phase2[2 * (m2 + n2) + 1];
      const c = ar * br - ai * bi, s = ar * bi + ai * br;
      const f1 = -2 * Math.PI * n1, f2 = -2 * Math.PI * n2;
      for (let e = 0; e < 4; e++) {
        const xr = sr.re[4 * q + e], xi = sr.im[4 * q + e];
        const yr = xr * c - xi * s, yi = xr * s + xi * c;
        w[g + 2 * e] += yr;
        w[g + 2 * e + 1] += yi;
        w[d1 + 2 * e] -= f1 * yi;
        w[d1 + 2 * e + 1] += f1 * yr;
        w[d2 + 2 * e] -= f2 * yi;
        w[d2 + 2 * e + 1] += f2 * yr;
      }
    }
  }

  /** out = g ∘ Ψ(τ) for piece p: Ψ_aa = −iτ, Ψ_ab = −iτ e^{iδτ/2} sinc(δτ/2), δ = λ_a − λ_b. */
  private hadamardPsi(g: Float64Array, go: number, p: number, tau: number, out: Float64Array, oo: number): void {
    const half = ((this.lambda[2 * p] - this.lambda[2 * p + 1]) * tau) / 2;
    const mag = tau * sinc(half);
    // Ψ_01 = mag (sin h − i cos h) with h = half; Ψ_10 with −half.
    const p01r = mag * Math.sin(half), p01i = -mag * Math.cos(half);
    const p10r = -p01r, p10i = p01i;
    out[oo] = g[go + 1] * tau;
    out[oo + 1] = -g[go] * tau;
    out[oo + 2] = g[go + 2] * p01r - g[go + 3] * p01i;
    out[oo + 3] = g[go + 2] * p01i + g[go + 3] * p01r;
    out[oo + 4] = g[go + 4] * p10r - g[go + 5] * p10i;
    out[oo + 5] = g[go + 4] * p10i + g[go + 5] * p10r;
    out[oo + 6] = g[go + 7] * tau;
    out[oo + 7] = -g[go + 6] * tau;
  }
}
