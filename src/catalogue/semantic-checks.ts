/**
 * Checks beyond the schema: everything that needs more than one field at a time
 * (orbital names, offsets against the dimension, durations against the period,
 * symmetry operators against the basis, the handedness of the lattice basis,
 * which only warns)
 * and every expression evaluated against the parameters.
 */
import type { Amplitude, MatrixEntry, ModelDocument, Modulation, Quantity } from './model-types.generated.ts';
import { joinPointer, suggestName, type Issue } from './diagnostics.ts';
import { evaluateQuantity, isIssue, quantityReferences, parameterQuantity } from './parameters.ts';

/** Durations must sum to the period within this relative tolerance: |Σ τ − T| ≤ 1e-9 · T. */
export const PERIOD_SUM_TOLERANCE = 1e-9;
/** Symmetry operators must be unitary: max |(M M†)_{ij} − δ_ij| ≤ 1e-9. */
export const UNITARITY_TOLERANCE = 1e-9;
/** A 2D basis counts as degenerate when |a1 × a2| ≤ 1e-12 · |a1| |a2|. */
export const DEGENERATE_BASIS_TOLERANCE = 1e-12;

export interface SemanticResult {
  issues: Issue[];
  /** Names of parameters referenced anywhere outside the parameter table. */
  usedParameters: Set<string>;
}

/**
 * Runs every cross-field check on a schema-valid document. `values` holds the
 * evaluated parameters; `declared` all declared parameter names (some may have
 * failed to evaluate: expressions using them are skipped, the failure is
 * already reported).
 */
