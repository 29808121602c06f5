/**
 * Verdicts and portrait entries for two-dimensional drives (SheetPortrait).
 *
 * Quantities: band Chern numbers (Fukui–Hatsugai–Suzuki), gap winding numbers
 * (Rudner–Lindner–Berg–Levin), signed edge counts on ribbons, minimal gaps.
 * Recognised causes of a contradiction:
 *   - the claim is minus the computed value: an orientation error;
 *   - the claim equals the value of another gap, band or edge: a mix-up.
 */
import type { BandGroupReport, GapReport, RibbonReport, SheetPortrait } from '../../numerics/portrait.ts';
import type { GapEvidence } from './certificate.ts';
import { emptyCertificate } from './certificate.ts';
import type { NormalizedClaim } from './claims.ts';
import { gapKey } from './claims.ts';
import { gapReason } from './evidence.ts';
import type { CountObservation, SettledInteger } from './evidence.ts';
import { countAtTwoSizes, countEvidence, judgeEstimate } from './evidence.ts';
import { formatNumber, formatQuasienergy, formatRawValue } from './format.ts';
import type { VerdictPolicy } from './policy.ts';
import { gapTolerance } from './policy.ts';
import type { Alternative, Verdict } from './verdict.ts';
import { integerVerdict, settlingRemedy } from './verdict.ts';
import { residualEntries, symmetryClassVerdict, symmetryFor, symmetryVerdict } from './symmetry-verdicts.ts';

const SAME = 1e-6;

/**
 * C and W are reported in the Cartesian orientation whatever the handedness of
 * (a₁, a₂) (docs/conventions.md, Orientation), so a flipped sign is not the
 * basis: it is a claim taken in another orientation or time convention.
 */
export const SIGN_HINT_ORIENTATION =
  'sign differs: C and W are reported in the Cartesian orientation (x̂, ŷ) for either handedness of (a₁, a₂); a value taken in the orientation of the lattice vectors of a left-handed basis, or with time evolution e^(+iHt) instead of e^(−iHt), has the opposite sign';
/** Edge counts are named by the lattice vectors, so for them the handedness does enter (table in docs/conventions.md). */
export const SIGN_HINT_EDGE = 'sign differs: check the orientation of (a₁, a₂) or the direction of k_∥ (edge-count signs follow the table in docs/conventions.md)';

/**
 * A sheet portrait with, optionally, the ribbons recomputed at a second width
 * (verify-model.ts): edge counts are settled only when both widths agree.
 */
export type CheckedSheetPortrait = SheetPortrait & { checkRibbons?: RibbonReport[] };

export function sameLabel(a: number, b: number): boolean {
  const d = Math.abs(a - b);
  return d < SAME || Math.abs(d - 2) < SAME;
}

/** Width (units π/T) of a quasienergy range that may wrap through π. */
export function rangeWidth(range: [number, number]): number {
  const w = range[1] - range[0];
  return w >= 0 ? w : w + 2;
}

/** The gap a claimed label names: exact label first, else the arc containing it. */
export function findGap(gaps: GapReport[], label: number): GapReport | undefined {
  const exact = gaps.find((g) => sameLabel(g.label, label));
  if (exact) return exact;
  return gaps.find((g) => (g.lower <= g.upper ? label > g.lower && label < g.upper : label > g.lower || label < g.upper));
}

/** Whether a band group's quasienergy range (which may wrap through π) contains `label`. */
function bandContains(b: BandGroupReport, label: number): boolean {
  const [lo, hi] = b.range;
  return lo <= hi ? label >= lo && label <= hi : label >= lo || label <= hi;
}

/**
 * Why a label names no gap: it lies inside a band group (named, with its
 * range), or in no gap the engine found. Lists the open gaps to choose from.
 */
