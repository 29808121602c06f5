/**
 * Sweep records shaped for phase diagrams: which integer quantities make up
 * the tuple that names a phase ((ν₀, ν_π) for chains, (W₀, W_π) for sheets,
 * else the Chern numbers), the smallest-gap series, axis symbols, and where
 * the model itself sits in the scanned plane.
 */
import type { ModelRecord, SweepRecord } from '../catalogue/records/model-record.ts';
import { quantityName, type QuantityName } from '../catalogue/vocabulary.ts';
import { gapOrder } from './invariants.ts';
import { parameterSymbol } from './symbols.ts';

export interface SweepAxisData {
  parameter: string;
  /** θ₁, J, Δ. */
  symbol: string;
  description: string | null;
  values: number[];
}

export interface Series {
  id: string;
  name: QuantityName;
  /** Value per grid point (first axis fastest); null = unsettled. */
  values: (number | null)[];
}

export interface SweepData {
  name: string;
  title: string;
  axes: SweepAxisData[];
  /** Integer quantities that name a phase, in reading order. */
  tuple: Series[];
  /** Other integer quantities (Chern numbers beside windings), shown in 1D step plots. */
  others: Series[];
  /** Smallest-gap series (units π/T). */
  gaps: Series[];
  /** The model's own parameter values on the axes, when it lies inside the scanned range. */
  modelPoint: number[] | null;
  /** Grid points that could not be computed, with the reason. */
  errors: { where: string; error: string }[];
}

const FAMILY_RANK: Record<string, number> = { 'chain-invariant': 0, winding: 1, chern: 2 };

function seriesOrder(a: Series, b: Series): number {
  if (a.name.gap !== null && b.name.gap !== null) return gapOrder(a.name.gap, b.name.gap);
  return a.id.localeCompare(b.id, 'en', { numeric: true });
}

export function sweepData(sweep: SweepRecord, record: Pick<ModelRecord, 'parameters' | 'model'>): SweepData {
  const ids = [...new Set(sweep.points.flatMap((p) => Object.keys(p.values)))];
  const context = { symmetryClass: record.model?.symmetryClass ?? null };
  const series: Series[] = ids.map((id) => ({ id, name: quantityName(id, context), values: sweep.points.map((p) => p.values[id] ?? null) }));
  const integers = series.filter((s) => s.name.family in FAMILY_RANK);
  const best = Math.min(...integers.map((s) => FAMILY_RANK[s.name.family]));
  const tuple = integers.filter((s) => FAMILY_RANK[s.name.family] === best).sort(seriesOrder);
  const others = integers.filter((s) => FAMILY_RANK[s.name.family] !== best).sort(seriesOrder);
  const gaps = series.filter((s) => s.name.family === 'minimal-gap').sort(seriesOrder);
  const axes = sweep.axes.map((a) => {
    const p = record.parameters.find((q) => q.name === a.parameter);
    return { parameter: a.parameter, symbol: parameterSymbol(a.parameter), description: p?.description ?? null, values: a.values };
  });
  const own = axes.map((a) => record.parameters.find((q) => q.name === a.parameter)?.value ?? null);
  const inside = own.every((v, i) => {
    if (v === null) return false;
    const vs = axes[i].values;
    const lo = Math.min(...vs), hi = Math.max(...vs);
    return v >= lo - 1e-9 * Math.abs(hi - lo) && v <= hi + 1e-9 * Math.abs(hi - lo);
  });
  const errors = sweep.points
    .filter((p) => p.error !== null)
    .map((p) => ({ where: Object.entries(p.parameters).map(([k, v]) => `${parameterSymbol(k)} = ${Number(v.toPrecision(4))}`).join(', '), error: p.error! }));
  return {
    name: sweep.name,
    title: sweep.title ?? sweep.name,
    axes,
    tuple,
    others,
    gaps,
    modelPoint: inside ? (own as number[]) : null,
    errors,
  };
}

/** The tuple of a grid point as text, "(1, −1)", or null when any member is unsettled. */
export function tupleKey(tuple: Series[], index: number): string | null {
  const values = tuple.map((s) => s.values[index]);
  if (values.some((v) => v === null || v === undefined)) return null;
  const text = values.map((v) => String(v).replace('-', '−'));
  return tuple.length === 1 ? text[0] : `(${text.join(', ')})`;
}

/** The tuple's symbols as text: "(ν_0, ν_π)" or "W_π". */
export function tupleName(tuple: Series[]): string {
  const symbols = tuple.map((s) => s.name.symbol ?? s.name.words);
  return symbols.length === 1 ? symbols[0] : `(${symbols.join(', ')})`;
}

/**
 * The sweep on a coarser grid: every k-th value along each axis (the last
 * always kept), for drawing a very fine scan within a page's budget.
 */
export function thinned(data: SweepData, k: number): SweepData {
  if (k <= 1) return data;
  const keep = (n: number) => Array.from({ length: n }, (_, i) => i).filter((i) => i % k === 0 || i === n - 1);
  const [ax, ay] = data.axes;
  const xs = keep(ax.values.length);
  const ys = ay ? keep(ay.values.length) : [0];
  const indices = ys.flatMap((j) => xs.map((i) => j * ax.values.length + i));
  const pick = (series: Series[]) => series.map((s) => ({ ...s, values: indices.map((i) => s.values[i]) }));
  return {
    ...data,
    axes: data.axes.map((a, d) => ({ ...a, values: (d === 0 ? xs : ys).map((i) => a.values[i]) })),
    tuple: pick(data.tuple),
    others: pick(data.others),
    gaps: pick(data.gaps),
  };
}