export function checkSemantics(doc: ModelDocument, values: ReadonlyMap<string, number>, declared: ReadonlySet<string>): SemanticResult {
  const issues: Issue[] = [];
  const used = new Set<string>();
  const dim = doc.lattice.dimension;

  /** Evaluates a quantity; reports problems; returns undefined when it cannot be evaluated. */
  const num = (q: Quantity, pointer: string): number | undefined => {
    const refs = quantityReferences(q);
    for (const r of refs) used.add(r);
    if (refs.some((r) => declared.has(r) && !values.has(r))) return undefined;
    const v = evaluateQuantity(q, values, pointer);
    if (isIssue(v)) {
      issues.push(v);
      return undefined;
    }
    return v;
  };
  const amplitude = (a: Amplitude, pointer: string): void => {
    if (typeof a === 'object') {
      if ('magnitude' in a) {
        num(a.magnitude, joinPointer(pointer, 'magnitude'));
        num(a.phase, joinPointer(pointer, 'phase'));
      } else {
        num(a.re, joinPointer(pointer, 're'));
        num(a.im, joinPointer(pointer, 'im'));
      }
    } else num(a, pointer);
  };
  const countOf = (list: readonly unknown[], pointer: string, what: string): void => {
    if (list.length !== dim) issues.push({ pointer, message: `${what} has ${list.length} component${list.length === 1 ? '' : 's'}; a ${dim}D lattice needs ${dim}` });
  };

  // Lattice: vectors, positions, names, handedness.
  const vectors: number[][] = [];
  if (doc.lattice.vectors.length !== dim) {
    issues.push({ pointer: '/lattice/vectors', message: `${doc.lattice.vectors.length} lattice vector${doc.lattice.vectors.length === 1 ? '' : 's'} given; a ${dim}D lattice needs ${dim}` });
  }
  doc.lattice.vectors.forEach((v, i) => {
    const p = joinPointer('/lattice/vectors', i);
    countOf(v, p, `lattice vector a${i + 1}`);
    vectors.push(v.map((c, j) => num(c, joinPointer(p, j)) ?? NaN));
  });
  if (dim === 2 && vectors.length === 2 && vectors.every((v) => v.length === 2 && v.every(Number.isFinite))) {
    const [a1, a2] = vectors;
    const cross = a1[0] * a2[1] - a1[1] * a2[0];
    const scale = Math.hypot(...a1) * Math.hypot(...a2);
    if (Math.abs(cross) <= DEGENERATE_BASIS_TOLERANCE * scale) {
      issues.push({ pointer: '/lattice/vectors', message: 'lattice vectors a1 and a2 are parallel (a1 × a2 = 0)', hint: 'give two independent vectors' });
    } else if (cross < 0) {
      // Not an error: the engine multiplies C and W by o = sign det(a₁, a₂), so the physics does not
      // depend on the handedness (docs/conventions.md, Orientation); edge names do, hence the warning.
      issues.push({
        pointer: '/lattice/vectors',
        severity: 'warning',
        message: 'left-handed basis (a₁, a₂): Chern and winding numbers are reported in the Cartesian orientation; edge counts are named by the lattice vectors, so their signs follow the table in docs/conventions.md',
        hint: `a₁ × a₂ = ${formatNumber(cross)} < 0; nothing to fix if intended, or swap a₁ and a₂ (with the offset components, edge names and sweep axes that refer to them) for a right-handed basis`,
      });
    }
  }
  const orbitalNames = doc.lattice.orbitals.map((o) => o.name);
  doc.lattice.orbitals.forEach((o, i) => {
    const p = joinPointer('/lattice/orbitals', i);
    const first = orbitalNames.indexOf(o.name);
    if (first !== i) issues.push({ pointer: joinPointer(p, 'name'), message: `orbital name "${o.name}" is already used by orbital ${first}`, hint: 'orbital names must be unique within the cell' });
    countOf(o.position, joinPointer(p, 'position'), `position of orbital "${o.name}"`);
    o.position.forEach((c, j) => num(c, joinPointer(p, 'position', j)));
  });
  const orbital = (name: string, pointer: string): void => {
    if (!orbitalNames.includes(name)) {
      const close = suggestName(name, orbitalNames, 'orbitals');
      issues.push({ pointer, message: `no orbital "${name}"; orbitals are ${orbitalNames.join(', ')}`, hint: close.startsWith('did you mean') ? close : undefined });
    }
  };
  const modulation = (m: Modulation | undefined, pointer: string): void => {
    if (!m || m.kind !== 'harmonic') return;
    if (m.mean !== undefined) num(m.mean, joinPointer(pointer, 'mean'));
    m.components.forEach((c, i) => {
      num(c.amplitude, joinPointer(pointer, 'components', i, 'amplitude'));
      if (c.phase !== undefined) num(c.phase, joinPointer(pointer, 'components', i, 'phase'));
    });
  };

  // Drive: period, durations, terms.
  const period = num(doc.drive.period, '/drive/period');
  if (period !== undefined && period <= 0) issues.push({ pointer: '/drive/period', message: `the period must be > 0; found ${formatNumber(period)}` });
  let total = 0;
  let durationsKnown = true;
  doc.drive.segments.forEach((segment, s) => {
    const sp = joinPointer('/drive/segments', s);
    const tau = num(segment.duration, joinPointer(sp, 'duration'));
    if (tau === undefined) durationsKnown = false;
    else if (tau < 0) {
      issues.push({ pointer: joinPointer(sp, 'duration'), message: `duration must be ≥ 0; found ${formatNumber(tau)}` });
      durationsKnown = false;
    } else total += tau;
    segment.onsite?.forEach((term, i) => {
      const p = joinPointer(sp, 'onsite', i);
      orbital(term.orbital, joinPointer(p, 'orbital'));
      num(term.energy, joinPointer(p, 'energy'));
      modulation(term.modulation, joinPointer(p, 'modulation'));
    });
    for (const kind of ['hoppings', 'pairings'] as const) {
      segment[kind]?.forEach((term, i) => {
        const p = joinPointer(sp, kind, i);
        orbital(term.from, joinPointer(p, 'from'));
        orbital(term.to, joinPointer(p, 'to'));
        countOf(term.offset, joinPointer(p, 'offset'), 'offset');
        amplitude(term.amplitude, joinPointer(p, 'amplitude'));
        modulation(term.modulation, joinPointer(p, 'modulation'));
        if (term.from === term.to && term.offset.every((n) => n === 0)) {
          issues.push(
            kind === 'hoppings'
              ? { pointer: p, message: `hopping from "${term.from}" to itself in the same cell`, hint: 'write an onsite term instead (a hopping would be doubled by its Hermitian conjugate)' }
              : { pointer: p, message: `pairing of "${term.from}" with itself in the same cell vanishes (c†c† = 0 for one fermion mode)`, hint: 'pair different orbitals or neighbouring cells' },
          );
        }
      });
    }
    segment.vectorPotential?.forEach((component, i) => {
      const p = joinPointer(sp, 'vectorPotential', i);
      countOf(component.amplitude, joinPointer(p, 'amplitude'), 'vector potential amplitude');
      component.amplitude.forEach((c, j) => num(c, joinPointer(p, 'amplitude', j)));
      if (component.phase !== undefined) num(component.phase, joinPointer(p, 'phase'));
    });
  });
  if (period !== undefined && period > 0 && durationsKnown && Math.abs(total - period) > PERIOD_SUM_TOLERANCE * period) {
    issues.push({
      pointer: '/drive/segments',
      message: `segment durations sum to ${formatNumber(total)} but the period is ${formatNumber(period)} (tolerance 1e-9·T)`,
      hint: 'make the durations add up to the period, e.g. write them as fractions of T',
    });
  }

  // Claims.
  const nambu = doc.drive.segments.some((s) => (s.pairings?.length ?? 0) > 0);
  const basisSize = orbitalNames.length * (nambu ? 2 : 1);
  const symmetries = doc.claims.symmetries;
  const matrix = (m: MatrixEntry[][], pointer: string, what: string): void => {
    if (m.length !== basisSize || m.some((row) => row.length !== basisSize)) {
      const shape = `${m.length}×${m.every((r) => r.length === m[0].length) ? m[0].length : '?'}`;
      issues.push({ pointer, message: `${what} is ${shape} but the basis has ${basisSize} states${nambu ? ` (${orbitalNames.length} orbitals × particle/hole)` : ''}`, hint: `give a ${basisSize}×${basisSize} matrix` });
      return;
    }
    const re: number[] = [];
    const im: number[] = [];
    let ok = true;
    m.forEach((row, i) =>
      row.forEach((entry, j) => {
        const p = joinPointer(pointer, i, j);
        const [r, c] = Array.isArray(entry) ? [num(entry[0], joinPointer(p, 0)), num(entry[1], joinPointer(p, 1))] : [num(entry, p), 0];
        if (r === undefined || c === undefined) ok = false;
        re.push(r ?? NaN);
        im.push(c ?? NaN);
      }),
    );
    if (!ok) return;
    const deviation = unitarityDeviation(re, im, basisSize);
    if (deviation > UNITARITY_TOLERANCE) {
      issues.push({ pointer, message: `${what} is not unitary: max |(M M†)ij − δij| = ${deviation.toExponential(2)} > ${UNITARITY_TOLERANCE}`, hint: 'check signs and normalisation (entries like 1/sqrt(2))' });
    }
  };
  if (symmetries?.chiral) {
    matrix(symmetries.chiral.operator, '/claims/symmetries/chiral/operator', 'the chiral operator');
    symmetries.chiral.symmetricTimes?.forEach((t, i) => {
      const p = joinPointer('/claims/symmetries/chiral/symmetricTimes', i);
      const v = num(t, p);
      if (v !== undefined && period !== undefined && (v < 0 || v >= period)) issues.push({ pointer: p, message: `symmetric time ${formatNumber(v)} lies outside [0, T) with T = ${formatNumber(period)}` });
    });
  }
  if (symmetries?.particleHole) matrix(symmetries.particleHole.unitary, '/claims/symmetries/particleHole/unitary', 'the particle-hole unitary');
  if (symmetries?.timeReversal) matrix(symmetries.timeReversal.unitary, '/claims/symmetries/timeReversal/unitary', 'the time-reversal unitary');

  const labels = new Map<number, number>();
  doc.claims.gaps?.forEach((gap, i) => {
    const p = joinPointer('/claims/gaps', i);
    const label = num(gap.quasienergy, joinPointer(p, 'quasienergy'));
    if (label !== undefined) {
      if (label <= -1 || label > 1) issues.push({ pointer: joinPointer(p, 'quasienergy'), message: `gap label ${formatNumber(label)} is outside (−1, 1] (units of π/T)`, hint: 'use 1 for the gap at π/T and 0 for the gap at zero quasienergy' });
      const previous = labels.get(label);
      if (previous !== undefined) issues.push({ pointer: joinPointer(p, 'quasienergy'), message: `gap ${formatNumber(label)} is already claimed in /claims/gaps/${previous}`, hint: 'merge the two entries' });
      labels.set(label, i);
    }
    const wrongDim = dim === 1 ? (['winding', 'edgeModes'] as const) : (['invariant', 'endModes'] as const);
    for (const field of wrongDim) {
      if (gap[field] !== undefined) {
        issues.push({ pointer: joinPointer(p, field), target: 'key', message: `"${field}" applies to ${dim === 1 ? '2D sheets' : '1D chains'}, not to this ${dim}D model`, hint: dim === 1 ? 'use "invariant" and "endModes" for chains' : 'use "winding" and "edgeModes" for sheets' });
      }
    }
    gap.edgeModes?.forEach((e, j) => {
      if (e.finiteAlong >= dim) issues.push({ pointer: joinPointer(p, 'edgeModes', j, 'finiteAlong'), message: `finiteAlong ${e.finiteAlong} needs a lattice vector a${e.finiteAlong + 1}` });
    });
    if (gap.invariant !== undefined && doc.claims.symmetryClass === 'D' && gap.invariant !== 0 && gap.invariant !== 1) {
      issues.push({ pointer: joinPointer(p, 'invariant'), message: `class D invariants are Z2 (0 or 1); found ${gap.invariant}` });
    }
  });
  if (doc.claims.bands) {
    if (dim !== 2) issues.push({ pointer: '/claims/bands', target: 'key', message: 'Chern numbers need a 2D lattice', hint: 'remove "bands" or make the lattice 2D' });
    const cut = num(doc.claims.bands.cut, '/claims/bands/cut');
    if (cut !== undefined && (cut <= -1 || cut > 1)) issues.push({ pointer: '/claims/bands/cut', message: `cut ${formatNumber(cut)} is outside (−1, 1] (units of π/T)` });
    if (doc.claims.bands.chern.length > basisSize) issues.push({ pointer: '/claims/bands/chern', message: `${doc.claims.bands.chern.length} bands claimed but the model has ${basisSize}` });
  }

  // Numerics hints.
  if (doc.numerics?.kGrid) countOf(doc.numerics.kGrid, '/numerics/kGrid', 'kGrid');
  if (doc.numerics?.ribbon && dim !== 2) issues.push({ pointer: '/numerics/ribbon', target: 'key', message: 'ribbon hints apply to 2D sheets only' });
  if (doc.numerics?.chainLength !== undefined && dim !== 1) issues.push({ pointer: '/numerics/chainLength', target: 'key', message: 'chainLength applies to 1D chains only' });
  if (doc.numerics?.maxChainLength !== undefined && dim !== 1) issues.push({ pointer: '/numerics/maxChainLength', target: 'key', message: 'maxChainLength applies to 1D chains only' });
  const ribbon = doc.numerics?.ribbon;
  if (ribbon?.width !== undefined && ribbon.maxWidth !== undefined && ribbon.width > ribbon.maxWidth) {
    issues.push({ pointer: '/numerics/ribbon/width', message: `the starting width ${ribbon.width} exceeds the width budget maxWidth ${ribbon.maxWidth}`, hint: 'raise maxWidth or lower width' });
  }

  // Sweeps.
  const sweepNames = new Set<string>();
  doc.sweeps?.forEach((sweep, i) => {
    const p = joinPointer('/sweeps', i);
    if (sweepNames.has(sweep.name)) issues.push({ pointer: joinPointer(p, 'name'), message: `sweep name "${sweep.name}" is used twice` });
    sweepNames.add(sweep.name);
    sweep.axes.forEach((axis, j) => {
      const ap = joinPointer(p, 'axes', j);
      used.add(axis.parameter);
      if (!declared.has(axis.parameter)) issues.push({ pointer: joinPointer(ap, 'parameter'), message: `no parameter "${axis.parameter}" to sweep`, hint: suggestName(axis.parameter, [...declared], 'parameters') });
      num(axis.start, joinPointer(ap, 'start'));
      num(axis.stop, joinPointer(ap, 'stop'));
    });
    if (sweep.axes.length === 2 && sweep.axes[0].parameter === sweep.axes[1].parameter) issues.push({ pointer: joinPointer(p, 'axes', 1, 'parameter'), message: `both axes sweep "${sweep.axes[0].parameter}"` });
    if (dim === 1 && (sweep.quantities.includes('chern') || sweep.quantities.includes('winding'))) issues.push({ pointer: joinPointer(p, 'quantities'), message: 'chern and winding maps need a 2D lattice', hint: 'map "invariant" for chains' });
    if (dim === 2 && sweep.quantities.includes('invariant')) issues.push({ pointer: joinPointer(p, 'quantities'), message: '"invariant" maps are for 1D chains', hint: 'map "winding" or "chern" for sheets' });
  });

  // Dates.
  if (doc.dates.updated !== undefined && doc.dates.updated < doc.dates.created) {
    issues.push({ pointer: '/dates/updated', message: `updated (${doc.dates.updated}) precedes created (${doc.dates.created})` });
  }

  // Parameters referenced from other parameters count as used too.
  for (const [name, entry] of Object.entries(doc.parameters ?? {})) {
    if (entry === undefined) continue;
    for (const r of quantityReferences(parameterQuantity(entry, '').quantity)) if (r !== name) used.add(r);
  }
  return { issues: issues.map((i) => (i.hint === undefined ? withoutHint(i) : i)), usedParameters: used };
}

function withoutHint(issue: Issue): Issue {
  const { hint: _hint, ...rest } = issue;
  return rest;
}

/** max |(M M†)_{ij} − δ_ij| for an n×n matrix in split row-major storage. */
export function unitarityDeviation(re: readonly number[], im: readonly number[], n: number): number {
  let worst = 0;
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      let sr = 0;
      let si = 0;
      for (let k = 0; k < n; k++) {
        // (M M†)_{ij} = Σ_k M_ik conj(M_jk)
        sr += re[i * n + k] * re[j * n + k] + im[i * n + k] * im[j * n + k];
        si += im[i * n + k] * re[j * n + k] - re[i * n + k] * im[j * n + k];
      }
      worst = Math.max(worst, Math.hypot(sr - (i === j ? 1 : 0), si));
    }
  }
  return worst;
}

/** Numbers in messages: up to 6 significant digits. */
export function formatNumber(x: number): string {
  return Number.isInteger(x) ? String(x) : String(Number(x.toPrecision(6)));
}