export function noGapReason(source: Pick<GapSource, 'gaps' | 'bands'>, label: number): string {
  const band = source.bands.find((b) => bandContains(b, label));
  const open = source.gaps.filter((g) => g.open).sort((a, b) => a.label - b.label).map((g) => formatQuasienergy(g.label));
  const where = band
    ? `; it lies in band group ${band.index} (quasienergies ${band.range[0].toFixed(3)} to ${band.range[1].toFixed(3)} π/T)`
    : '';
  const remedy = open.length > 0 ? 'name the gap by a quasienergy inside one of the open gaps' : 'move the parameter point to where a gap opens';
  return `no open gap contains ${formatQuasienergy(label)}${where}; open gaps: ${open.length > 0 ? open.join(', ') : 'none'}; to settle, ${remedy}`;
}

function missingGap(source: GapSource, label: number, stage: string): SettledInteger {
  const certificate = emptyCertificate(stage);
  certificate.grid = [...source.grid];
  const why = noGapReason(source, label);
  certificate.notes.push(why);
  return { value: null, nearest: null, settled: false, reasons: [why], certificate };
}

function adjacentWidth(bands: BandGroupReport[], label: number): number {
  let width = 0;
  for (const b of bands) if (sameLabel(b.gapBelow, label) || sameLabel(b.gapAbove, label)) width = Math.max(width, rangeWidth(b.range));
  return width;
}

/** Below this fraction of the adjacent bandwidth a gap is "small": the point sits at or near a phase transition. */
export const TRANSITION_FRACTION = 0.01;

/** The engine's results a gap verdict reads. */
export interface GapSource {
  gaps: GapReport[];
  bands: BandGroupReport[];
  grid: number[];
  /** The engine's gap tolerance (the model's numerics.tolerances.gap, else the engine default), units π/T. */
  gapTolerance?: number;
  /** Width of the quasienergy bands next to a gap (units π/T) when the source has no band groups (chains). */
  bandwidth?: number;
}

/**
 * A gap is open for verdicts when the engine's certified lower bound of its
 * minimal direct gap exceeds the tolerance (policy.ts, gapTolerance); the
 * refined minimum and the bound both go into the certificate. A gap without a
 * certified bound is never open.
 */
export function gapEvidence(portrait: GapSource, label: number, policy: VerdictPolicy): GapEvidence {
  const tolerance = gapTolerance(policy, portrait.gapTolerance);
  const gap = findGap(portrait.gaps, label);
  if (!gap) return { gap: label, minimalGap: 0, at: [], lowerBound: 0, bound: 'none', evaluations: 0, nearTransition: false, tolerance, open: false };
  const c = gap.certified;
  const lowerBound = c ? c.lower : 0;
  // A gap that is not open has no band groups beside it: the group it lies in stands for its bands.
  const around = portrait.bands.filter((b) => bandContains(b, gap.label)).map((b) => rangeWidth(b.range));
  const bandwidth = portrait.bandwidth ?? Math.max(adjacentWidth(portrait.bands, gap.label), ...around);
  return {
    gap: gap.label,
    minimalGap: gap.minimalGap,
    at: [...gap.momentumAtMinimum],
    lowerBound,
    bound: c ? c.status : 'none',
    evaluations: c ? c.evaluations : 0,
    nearTransition: bandwidth > 0 && gap.minimalGap < TRANSITION_FRACTION * bandwidth,
    tolerance,
    open: gap.open && c !== undefined && lowerBound > tolerance,
  };
}

/** Band groups ordered upward from the gap `cut` (following gapAbove links), or null if the cut is not a gap edge. */
export function bandsFromCut(bands: BandGroupReport[], cut: number): BandGroupReport[] | null {
  const first = bands.find((b) => sameLabel(b.gapBelow, cut));
  if (!first) return null;
  const ordered = [first];
  while (ordered.length < bands.length) {
    const last = ordered[ordered.length - 1];
    const next = bands.find((b) => !ordered.includes(b) && sameLabel(b.gapBelow, last.gapAbove));
    if (!next) break;
    ordered.push(next);
  }
  return ordered;
}

