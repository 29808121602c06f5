/**
 * Parameter names as a physicist writes them: "theta1" → θ₁ (text) and
 * \theta_{1} (TeX), "Delta" → Δ, "J_x" → J_x, "t2" → t₂. Names are identifiers
 * ([A-Za-z_][A-Za-z0-9_]*, checked by the loader), so the TeX built here
 * contains nothing a file could use to inject commands.
 */

const GREEK: Record<string, [string, string]> = {
  alpha: ['α', '\\alpha'], beta: ['β', '\\beta'], gamma: ['γ', '\\gamma'], delta: ['δ', '\\delta'], epsilon: ['ε', '\\epsilon'],
  varepsilon: ['ε', '\\varepsilon'], zeta: ['ζ', '\\zeta'], eta: ['η', '\\eta'], theta: ['θ', '\\theta'], vartheta: ['ϑ', '\\vartheta'],
  iota: ['ι', '\\iota'], kappa: ['κ', '\\kappa'], lambda: ['λ', '\\lambda'], mu: ['μ', '\\mu'], nu: ['ν', '\\nu'], xi: ['ξ', '\\xi'],
  rho: ['ρ', '\\rho'], sigma: ['σ', '\\sigma'], tau: ['τ', '\\tau'], upsilon: ['υ', '\\upsilon'], phi: ['φ', '\\phi'], varphi: ['φ', '\\varphi'],
  chi: ['χ', '\\chi'], psi: ['ψ', '\\psi'], omega: ['ω', '\\omega'],
  Gamma: ['Γ', '\\Gamma'], Delta: ['Δ', '\\Delta'], Theta: ['Θ', '\\Theta'], Lambda: ['Λ', '\\Lambda'], Xi: ['Ξ', '\\Xi'], Pi: ['Π', '\\Pi'],
  Sigma: ['Σ', '\\Sigma'], Upsilon: ['Υ', '\\Upsilon'], Phi: ['Φ', '\\Phi'], Psi: ['Ψ', '\\Psi'], Omega: ['Ω', '\\Omega'],
};

const SUBSCRIPT: Record<string, string> = { '0': '₀', '1': '₁', '2': '₂', '3': '₃', '4': '₄', '5': '₅', '6': '₆', '7': '₇', '8': '₈', '9': '₉' };

/** Splits a name into its head and subscript: theta1 → [theta, 1], J_x → [J, x], t_2a → [t, 2a]. */
function split(name: string): [string, string | null] {
  const underscore = name.indexOf('_');
  if (underscore > 0 && underscore < name.length - 1) return [name.slice(0, underscore), name.slice(underscore + 1)];
  const digits = /^([A-Za-z]+?)(\d+)$/.exec(name);
  if (digits) return [digits[1], digits[2]];
  return [name, null];
}

/** Plain-text symbol: θ₁, Δ, J_x, A₀. */
export function parameterSymbol(name: string): string {
  const [head, sub] = split(name);
  const base = GREEK[head]?.[0] ?? head;
  if (sub === null) return base;
  return /^\d+$/.test(sub) ? base + [...sub].map((c) => SUBSCRIPT[c]).join('') : `${base}_${sub}`;
}

const texText = (text: string) => text.replace(/_/g, '\\_');

/** TeX symbol: \theta_{1}, \Delta, J_{x}; longer names upright (\mathrm{mass}). */
export function parameterTex(name: string): string {
  const [head, sub] = split(name);
  const base = GREEK[head]?.[1] ?? (head.length === 1 ? head : `\\mathrm{${texText(head)}}`);
  if (sub === null) return base;
  const subTex = GREEK[sub]?.[1] ?? (sub.length === 1 || /^\d+$/.test(sub) ? sub : `\\mathrm{${texText(sub)}}`);
  return `${base}_{${subTex}}`;
}

/** TeX for an orbital name inside a subscript: A, B, \mathrm{up}. */
export function orbitalTex(name: string): string {
  return name.length === 1 ? name : `\\mathrm{${texText(name)}}`;
}
