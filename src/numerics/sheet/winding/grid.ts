/**
 * Discretisation of the (s₁, s₂, t) domain of the gap winding integral
 * (winding/integral.ts): Gauss–Legendre nodes in time, central differences in
 * momentum, and momentum axes that crowd their points where the integrand is
 * sharp.
 *
 * Why a graded axis is allowed at all: the winding density is a 3-form, so the
 * integral is unchanged under any orientation-preserving reparametrisation
 * s = g(σ) of each momentum circle. We integrate on a uniform grid in σ (where
 * periodic central differences and the rectangle rule stay high-order accurate)
 * and choose g to put many points near the momenta where the gap is small.
 */

/** Nodes in (−1, 1) ascending and weights of the m-point Gauss–Legendre rule. */
export interface GaussLegendreRule {
  nodes: Float64Array;
  weights: Float64Array;
}

const ruleCache = new Map<number, GaussLegendreRule>();

/**
 * m-point Gauss–Legendre rule by Newton iteration on P_m from the asymptotic
 * guess cos(π(i − 1/4)/(m + 1/2)) (common practice, e.g. Abramowitz & Stegun
 * 25.4.29; Numerical Recipes §4.6). Exact for polynomials of degree 2m − 1.
 */
export function gaussLegendre(m: number): GaussLegendreRule {
  if (!(Number.isInteger(m) && m >= 1)) throw new RangeError(`gaussLegendre: node count must be a positive integer, got ${m}`);
  const hit = ruleCache.get(m);
  if (hit !== undefined) return hit;
  const nodes = new Float64Array(m), weights = new Float64Array(m);
  for (let i = 0; i < Math.ceil(m / 2); i++) {
    let x = Math.cos((Math.PI * (i + 0.75)) / (m + 0.5));
    let dp = 0;
    for (let iter = 0; iter < 100; iter++) {
      // Three-term recurrence for P_m(x) and P_{m−1}(x).
      let p0 = 1, p1 = x;
      for (let k = 2; k <= m; k++) [p0, p1] = [p1, ((2 * k - 1) * x * p1 - (k - 1) * p0) / k];
      dp = (m * (x * p1 - p0)) / (x * x - 1);
      const dx = p1 / dp;
      x -= dx;
      if (Math.abs(dx) < 1e-16) break;
    }
    const w = 2 / ((1 - x * x) * dp * dp);
    nodes[i] = -x;
    nodes[m - 1 - i] = x;
    weights[i] = w;
    weights[m - 1 - i] = w;
  }
  const rule = { nodes, weights };
  ruleCache.set(m, rule);
  return rule;
}

/**
 * Coefficients c₁ … c_r of the central difference of order 2r on a uniform grid:
 * f′(x) ≈ (1/h) Σ_{j=1}^{r} c_j (f(x + jh) − f(x − jh)),
 * c_j = (−1)^{j+1} (r!)² / (j (r − j)! (r + j)!) (common practice, Fornberg,
 * Math. Comp. 51, 699 (1988)). r = 1 gives 1/2; r = 2 gives 2/3, −1/12.
 */
export function centralDifference(radius: number): Float64Array {
  if (!(Number.isInteger(radius) && radius >= 1)) throw new RangeError(`centralDifference: radius must be a positive integer, got ${radius}`);
  const fact = (k: number) => {
    let f = 1;
    for (let i = 2; i <= k; i++) f *= i;
    return f;
  };
  const c = new Float64Array(radius);
  const rr = fact(radius) ** 2;
  for (let j = 1; j <= radius; j++) c[j - 1] = ((j % 2 === 1 ? 1 : -1) * rr) / (j * fact(radius - j) * fact(radius + j));
  return c;
}

/** A point of one momentum circle where grid points should crowd, and the width (reduced units) of the sharp region. */
export interface AxisFocus {
  centre: number;
  width: number;
}

/** Fraction of an axis' points given to its foci when there are any. */
export const FOCUS_FRACTION = 0.5;

/**
 * n points s_i = F⁻¹(i/n) of a periodic axis [0, 1), F the cumulative of the
 * density (1 − α) + α · mean over foci of a wrapped Cauchy density centred at
 * the focus with half-width `width` (α = FOCUS_FRACTION; α = 0 without foci).
 * The wrapped Cauchy cumulative is closed-form and smooth, so s(σ) is analytic
 * and periodic differences in σ keep their order:
 *   A(θ) = θ/2π + (1/π) atan2(r sin θ, 1 − r cos θ),  θ = 2π(s − c),  r = e^{−2π·width}.
 */
export function gradedAxis(n: number, foci: AxisFocus[]): Float64Array {
  const s = new Float64Array(n);
  if (foci.length === 0) {
    for (let i = 0; i < n; i++) s[i] = i / n;
    return s;
  }
  const alpha = FOCUS_FRACTION;
  const rs = foci.map((f) => Math.exp(-2 * Math.PI * Math.max(f.width, 1e-12)));
  const part = (x: number, c: number, r: number) => {
    const th = 2 * Math.PI * (x - c);
    return x - c + Math.atan2(r * Math.sin(th), 1 - r * Math.cos(th)) / Math.PI;
  };
  const cdf = (x: number) => {
    let acc = 0;
    for (let j = 0; j < foci.length; j++) acc += part(x, foci[j].centre, rs[j]) - part(0, foci[j].centre, rs[j]);
    return (1 - alpha) * x + (alpha * acc) / foci.length;
  };
  for (let i = 0; i < n; i++) {
    const target = i / n;
    if (target === 0) continue; // F(0) = 0: the first point is s = 0 exactly.
    let lo = 0, hi = 1;
    // Bisection: F is increasing with F(0) = 0, F(1) = 1; 60 halvings reach rounding.
    for (let it = 0; it < 60; it++) {
      const mid = 0.5 * (lo + hi);
      if (cdf(mid) < target) lo = mid;
      else hi = mid;
    }
    s[i] = 0.5 * (lo + hi);
  }
  return s;
}