function windingEvidence(p: SheetPortrait, label: number, policy: VerdictPolicy): SettledInteger {
  const gap = findGap(p.gaps, label);
  if (!gap) return missingGap(p, label, 'winding');
  const report = gap ? p.windings.find((w) => sameLabel(w.gap, gap.label)) : undefined;
  const ev = judgeEstimate(report?.winding, [gapEvidence(p, label, policy)], policy, 'winding');
  const q = report?.quadrature;
  if (q) {
    ev.certificate.notes.push(
      `adaptive Gauss–Kronrod quadrature: ${q.evaluations} evaluations on ${q.cells} cells (first mesh ${q.meshCells}), error estimate ${formatNumber(q.errorEstimate)}, ` +
        `raw value ${formatRawValue(q.raw)}; ${q.timeNodes} time nodes over the period (a quarter more per piece changes the density by ${formatNumber(q.timeRuleChange)}, relative)`,
    );
  }
  return ev;
}

function chernEvidence(p: SheetPortrait, band: BandGroupReport, policy: VerdictPolicy): SettledInteger {
  const gaps = [gapEvidence(p, band.gapBelow, policy), gapEvidence(p, band.gapAbove, policy)];
  const ev = judgeEstimate(band.chern, gaps, policy, 'chern');
  const c = band.chern;
  if (c) {
    ev.certificate.notes.push(
      `largest plaquette flux ${formatNumber(c.maxPlaquetteFlux)} rad (bound ${formatNumber(c.fluxThreshold)}), smallest link modulus ${formatNumber(c.minimalLinkModulus)}`,
    );
  }
  if (band.touching) ev.certificate.notes.push(`${band.branches} touching branches grouped (smallest internal gap ${formatNumber(band.minimalInternalGap)} π/T)`);
  return ev;
}

function edgeObservation(ribbons: RibbonReport[], gap: GapReport, finiteAlong: number, end: 'low' | 'high'): CountObservation | string {
  const ribbon = ribbons.find((r) => r.finiteDirection === finiteAlong);
  if (!ribbon) return `no ribbon finite along a${finiteAlong === 0 ? '₁' : '₂'} was computed`;
  const count = ribbon.counts.find((c) => sameLabel(c.gap, gap.label) && c.edge === end);
  if (!count) return `the ribbon spectrum (width ${ribbon.width}) has no count for this gap on the ${end} edge`;
  return {
    grid: [ribbon.width, ribbon.momenta],
    count: count.count,
    settled: count.settled,
    ...(count.reason !== undefined ? { reason: count.reason } : {}),
    note: `decay length ≈ ${count.decayLength.toPrecision(3)} cells, ribbon width ${count.width} cells, ${count.crossings.length} edge crossing(s); ${ribbonRoute(ribbon, count)}`,
  };
}

/** How a ribbon count was taken, for the certificate: widths tried, route, grid and error bounds. */
function ribbonRoute(r: RibbonReport, c: RibbonReport['counts'][number]): string {
  const widths = r.widths.length > 1 ? `widths tried ${r.widths.join(', ')} cells (budget ${r.widthBudget})` : `width budget ${r.widthBudget} cells`;
  const route =
    r.route === 'dense'
      ? `every state at ${r.momenta} momenta`
      : `states within ${(c.window ?? 0).toPrecision(3)} π/T of the label by shift-invert at ${c.momentaEvaluated ?? r.momenta} momenta (base grid ${r.momenta}), quasienergy error ≤ ${(c.errorBound ?? 0).toExponential(1)} π/T`;
  const truncation = r.truncation > 0 ? `, band truncation ≤ ${r.truncation.toExponential(1)}` : '';
  return `${widths}; ${route}${truncation}`;
}

