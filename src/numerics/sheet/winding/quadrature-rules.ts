/**
 * One-dimensional quadrature rules on [−1, 1] used by the winding integral:
 * Gauss–Legendre for the time integral of each loop piece, and the nested
 * Gauss–Kronrod pair (7 and 15 points) whose tensor products are the cells of
 * the adaptive momentum quadrature (winding/adaptive-quadrature.ts).
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
 * The 15-point Kronrod extension of the 7-point Gauss rule (Kronrod 1965; the
 * values tabulated in QUADPACK's qk15, Piessens et al., QUADPACK (1983)).
 * Nodes ascending; `gauss` holds the indices of the 7 Gauss nodes among them
 * (every second node) and their Gauss weights. Kronrod is exact to degree 22,
 * Gauss to degree 13; |Kronrod − Gauss| is the usual (conservative) error
 * estimate of the Kronrod value.
 */
export interface GaussKronrodRule {
  nodes: Float64Array;
  kronrodWeights: Float64Array;
  gaussIndices: Int32Array;
  gaussWeights: Float64Array;
}

const KRONROD_NODES = [
  0.991455371120812639206854697526329, 0.949107912342758524526189684047851, 0.864864423359769072789712788640926,
  0.741531185599394439863864773280788, 0.586087235467691130294144845693013, 0.405845151377397166906606412076961,
  0.207784955007898467600689403773245, 0,
];
const KRONROD_WEIGHTS = [
  0.02293532201052922496373200805897, 0.063092092629978553290700663189204, 0.104790010322250183839876322541518,
  0.140653259715525918745189590510238, 0.16900472663926790282658342659855, 0.190350578064785409913256402421014,
  0.204432940075298892414161999234649, 0.209482141084727828012999174891714,
];
const GAUSS_WEIGHTS = [0.129484966168869693270611432679082, 0.27970539148927666790146777142378, 0.381830050505118944950369775488975, 0.417959183673469387755102040816327];

let kronrod15: GaussKronrodRule | undefined;

export function gaussKronrod15(): GaussKronrodRule {
  if (kronrod15 !== undefined) return kronrod15;
  const nodes = new Float64Array(15), kw = new Float64Array(15);
  for (let i = 0; i < 8; i++) {
    nodes[i] = -KRONROD_NODES[i];
    nodes[14 - i] = KRONROD_NODES[i];
    kw[i] = KRONROD_WEIGHTS[i];
    kw[14 - i] = KRONROD_WEIGHTS[i];
  }
  // Gauss nodes are the Kronrod nodes 1, 3, 5, 7 (from the ends), i.e. odd indices.
  const gaussIndices = Int32Array.of(1, 3, 5, 7, 9, 11, 13);
  const gaussWeights = Float64Array.of(GAUSS_WEIGHTS[0], GAUSS_WEIGHTS[1], GAUSS_WEIGHTS[2], GAUSS_WEIGHTS[3], GAUSS_WEIGHTS[2], GAUSS_WEIGHTS[1], GAUSS_WEIGHTS[0]);
  kronrod15 = { nodes, kronrodWeights: kw, gaussIndices, gaussWeights };
  return kronrod15;
}
