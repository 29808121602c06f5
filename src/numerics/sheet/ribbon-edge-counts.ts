/**
 * Edge counts of one ribbon direction, on a ribbon as wide as the physics
 * asks for.
 *
 * Width. Edge states of a gap decay over ξ cells (the bulk estimate v/(πΔ) of
 * sheet-analysis.ts, or the decay fitted on the crossing states); a count is
 * only settled on a ribbon at least widthPerDecayLength (6) times ξ wide
 * (edge-modes.ts). The ribbon starts at the width asked for (default 24 cells)
 * and, while a count is unsettled because ξ asks for more (the decay fitted on
 * the crossing states, or the bulk estimate when nothing crosses), is widened
 * to WIDTH_MARGIN·6·ξ, at most MAX_WIDENINGS times and never beyond the width
 * budget (default DEFAULT_RIBBON_STATES states). Only the gaps in `widenFor`
 * (default: every gap) may widen the ribbon: a portrait nobody claims an edge
 * count of keeps the starting width, since near a transition ξ is large and
 * the widest ribbon costs minutes for a count no verdict reads. The bulk estimate is not used
 * to widen in advance: it is taken where the gap is smallest, and the states
 * that cross the label often decay much faster. Every width tried is
 * reported, and a count still too narrow at the budget says so.
 *
 * Route. Ribbons of at most `denseStates` states take the dense route (every
 * state at every momentum, ribbon.ts + edge-modes.ts); wider ones the banded
 * route (only the states near each gap label, banded-edge-counts.ts). Both
 * follow the same rules and give the same counts on the same ribbon (tested
 * on every test model). The spectrum kept for plots is that of the counted
 * ribbon on the dense route, else of a ribbon PLOT_STATES states wide.
 */
import type { LatticeDrive } from '../evolution/drive.ts';
import type { PropagatorOptions } from '../evolution/propagator.ts';
import type { EdgeCountReport, RibbonReport, RibbonSpectrumReport } from '../portrait.ts';
import { quasienergyVelocityBound } from '../evolution/velocity-bound.ts';
import type { EdgeCountOptions, GapArc } from './edge-modes.ts';
import { countEdgeModes } from './edge-modes.ts';
import type { RibbonSpectrum } from './ribbon.ts';
import { DEFAULT_RIBBON_MOMENTA, DEFAULT_RIBBON_WIDTH, ribbonSpectrum, staticSegmentIndex } from './ribbon.ts';
import { floquetWindows, staticWindows } from './ribbon-windows.ts';
import { truncateDrive } from '../supercell.ts';
import { openBandedFloquet } from '../evolution/banded-propagator.ts';
import { bandedEdgeCounts } from './banded-edge-counts.ts';

/** Default width budget in states (cells × orbitals per cell). */
export const DEFAULT_RIBBON_STATES = 16000;
/** Ribbons up to this many states take the dense route by default. */
export const DEFAULT_DENSE_STATES = 240;
/** A widened ribbon is this much wider than widthPerDecayLength·ξ. */
export const WIDTH_MARGIN = 1.25;
export const MAX_WIDENINGS = 3;
/** Momenta and size (states) of the plotted spectrum of a ribbon counted on the banded route. */
export const PLOT_MOMENTA = 64;
export const PLOT_STATES = 120;
/** Gap labels closer than this (units π/T) name the same gap. */
const LABEL_MATCH = 1e-9;
/** Largest accepted residual of the eigenpairs near a label (banded route). */
const WINDOW_TOLERANCE = 1e-10;

export interface RibbonGap {
  arc: GapArc;
  /** Bulk estimate of the decay length of edge states in this gap (cells). */
  bulkDecayLength: number;
}

export interface RibbonCountOptions {
  finiteDirection: number;
  /** Starting width in cells (default 24); the engine widens from here when the decay length asks for it. */
  width?: number;
  /** Largest width the engine widens to (default DEFAULT_RIBBON_STATES / orbitals per cell). */
  maxWidth?: number;
  /** Gap labels (units π/T) whose unsettled counts may widen the ribbon (default: every gap). */
  widenFor?: number[];
  /** Cells per edge region (default ⌊width/4⌋). */
  edgeCells?: number;
  /** Momenta of the dense route (default 200); least base momenta of the banded route. */
  momenta?: number;
  /** Ribbons with at most this many states take the dense route (default 240). */
  denseStates?: number;
  propagator?: PropagatorOptions;
  edges?: EdgeCountOptions;
}

function plotSpectrum(r: RibbonSpectrum): RibbonSpectrumReport {
  return {
    width: r.width,
    edgeCells: r.edgeCells,
    momenta: r.momenta,
    quasienergies: r.samples.map((s) => Array.from(s.quasienergies)),
    lowEdgeWeight: r.lowEdgeWeight,
    highEdgeWeight: r.highEdgeWeight,
    localisationCells: r.localisationCells,
    uniformWeight: r.uniformWeight,
    lowLocalisation: r.lowLocalisation,
    highLocalisation: r.highLocalisation,
  };
}

interface Attempt {
  width: number;
  edgeCells: number;
  route: 'dense' | 'banded';
  momenta: number;
  truncation: number;
  counts: EdgeCountReport[];
  spectrum: RibbonSpectrum | null;
}