/** Signed edge count, settled only when a ribbon 1.5× as wide (checkRibbons) gives the same count. */
function edgeEvidence(p: CheckedSheetPortrait, label: number, finiteAlong: number, end: 'low' | 'high', policy: VerdictPolicy): SettledInteger {
  const gap = findGap(p.gaps, label);
  if (!gap) return missingGap(p, label, 'ribbon');
  const gaps = [gapEvidence(p, label, policy)];
  const unsettled = 'the edge count is unsettled (ribbon too narrow for the decay length)';
  const first = countEvidence('ribbon', edgeObservation(p.ribbons, gap, finiteAlong, end), gaps, unsettled);
  const check = p.checkRibbons?.some((r) => r.finiteDirection === finiteAlong) ? countEvidence('ribbon', edgeObservation(p.checkRibbons, gap, finiteAlong, end), gaps, unsettled) : undefined;
  return countAtTwoSizes(first, check, 'ribbon width');
}

export interface SheetJudgement {
  verdicts: Verdict[];
  entries: PortraitEntry[];
}

/** A computed invariant, claimed or not: the model's "portrait" as the site lists it. */
export interface PortraitEntry {
  id: string;
  quantity: 'winding' | 'chern' | 'edge-modes' | 'minimal-gap' | 'gap-invariant' | 'end-modes' | 'frame-winding';
  gap: number | null;
  /** Human description, e.g. "winding W at ε = π/T". */
  label: string;
  value: number | null;
  estimate: number | null;
  settled: boolean;
  claimed: boolean;
  certificate: SettledInteger['certificate'];
}

