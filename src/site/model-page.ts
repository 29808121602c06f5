/**
 * Everything a model page shows, in the order a referee reads it: the verdict
 * and the claims with their evidence first, then the model (Hamiltonian,
 * symmetries, lattice, drive), the computed spectra and phase diagrams, and
 * provenance, citation and downloads. Pages and components only place it.
 */
import { hintLabel, separateHint } from './verdict-hint.ts';
import type { ModelRecord } from '../catalogue/records/model-record.ts';
import type { Verdict } from '../catalogue/verify/verdict.ts';
import { ANOMALOUS_LABEL, consistencyDetail, consistencyName, count, quantityName, valueText, SYMMETRY_NAME } from '../catalogue/vocabulary.ts';
import { certificateView, type CertificateView } from './certificate-view.ts';
import { citation, referenceViews, type Citation, type ReferenceView } from './citation.ts';
import { recordDate } from './data.ts';
import { bandFigures, latticeFigures, spectrumFigures, sweepFigures, timelineFigure, type BandFigures, type LatticeFigures, type SpectrumFigure, type SweepFigure, type TimelineFigure } from './figures.ts';
import { inventoryRow } from './inventory.ts';
import { renderMarkdown } from './markdown.ts';
import { modelSource, sourceText } from './model-source.ts';
import { timeText } from './plots/drive-timeline.ts';
import { facetSlug } from './render/inventory-row.ts';
import { parameterSymbol } from './symbols.ts';
import { hamiltonianFormulas } from './tex/hamiltonian-tex.ts';
import { texToHtml } from './tex/katex.ts';
import { operatorFormulas } from './tex/operators-tex.ts';

export interface ClaimView {
  id: string;
  anchor: string;
  /** Physicist's name of the claimed quantity, "_" subscripts. */
  name: string;
  claimed: string;
  computed: string;
  /** Computed value is only an estimate (unsettled). */
  estimateOnly: boolean;
  outcome: Verdict['outcome'];
  message: string;
  /** The hint when the message does not already say it, and how to introduce it. */
  hint: string | null;
  hintLabel: string;
  pointer: string;
  certificate: CertificateView;
  /** Where on the page the evidence is drawn. */
  evidence: { href: string; text: string }[];
}

export interface Fact {
  label: string;
  value: string;
  href?: string;
}

export interface ModelPageData {
  id: string;
  title: string;
  status: ModelRecord['status'];
  headline: string;
  detail: string[];
  facts: Fact[];
  tags: { text: string; href: string }[];
  summary: string | null;
  claims: ClaimView[];
  /** Computed invariants the file does not claim (claimed ones are in the claims table). */
  portrait: { name: string; value: string; settled: boolean; certificate: CertificateView; anchor: string }[];
  /** Number of computed invariants in all. */
  computedCount: number;
  descriptionHtml: string;
  hamiltonian: { dimension: 1 | 2; segments: { index: number; label: string | null; windowHtml: string; formulaHtml: string; potentialHtml: string | null; omitted: number }[]; definitionsHtml: string[] } | null;
  operators: { words: string; html: string; note: string | null }[];
  symmetryClass: string | null;
  parameters: { symbol: string; name: string; value: string; expression: string | null; description: string | null }[];
  lattice: LatticeFigures | null;
  timeline: TimelineFigure | null;
  period: string | null;
  bands: BandFigures;
  gaps: { name: string; arc: string; minimal: string; at: string; lowerBound: string; tolerance: string; open: boolean }[];
  grid: string | null;
  propagatorAccuracy: string | null;
  consistency: { name: string; outcome: 'holds' | 'fails' | 'inconclusive'; detail: string }[];
  spectra: SpectrumFigure[];
  sweeps: SweepFigure[];
  diagnostics: ModelRecord['diagnostics'];
  incident: ModelRecord['incident'];
  engine: { version: string; numericsHash: string; checkedOn: string | null };
  /** The limits the model was verified under and the cost estimated before computing. */
  budget: ModelRecord['budget'];
  maintainers: string[];
  dates: { created: string; updated: string | null } | null;
  references: ReferenceView[];
  citation: Citation | null;
  downloads: { source: boolean; file: string };
  anomalous: { label: string; reason: string } | null;
}

const slug = (id: string) => id.replace(/[^a-z0-9]+/gi, '-').replace(/^-|-$/g, '');