export function ribbonEdgeCounts(drive: LatticeDrive, gaps: RibbonGap[], options: RibbonCountOptions): RibbonReport {
  const f = options.finiteDirection;
  const orbitals = drive.states.length;
  const ratio = options.edges?.widthPerDecayLength ?? 6;
  const denseStates = options.denseStates ?? DEFAULT_DENSE_STATES;
  const budget = Math.max(2, options.maxWidth ?? Math.floor(DEFAULT_RIBBON_STATES / orbitals));
  const start = options.width ?? DEFAULT_RIBBON_WIDTH;
  const finite = gaps.map((g) => g.bulkDecayLength).filter((x) => Number.isFinite(x));
  const bulkXi = finite.length > 0 ? Math.max(...finite) : 0;
  const wanted = (xi: number) => Math.ceil(WIDTH_MARGIN * ratio * xi);
  // Start where the caller asked; widen when a count shows it is needed.
  let width = start;
  const widths: number[] = [];
  let attempt: Attempt;
  for (let round = 0; ; round++) {
    widths.push(width);
    attempt = countAt(drive, gaps, width, options, denseStates);
    // An unsettled count asks for ξ = the larger of the fitted decay and its gap's bulk estimate (states that do
    // not localise on a narrow ribbon, or hybridise across it, are the usual symptom of too narrow a ribbon).
    const demand = (c: EdgeCountReport) => Math.max(Number.isFinite(c.decayLength) ? c.decayLength : 0, gaps.find((g) => g.arc.label === c.gap)?.bulkDecayLength ?? 0);
    const widens = (c: EdgeCountReport) => options.widenFor === undefined || options.widenFor.some((label) => Math.abs(label - c.gap) < LABEL_MATCH);
    const needed = Math.max(0, ...attempt.counts.filter((c) => widens(c) && !c.settled && Number.isFinite(demand(c)) && width < ratio * demand(c)).map((c) => wanted(demand(c))));
    const next = Math.min(budget, needed);
    if (needed === 0 || next <= width || round >= MAX_WIDENINGS) {
      if (needed > width) {
        for (const c of attempt.counts) {
          if (widens(c) && !c.settled && width < ratio * demand(c)) {
            c.reason = `${c.reason ?? 'unsettled'}; the width budget (${budget} cells) allows no wider ribbon: raise numerics.ribbon.maxWidth`;
          }
        }
      }
      break;
    }
    width = next;
  }
  const spectrum = attempt.spectrum ?? ribbonSpectrum(drive, {
    finiteDirection: f,
    width: Math.min(attempt.width, Math.max(2, Math.floor(PLOT_STATES / orbitals))),
    momenta: PLOT_MOMENTA,
    propagator: options.propagator,
    decayLength: bulkXi,
  });
  return {
    finiteDirection: f,
    width: attempt.width,
    widths,
    widthBudget: budget,
    edgeCells: attempt.edgeCells,
    route: attempt.route,
    momenta: attempt.momenta,
    truncation: attempt.truncation,
    counts: attempt.counts,
    spectrum: plotSpectrum(spectrum),
  };
}

function countAt(drive: LatticeDrive, gaps: RibbonGap[], width: number, options: RibbonCountOptions, denseStates: number): Attempt {
  const f = options.finiteDirection;
  const orbitals = drive.states.length;
  const edgeCells = options.edgeCells !== undefined && 2 * options.edgeCells <= width ? options.edgeCells : Math.max(1, Math.floor(width / 4));
  const bulkXi = Math.max(0, ...gaps.map((g) => g.bulkDecayLength).filter((x) => Number.isFinite(x)));
  if (width * orbitals <= denseStates) {
    const momenta = options.momenta ?? DEFAULT_RIBBON_MOMENTA;
    const spectrum = ribbonSpectrum(drive, { finiteDirection: f, width, edgeCells, momenta, propagator: options.propagator, decayLength: bulkXi });
    const counts = gaps.flatMap((g) => countEdgeModes(spectrum, g.arc, g.bulkDecayLength, options.edges));
    return { width, edgeCells, route: 'dense', momenta, truncation: spectrum.truncation, counts, spectrum };
  }
  const ribbon = truncateDrive(drive, f, width);
  const staticIndex = staticSegmentIndex(ribbon);
  const source = staticIndex >= 0 ? staticWindows(ribbon, staticIndex, WINDOW_TOLERANCE) : floquetWindows(openBandedFloquet(drive, f, width, options.propagator), WINDOW_TOLERANCE);
  const results = bandedEdgeCounts(
    source,
    gaps.map((g) => ({ arc: g.arc, bulkDecayLength: g.bulkDecayLength })),
    {
      ...options.edges,
      width,
      edgeCells,
      orbitalsPerCell: orbitals,
      velocityBound: quasienergyVelocityBound(drive, 1 - f),
      ...(options.momenta !== undefined ? { minMomenta: Math.min(options.momenta, 64) } : {}),
    },
  );
  const counts = results.flatMap((r) => r.reports.map((c) => ({ ...c, momentaEvaluated: r.momenta, window: r.window, errorBound: r.largestError })));
  return { width, edgeCells, route: 'banded', momenta: results[0]?.baseMomenta ?? 0, truncation: Math.max(0, ...results.map((r) => r.largestTruncation)), counts, spectrum: null };
}