export function judgeSheet(p: CheckedSheetPortrait, claims: NormalizedClaim[], policy: VerdictPolicy): SheetJudgement {
  const verdicts: Verdict[] = [];
  const gapLabels = p.gaps.map((g) => g.label);
  const windings = new Map(gapLabels.map((l) => [l, windingEvidence(p, l, policy)]));
  const otherGaps = (label: number, values: (l: number) => number | null): Alternative[] =>
    gapLabels
      .filter((l) => !sameLabel(l, label))
      .flatMap((l) => {
        const v = values(l);
        return v === null ? [] : [{ value: v, hint: `this value belongs to the gap at ${formatQuasienergy(l)}` }];
      });

  for (const claim of claims) {
    switch (claim.kind) {
      case 'winding': {
        const ev = windingEvidence(p, claim.gap, policy);
        const alternatives: Alternative[] = [];
        if (ev.value) alternatives.push({ value: -ev.value, hint: SIGN_HINT_ORIENTATION });
        alternatives.push(...otherGaps(claim.gap, (l) => windings.get(l)?.value ?? null));
        verdicts.push(integerVerdict(claim, claim.gap, `The winding number W at ${formatQuasienergy(claim.gap)}`, ev, alternatives));
        break;
      }
      case 'edge-modes': {
        const ev = edgeEvidence(p, claim.gap, claim.finiteAlong, claim.end, policy);
        const alternatives: Alternative[] = [];
        if (ev.value) alternatives.push({ value: -ev.value, hint: SIGN_HINT_EDGE });
        const other = claim.end === 'low' ? 'high' : 'low';
        const otherEdge = edgeEvidence(p, claim.gap, claim.finiteAlong, other, policy).value;
        if (otherEdge !== null) alternatives.push({ value: otherEdge, hint: `this value belongs to the ${other} edge of the same ribbon` });
        alternatives.push(...otherGaps(claim.gap, (l) => edgeEvidence(p, l, claim.finiteAlong, claim.end, policy).value));
        const what = `The signed edge count on the ${claim.end} edge (ribbon finite along a${claim.finiteAlong === 0 ? '₁' : '₂'}) at ${formatQuasienergy(claim.gap)}`;
        verdicts.push(integerVerdict(claim, claim.gap, what, ev, alternatives));
        break;
      }
      case 'chern': {
        const ordered = bandsFromCut(p.bands, claim.cut);
        const claimedBands = claims.filter((c) => c.kind === 'chern' && sameLabel(c.cut, claim.cut)).length;
        const band = ordered && ordered.length >= claimedBands ? ordered[claim.band] : undefined;
        if (!band) {
          const certificate = emptyCertificate('chern');
          certificate.grid = [...p.grid];
          certificate.gaps = p.gaps.map((g) => gapEvidence(p, g.label, policy));
          // Fewer band groups than claimed bands means a gap the claims rely on is closed (bands
          // touch and merge into one group): the band a claim names is then not a band computed.
          // A cut gap that was found but is not counted as open gets the gap's own reason and remedy.
          const found = findGap(p.gaps, claim.cut);
          const cutReason = found ? gapReason(gapEvidence(p, claim.cut, policy), 'the cut gap') : noGapReason(p, claim.cut);
          const why = !ordered
            ? `the cut must be an open gap, but ${cutReason}`
            : `the file claims ${claimedBands} band(s) above the cut at ${formatQuasienergy(claim.cut)}, but ${ordered.length} band group(s) lie between open gaps (bands that touch count as one group; open gaps: ${p.gaps.filter((g) => g.open).map((g) => formatQuasienergy(g.label)).join(', ') || 'none'}); to settle, claim one Chern number per band group, or move the parameter point to where the gaps between the claimed bands open`;
          certificate.notes.push(why);
          verdicts.push({
            claim: claim.id, kind: claim.kind, pointer: claim.pointer, gap: claim.cut, outcome: 'unsettled', claimed: claim.value,
            computed: null, estimate: null, message: `The Chern number of band ${claim.band + 1} above the cut is ill-defined: ${why}.`,
            hint: (!ordered && found ? settlingRemedy(why) : null) ?? 'check claims.bands.cut, and whether the parameter point sits at a phase transition where bands touch (see the gaps in the certificate)', certificate,
          });
          break;
        }
        const ev = chernEvidence(p, band, policy);
        const alternatives: Alternative[] = [];
        if (ev.value) alternatives.push({ value: -ev.value, hint: SIGN_HINT_ORIENTATION });
        ordered!.forEach((b, i) => {
          if (i === claim.band) return;
          const v = chernEvidence(p, b, policy).value;
          if (v !== null) alternatives.push({ value: v, hint: `this value belongs to band ${i} above the cut (quasienergies ${b.range[0].toFixed(3)} to ${b.range[1].toFixed(3)} π/T)` });
        });
        verdicts.push(integerVerdict(claim, claim.cut, `The Chern number of band ${claim.band + 1} above the cut at ${formatQuasienergy(claim.cut)}`, ev, alternatives));
        break;
      }
      case 'minimal-gap':
        verdicts.push(minimalGapVerdict(claim, gapEvidence(p, claim.gap, policy)));
        break;
      case 'anomalous':
        break; // judged from the whole portrait (analyse-point.ts)
      case 'symmetry':
        verdicts.push(symmetryVerdict(claim, symmetryFor(residualEntries(p.symmetries, [claim.symmetry]), policy)));
        break;
      case 'symmetry-class':
        verdicts.push(symmetryClassVerdict(claim, p.symmetryClass, residualEntries(p.symmetries, ['chiral', 'particle-hole', 'time-reversal']), policy));
        break;
      default:
        verdicts.push(notApplicable(claim, 'a two-dimensional model'));
    }
  }

  const claimedIds = new Set(claims.map((c) => c.id));
  const entries: PortraitEntry[] = [];
  for (const [label, ev] of windings) {
    const id = `gap-${gapKey(label)}/winding`;
    entries.push(entry(id, 'winding', label, `winding W at ${formatQuasienergy(label)}`, ev, claimedIds.has(id)));
  }
  for (const b of p.bands) {
    if (!b.chern) continue;
    const id = `band-${b.index}/chern`;
    const claimed = claims.some((c) => c.kind === 'chern' && bandsFromCut(p.bands, c.cut)?.[c.band] === b);
    entries.push(entry(id, 'chern', null, `Chern number of band ${b.index + 1} above the cut (${b.range[0].toFixed(3)} to ${b.range[1].toFixed(3)} π/T)`, chernEvidence(p, b, policy), claimed));
  }
  for (const r of p.ribbons) {
    for (const c of r.counts) {
      const id = `gap-${gapKey(c.gap)}/edge-${r.finiteDirection}-${c.edge}`;
      const ev = edgeEvidence(p, c.gap, r.finiteDirection, c.edge, policy);
      entries.push(entry(id, 'edge-modes', c.gap, `edge count on the ${c.edge} edge (finite along a${r.finiteDirection === 0 ? '₁' : '₂'}) at ${formatQuasienergy(c.gap)}`, ev, claimedIds.has(id)));
    }
  }
  return { verdicts, entries };
}