function evidenceLinks(v: Verdict, record: ModelRecord): { href: string; text: string }[] {
  const links: { href: string; text: string }[] = [];
  const spectra = record.analysis?.spectra ?? [];
  if (v.kind === 'edge-modes') {
    const m = /edge-(\d)/.exec(v.claim);
    const f = m ? Number(m[1]) : 1;
    if (spectra.some((s) => s.kind === 'ribbon' && s.finiteDirection === f)) links.push({ href: `#ribbon-${f + 1}`, text: 'ribbon spectrum' });
  }
  if (v.kind === 'end-modes' && spectra.some((s) => s.kind === 'open-chain')) links.push({ href: '#open-chain', text: 'open-chain spectrum' });
  if (['winding', 'chern', 'gap-invariant', 'anomalous'].includes(v.kind) && record.analysis) links.push({ href: '#bands', text: 'bands and gaps' });
  if (v.kind === 'minimal-gap' && record.analysis) links.push({ href: '#gaps', text: 'gap table' });
  if (v.kind === 'symmetry') links.push({ href: '#symmetries', text: 'operators' });
  return links;
}

function verdictHeadline(record: ModelRecord, names: Map<string, string>): { headline: string; detail: string[] } {
  const c = record.counts;
  const total = c.confirmed + c.contradicted + c.unsettled;
  const listOf = (outcome: Verdict['outcome']) => record.claims.filter((v) => v.outcome === outcome).map((v) => names.get(v.claim) ?? v.claim);
  switch (record.status) {
    case 'verified':
      return {
        headline: `All ${count(total, 'claim')} confirmed by recomputation.`,
        detail: ['Each holds on the grids and within the tolerances shown in its certificate: numerical evidence, not proof.'],
      };
    case 'disputed':
      return {
        headline: `${c.contradicted} of ${count(total, 'claim')} contradicted by recomputation.`,
        detail: [`Contradicted: ${listOf('contradicted').join('; ')}.`, ...(c.unsettled > 0 ? [`Unsettled: ${listOf('unsettled').join('; ')}.`] : []), 'Each row below says what was computed instead and, where one is recognisable, the likely cause.'],
      };
    case 'unsettled':
      return {
        headline: `No claim contradicted, but ${c.unsettled} of ${count(total, 'claim')} could not be settled.`,
        detail: [`Unsettled: ${listOf('unsettled').join('; ')}.`, 'Unsettled means the evidence is too weak either way at these settings (a gap closed or below its tolerance, refinement not converged, a system too small); each row says what would settle it.'],
      };
    case 'portrait-only':
      return { headline: 'This file states no claims.', detail: ['The invariants below were computed from its drive; nothing was compared.'] };
    case 'invalid':
      return { headline: 'The model file could not be loaded, so none of its claims were checked.', detail: [record.statusReason] };
    case 'failed':
      return { headline: 'The computation did not finish, so no claim was settled.', detail: [record.incident?.message ?? record.statusReason] };
  }
}

