/** Assembles ModelRecords from loaded models, compiled drives and judgements. */
import type { LatticeDrive } from '../../numerics/evolution/drive.ts';
import type { SheetPortrait } from '../../numerics/portrait.ts';
import type { Diagnostic } from '../diagnostics.ts';
import type { LoadedModel } from '../load.ts';
import type { ModelDocument } from '../model-types.generated.ts';
import type { AnalysisRecord, IncidentKind, ModelRecord, RecordDiagnostic, SpectrumRecord } from './model-record.ts';
import { RECORD_FORMAT } from './model-record.ts';
import { compareCodePoints } from './canonical-json.ts';
import { decimateRows, roundRows, roundTo, strideFor } from './decimate.ts';
import { ANOMALOUS_DEFINITION } from '../verify/anomalous.ts';
import { gapEvidence } from '../verify/sheet-verdicts.ts';
import type { ChainView } from '../verify/chain-view.ts';
import type { VerdictPolicy } from '../verify/policy.ts';

export interface EngineIdentity {
  version: string;
  numericsHash: string;
}

export function recordDiagnostic(d: Diagnostic): RecordDiagnostic {
  return { file: d.file, line: d.line, column: d.column, pointer: d.pointer, message: d.message, hint: d.hint ?? null, severity: d.severity };
}

export function modelMetadata(doc: ModelDocument): NonNullable<ModelRecord['model']> {
  return {
    title: doc.title,
    summary: doc.summary,
    description: doc.description ?? null,
    tags: [...(doc.tags ?? [])],
    maintainers: [...doc.maintainers],
    references: (doc.references ?? []).map((r) => ({ doi: r.doi ?? null, arxiv: r.arxiv ?? null, citation: r.citation ?? null, note: r.note ?? null })),
    dates: { created: doc.dates.created, updated: doc.dates.updated ?? null },
    dimension: doc.lattice?.dimension ?? null,
    symmetryClass: doc.claims?.symmetryClass ?? null,
    draft: doc.draft === true,
  };
}

export function parameterRecords(doc: ModelDocument, values: Record<string, number>): ModelRecord['parameters'] {
  return Object.keys(doc.parameters ?? {})
    .sort(compareCodePoints)
    .map((name) => {
      const entry = doc.parameters![name];
      const quantity = typeof entry === 'object' && entry !== null ? entry.value : entry;
      return {
        name,
        value: Object.hasOwn(values, name) ? values[name] : null,
        expression: typeof quantity === 'string' ? quantity : null,
        description: typeof entry === 'object' && entry !== null ? (entry.description ?? null) : null,
      };
    });
}

export function driveSummary(drive: LatticeDrive, nambu: boolean): NonNullable<ModelRecord['drive']> {
  let handedness: 'right' | 'left' | 'n/a' = 'n/a';
  if (drive.dimension === 2) {
    const [a1, a2] = drive.latticeVectors;
    handedness = a1[0] * a2[1] - a1[1] * a2[0] > 0 ? 'right' : 'left';
  }
  return {
    period: drive.period,
    latticeVectors: drive.latticeVectors.map((v) => [...v]),
    handedness,
    states: drive.states.map((s) => s.label),
    nambu,
    segments: drive.segments.map((s) => ({
      label: s.label ?? null,
      duration: s.duration,
      terms: s.terms.length,
      driven: (s.vectorPotential ?? []).some((c) => c.harmonic !== 0) || s.terms.some((t) => t.modulation.kind === 'harmonic'),
    })),
  };
}

/**
 * The analysis part of a chain record. The open-chain spectrum is one row of
 * quasienergies (units π/T, ascending) with each state's weight in the two end
 * regions, as the spectrum plot reads it; at most 400 states are kept (every
 * stride-th) and the end states are always among them.
 */