export function entry(id: string, quantity: PortraitEntry['quantity'], gap: number | null, label: string, ev: SettledInteger, claimed: boolean): PortraitEntry {
  return { id, quantity, gap, label, value: ev.value, estimate: ev.nearest, settled: ev.settled, claimed, certificate: ev.certificate };
}

/**
 * A claimed minimal gap is a number, not an integer: confirmed when the
 * computed gap is open and within 10 % (relative) or the gap tolerance of the claim.
 */
export function minimalGapVerdict(claim: NormalizedClaim & { kind: 'minimal-gap' }, g: GapEvidence): Verdict {
  const certificate = emptyCertificate('gaps');
  certificate.gaps = [g];
  certificate.raw = g.minimalGap;
  const tolerance = Math.max(0.1 * claim.value, g.tolerance);
  certificate.residual = Math.abs(g.minimalGap - claim.value);
  certificate.residualTolerance = tolerance;
  const base = { claim: claim.id, kind: claim.kind, pointer: claim.pointer, gap: claim.gap, claimed: claim.value, estimate: g.minimalGap, certificate };
  const what = `The minimal gap at ${formatQuasienergy(claim.gap)}`;
  if (!g.open && claim.value > g.tolerance && g.minimalGap <= g.tolerance) {
    return { ...base, outcome: 'contradicted', computed: g.minimalGap, message: `${what} is closed (${formatNumber(g.minimalGap)} π/T), but the file claims ${claim.value} π/T.`, hint: 'the parameter point may lie on a phase boundary' };
  }
  if (certificate.residual <= tolerance) {
    return { ...base, outcome: 'confirmed', computed: g.minimalGap, message: `${what} is ${formatNumber(g.minimalGap)} π/T (certified ≥ ${formatNumber(g.lowerBound)}), within ${formatNumber(tolerance)} of the claimed ${claim.value} π/T.`, hint: null };
  }
  return { ...base, outcome: 'contradicted', computed: g.minimalGap, message: `${what} is ${formatNumber(g.minimalGap)} π/T (certified ≥ ${formatNumber(g.lowerBound)}), but the file claims ${claim.value} π/T (tolerance ${formatNumber(tolerance)}).`, hint: null };
}

export function notApplicable(claim: NormalizedClaim, where: string): Verdict {
  const certificate = emptyCertificate('none');
  certificate.notes.push(`a ${claim.kind} claim is not defined for ${where}`);
  return {
    claim: claim.id, kind: claim.kind, pointer: claim.pointer, gap: 'gap' in claim ? claim.gap : null, outcome: 'unsettled',
    claimed: claim.value, computed: null, estimate: null, message: `This claim (${claim.kind}) is ill-defined for ${where}.`,
    hint: claim.kind === 'winding' || claim.kind === 'edge-modes' || claim.kind === 'chern' ? 'use invariant and endModes for chains' : 'use winding, edgeModes and bands for sheets',
    certificate,
  };
}