export function modelPageData(record: ModelRecord): ModelPageData {
  const m = record.model;
  const source = modelSource(record);
  const row = inventoryRow(record);
  const context = { symmetryClass: m?.symmetryClass ?? null, cut: record.analysis?.facts.cut ?? null };
  const claimName = (v: Verdict) => quantityName(v.claim, { ...context, cut: v.kind === 'chern' ? v.gap : null }).words;
  const names = new Map(record.claims.map((v) => [v.claim, claimName(v)]));
  const { headline, detail } = verdictHeadline(record, names);
  const claims: ClaimView[] = record.claims.map((v) => ({
    id: v.claim,
    anchor: `claim-${slug(v.claim)}`,
    name: names.get(v.claim)!,
    claimed: valueText(v.claimed),
    computed: v.computed === null ? valueText(v.estimate) : valueText(v.computed),
    estimateOnly: v.computed === null,
    outcome: v.outcome,
    message: v.message,
    hint: separateHint(v.message, v.hint),
    hintLabel: hintLabel(v.outcome),
    pointer: v.pointer,
    certificate: certificateView(v.certificate),
    evidence: evidenceLinks(v, record),
  }));
  const portrait = record.portrait.filter((e) => !e.claimed).map((e) => ({
    name: quantityName(e.id, context).words,
    value: e.settled ? valueText(e.value) : `${valueText(e.estimate)} (unsettled)`,
    settled: e.settled,
    certificate: certificateView(e.certificate),
    anchor: `value-${slug(e.id)}`,
  }));
  const value = (q: Parameters<NonNullable<typeof source>['value']>[0]) => source!.value(q);
  const formulas = source ? hamiltonianFormulas(source.document, value) : null;
  const period = source ? source.value(source.document.drive.period) : Number.NaN;
  const operators = source
    ? operatorFormulas(source.document, (q) => timeText(source.value(q), period)).map((o) => ({ words: SYMMETRY_NAME[o.symmetry]?.words ?? o.symmetry, html: texToHtml(o.tex, true), note: o.note }))
    : [];
  const facts: Fact[] = [];
  if (m?.dimension) facts.push({ label: 'dimension', value: m.dimension === 1 ? 'chain (1D)' : 'sheet (2D)' });
  facts.push({ label: 'symmetry class', value: m?.symmetryClass ? `${m.symmetryClass} (as stated in the file)` : 'not stated', ...(m?.symmetryClass ? { href: `browse/class/${facetSlug(m.symmetryClass)}` } : {}) });
  if (row.lattice) facts.push({ label: 'lattice', value: row.lattice, href: `browse/lattice/${facetSlug(row.lattice)}` });
  if (row.drives.length > 0) facts.push({ label: 'drive', value: row.drives.join(', '), href: `browse/drive/${facetSlug(row.drives[0])}` });
  if (record.drive) facts.push({ label: 'period', value: `T = ${valueText(record.drive.period, 6)}` });
  const anomalous = record.status === 'invalid' || record.status === 'failed' ? null : { label: ANOMALOUS_LABEL[record.anomalous.classification], reason: record.anomalous.reason };
  const a = record.analysis;
  const checkedOn = recordDate(record);
  return {
    id: record.id,
    title: m?.title ?? record.id,
    status: record.status,
    headline,
    detail,
    facts,
    tags: (m?.tags ?? []).map((t) => ({ text: t, href: `browse/tag/${facetSlug(t)}` })),
    summary: m?.summary ?? null,
    claims,
    portrait,
    computedCount: record.portrait.length,
    descriptionHtml: m?.description ? renderMarkdown(m.description) : '',
    hamiltonian: formulas
      ? {
          dimension: formulas.dimension,
          segments: formulas.segments.map((s) => ({ index: s.index, label: s.label, windowHtml: texToHtml(s.window), formulaHtml: texToHtml(s.tex, true), potentialHtml: s.potential ? texToHtml(s.potential, true) : null, omitted: s.omitted })),
          definitionsHtml: formulas.definitions.map((d) => texToHtml(d)),
        }
      : null,
    operators,
    symmetryClass: m?.symmetryClass ?? null,
    parameters: record.parameters.map((p) => ({ symbol: parameterSymbol(p.name), name: parameterSymbol(p.name) === p.name ? '' : p.name, value: valueText(p.value, 8), expression: p.expression, description: p.description })),
    lattice: source ? latticeFigures(source) : null,
    timeline: source ? timelineFigure(source) : null,
    period: Number.isFinite(period) ? valueText(period, 6) : null,
    bands: bandFigures(record),
    gaps: (a?.gaps ?? []).map((g) => ({
      name: `ε = ${g.label === 0 ? '0' : g.label === 1 ? 'π/T' : `${valueText(g.label)}π/T`}`,
      arc: `${valueText(g.lower)} … ${valueText(g.upper)}`,
      minimal: valueText(g.minimalGap),
      at: g.at.length ? `(${g.at.map((x) => valueText(x, 3)).join(', ')})` : '—',
      // Records of engines before certified bounds carry none: shown as a dash, never as a zero bound.
      lowerBound: typeof g.lowerBound === 'number' && g.lowerBound > 0 ? valueText(g.lowerBound) : '—',
      tolerance: valueText(g.tolerance),
      open: g.open,
    })),
    grid: a ? a.grid.join(' × ') : null,
    propagatorAccuracy: a && a.propagatorAccuracy !== null ? (a.propagatorAccuracy === 0 ? 'exact (piecewise-constant drive)' : `${valueText(a.propagatorAccuracy)} π/T`) : null,
    consistency: (a?.consistency ?? []).map((c) => ({ name: consistencyName(c.name), outcome: c.inconclusive ? 'inconclusive' : c.holds ? 'holds' : 'fails', detail: consistencyDetail(c.detail) })),
    spectra: spectrumFigures(record),
    sweeps: sweepFigures(record),
    diagnostics: record.diagnostics,
    incident: record.incident,
    engine: { version: record.engine.version, numericsHash: record.engine.numericsHash, checkedOn },
    budget: record.budget,
    maintainers: m?.maintainers ?? [],
    dates: m ? m.dates : null,
    references: referenceViews(record),
    citation: citation(record, checkedOn),
    downloads: { source: sourceText(record) !== null, file: record.file },
    anomalous,
  };
}