export function chainAnalysis(view: ChainView, policy: VerdictPolicy): AnalysisRecord {
  const spectra: AnalysisRecord['spectra'] = [];
  if (view.openChain) {
    const chain = view.openChain;
    const order = chain.quasienergies.map((e, i) => [e, i] as const).sort((a, b) => a[0] - b[0]).map(([, i]) => i);
    const stride = Math.max(1, Math.ceil(order.length / 400));
    // States mostly in the end regions are kept whatever the stride: they are what the plot is for.
    const kept = order.filter((i, position) => position % stride === 0 || chain.lowEdgeWeight[i] + chain.highEdgeWeight[i] >= 0.5);
    spectra.push({
      kind: 'open-chain',
      finiteDirection: null,
      width: chain.length,
      momenta: [],
      quasienergies: [kept.map((i) => roundTo(chain.quasienergies[i], 1e-5))],
      lowEdgeWeight: [kept.map((i) => roundTo(chain.lowEdgeWeight[i], 1e-3))],
      highEdgeWeight: [kept.map((i) => roundTo(chain.highEdgeWeight[i], 1e-3))],
      stride,
    });
  }
  const facts: Record<string, number> = {};
  for (const s of view.symmetry) facts[`symmetry: ${s.name}`] = s.residual;
  return {
    kind: 'chain',
    grid: [...view.grid],
    bandPath: null,
    gaps: view.gaps.map((g) => {
      const ev = gapEvidence(view, g.label, policy);
      return { label: g.label, lower: g.lower, upper: g.upper, minimalGap: g.minimalGap, lowerBound: ev.lowerBound, at: [...g.momentumAtMinimum], tolerance: ev.tolerance, open: ev.open };
    }),
    bands: view.bands.map((b) => ({ index: b.index, branches: b.branches, gapBelow: b.gapBelow, gapAbove: b.gapAbove, range: [b.range[0], b.range[1]] })),
    spectra,
    consistency: view.consistency.map((c) => ({ name: c.name, holds: c.holds, inconclusive: c.inconclusive === true, detail: c.detail })),
    propagatorAccuracy: view.propagatorAccuracy,
    facts,
  };
}

export function sheetAnalysis(p: SheetPortrait, policy: VerdictPolicy): AnalysisRecord {
  const spectra: SpectrumRecord[] = p.ribbons.map((r) => {
    const stride = strideFor(r.momenta.length);
    return {
      kind: 'ribbon',
      finiteDirection: r.finiteDirection,
      width: r.width,
      momenta: decimateRows(r.momenta, stride).map((k) => roundTo(k, 1e-6)),
      quasienergies: roundRows(decimateRows(r.quasienergies, stride), 1e-5),
      lowEdgeWeight: roundRows(decimateRows(r.lowEdgeWeight, stride), 1e-3),
      highEdgeWeight: roundRows(decimateRows(r.highEdgeWeight, stride), 1e-3),
      stride,
    };
  });
  return {
    kind: 'sheet',
    grid: [...p.grid],
    bandPath: null,
    gaps: p.gaps.map((g) => {
      const ev = gapEvidence(p, g.label, policy);
      return { label: g.label, lower: g.lower, upper: g.upper, minimalGap: g.minimalGap, lowerBound: ev.lowerBound, at: [...g.momentumAtMinimum], tolerance: ev.tolerance, open: ev.open };
    }),
    bands: p.bands.map((b) => ({ index: b.index, branches: b.branches, gapBelow: b.gapBelow, gapAbove: b.gapAbove, range: [b.range[0], b.range[1]] })),
    spectra,
    consistency: p.consistency.map((c) => ({ name: c.name, holds: c.holds, inconclusive: c.inconclusive === true, detail: c.detail })),
    propagatorAccuracy: p.propagatorAccuracy,
    facts: { gapTolerance: p.gapTolerance, eigenResidual: p.eigenResidual, floquetEvaluations: p.floquetEvaluations, cut: p.cut },
  };
}

/** A record for a model that did not load or compile. */
export function invalidRecord(engine: EngineIdentity, id: string, file: string, diagnostics: Diagnostic[], doc?: ModelDocument): ModelRecord {
  const errors = diagnostics.filter((d) => d.severity === 'error');
  const first = errors[0] ?? diagnostics[0];
  return {
    recordFormat: RECORD_FORMAT,
    engine,
    id,
    file,
    sourceHash: null,
    status: 'invalid',
    statusReason: first ? `${first.file}:${first.line}:${first.column} ${first.message}` : 'the file did not load',
    model: doc ? safeMetadata(doc) : null,
    parameters: [],
    drive: null,
    analysis: null,
    claims: [],
    counts: { confirmed: 0, contradicted: 0, unsettled: 0 },
    portrait: [],
    anomalous: { classification: 'undetermined', reason: 'the model is invalid', definition: ANOMALOUS_DEFINITION },
    sweeps: [],
    diagnostics: diagnostics.map(recordDiagnostic),
    incident: null,
    budget: null,
  };
}

/** A record for a model whose computation did not finish. */
export function failedRecord(engine: EngineIdentity, loaded: LoadedModel, kind: IncidentKind, message: string, diagnostics: Diagnostic[] = []): ModelRecord {
  return {
    ...invalidRecord(engine, loaded.id, loaded.file, [...diagnostics, ...loaded.warnings], loaded.document),
    sourceHash: loaded.sourceHash,
    status: 'failed',
    statusReason: message,
    parameters: parameterRecords(loaded.document, loaded.parameters),
    anomalous: { classification: 'undetermined', reason: 'the computation did not finish', definition: ANOMALOUS_DEFINITION },
    incident: { kind, message },
  };
}

function safeMetadata(doc: ModelDocument): ModelRecord['model'] {
  try {
    return modelMetadata(doc);
  } catch {
    return null;
  }
}

export { RECORD_FORMAT };
