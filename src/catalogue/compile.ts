/**
 * Compiles a loaded model into the numerics-side drive (src/numerics/drive.ts):
 * parameters evaluated (optionally with overrides, as sweeps need), orbitals
 * resolved to indices, amplitudes made complex, sin components rewritten as
 * cos with phase − π/2, symmetry operators turned into complex matrices.
 */
import type { Amplitude, MatrixEntry, ModelDocument, Modulation as ModulationSpec, Quantity } from './model-types.generated.ts';
import type { DriveSegment, DriveTerm, LatticeDrive, Modulation, VectorPotentialComponent } from '../numerics/evolution/drive.ts';
import { zeros, type Complex, type ComplexMatrix } from '../numerics/linalg/complex-matrix.ts';
import { NambuInputError, nambuDrive, type PairingTerm } from '../numerics/evolution/bdg.ts';
import { joinPointer, type Issue } from './diagnostics.ts';
import { evaluateParameters, evaluateQuantity, isIssue } from './parameters.ts';
import { checkSemantics } from './semantic-checks.ts';
import type { LoadedModel } from './load.ts';

export interface CompiledModel {
  drive: LatticeDrive;
  symmetries: {
    chiral?: ComplexMatrix;
    /** The chiral claim's symmetricTimes, evaluated at these parameters, in the file's order. */
    chiralTimes?: number[];
    particleHole?: { unitary: ComplexMatrix; antiunitary: boolean };
    timeReversal?: { unitary: ComplexMatrix; antiunitary: boolean };
  };
  /** True when the model has pairing terms and the drive acts on Nambu components. */
  nambu: boolean;
}

/** The model cannot be compiled at these parameter values (e.g. an override makes a duration negative). */
export class CompileError extends Error {
  constructor(
    readonly modelId: string,
    readonly issues: Issue[],
  ) {
    super(`cannot compile ${modelId}: ${issues.map((i) => `${i.pointer} ${i.message}`).join('; ')}`);
    this.name = 'CompileError';
  }
}


export function compileModel(model: LoadedModel, overrides?: Record<string, number>): CompiledModel {
  const doc = model.document;
  let values: Map<string, number>;
  if (overrides && Object.keys(overrides).length > 0) {
    const declared = Object.keys(doc.parameters ?? {});
    const unknown = Object.keys(overrides).filter((name) => !declared.includes(name));
    if (unknown.length > 0) {
      throw new CompileError(model.id, unknown.map((name) => ({ pointer: '/parameters', message: `override of unknown parameter "${name}"; parameters are ${declared.join(', ') || '(none)'}` })));
    }
    const table = evaluateParameters(doc.parameters, overrides);
    // Overrides can break what held at the stored point (durations, unitarity, …): check again.
    const issues = [...table.issues, ...checkSemantics(doc, table.values, new Set(declared)).issues];
    if (issues.length > 0) throw new CompileError(model.id, issues);
    values = table.values;
  } else values = new Map(Object.entries(model.parameters));

  const problems: Issue[] = [];
  const num = (q: Quantity, pointer: string): number => {
    const v = evaluateQuantity(q, values, pointer);
    if (isIssue(v)) {
      problems.push(v);
      return NaN;
    }
    return v;
  };
  const complex = (a: Amplitude, pointer: string): Complex => {
    if (typeof a !== 'object') return { re: num(a, pointer), im: 0 };
    if ('magnitude' in a) {
      const r = num(a.magnitude, joinPointer(pointer, 'magnitude'));
      const phi = num(a.phase, joinPointer(pointer, 'phase'));
      return { re: r * Math.cos(phi), im: r * Math.sin(phi) };
    }
    return { re: num(a.re, joinPointer(pointer, 're')), im: num(a.im, joinPointer(pointer, 'im')) };
  };
  const cosPhase = (fn: 'cos' | 'sin', phase: Quantity | undefined, pointer: string): number =>
    (phase === undefined ? 0 : num(phase, pointer)) - (fn === 'sin' ? Math.PI / 2 : 0);
  const modulation = (m: ModulationSpec | undefined, pointer: string): Modulation => {
    if (!m || m.kind === 'constant') return { kind: 'constant' };
    return {
      kind: 'harmonic',
      mean: m.mean === undefined ? 0 : num(m.mean, joinPointer(pointer, 'mean')),
      components: m.components.map((c, i) => ({
        amplitude: num(c.amplitude, joinPointer(pointer, 'components', i, 'amplitude')),
        harmonic: c.harmonic,
        phase: cosPhase(c.function, c.phase, joinPointer(pointer, 'components', i, 'phase')),
      })),
    };
  };

  const index = new Map(doc.lattice.orbitals.map((o, i) => [o.name, i]));
  const dim = doc.lattice.dimension;
  const zeroOffset = new Array<number>(dim).fill(0);
  const segments: DriveSegment[] = [];
  const pairings: PairingTerm[][] = [];
  doc.drive.segments.forEach((s, si) => {
    const sp = joinPointer('/drive/segments', si);
    const terms: DriveTerm[] = [];
    s.onsite?.forEach((t, i) => {
      const p = joinPointer(sp, 'onsite', i);
      const o = index.get(t.orbital)!;
      terms.push({ from: o, to: o, offset: [...zeroOffset], amplitude: { re: num(t.energy, joinPointer(p, 'energy')), im: 0 }, modulation: modulation(t.modulation, joinPointer(p, 'modulation')) });
    });
    s.hoppings?.forEach((t, i) => {
      const p = joinPointer(sp, 'hoppings', i);
      terms.push({ from: index.get(t.from)!, to: index.get(t.to)!, offset: [...t.offset], amplitude: complex(t.amplitude, joinPointer(p, 'amplitude')), modulation: modulation(t.modulation, joinPointer(p, 'modulation')) });
    });
    pairings.push(
      (s.pairings ?? []).map((t, i) => {
        const p = joinPointer(sp, 'pairings', i);
        return { from: index.get(t.from)!, to: index.get(t.to)!, offset: [...t.offset], amplitude: complex(t.amplitude, joinPointer(p, 'amplitude')), modulation: modulation(t.modulation, joinPointer(p, 'modulation')) };
      }),
    );
    const segment: DriveSegment = { duration: num(s.duration, joinPointer(sp, 'duration')), terms };
    if (s.label !== undefined) segment.label = s.label;
    if (s.vectorPotential && s.vectorPotential.length > 0) {
      segment.vectorPotential = s.vectorPotential.map((c, i): VectorPotentialComponent => {
        const p = joinPointer(sp, 'vectorPotential', i);
        return { amplitude: c.amplitude.map((a, j) => num(a, joinPointer(p, 'amplitude', j))), harmonic: c.harmonic, phase: cosPhase(c.function, c.phase, joinPointer(p, 'phase')) };
      });
    }
    segments.push(segment);
  });

  const normal: LatticeDrive = {
    dimension: dim,
    spaceDimension: dim,
    latticeVectors: doc.lattice.vectors.map((v, i) => v.map((c, j) => num(c, joinPointer('/lattice/vectors', i, j)))),
    states: doc.lattice.orbitals.map((o, i) => ({ label: o.name, position: o.position.map((c, j) => num(c, joinPointer('/lattice/orbitals', i, 'position', j))), charge: 1 })),
    period: num(doc.drive.period, '/drive/period'),
    segments,
  };

  const nambu = pairings.some((list) => list.length > 0);
  const size = normal.states.length * (nambu ? 2 : 1);
  const matrix = (m: MatrixEntry[][], pointer: string): ComplexMatrix => {
    const out = zeros(size, size);
    m.forEach((row, i) =>
      row.forEach((entry, j) => {
        const p = joinPointer(pointer, i, j);
        out.re[i * size + j] = num(Array.isArray(entry) ? entry[0] : entry, Array.isArray(entry) ? joinPointer(p, 0) : p);
        out.im[i * size + j] = Array.isArray(entry) ? num(entry[1], joinPointer(p, 1)) : 0;
      }),
    );
    return out;
  };
  const claimed = doc.claims.symmetries;
  const symmetries: CompiledModel['symmetries'] = {};
  if (claimed?.chiral) symmetries.chiral = matrix(claimed.chiral.operator, '/claims/symmetries/chiral/operator');
  if (claimed?.chiral?.symmetricTimes) symmetries.chiralTimes = claimed.chiral.symmetricTimes.map((q, i) => num(q, joinPointer('/claims/symmetries/chiral/symmetricTimes', i)));
  if (claimed?.particleHole) {
    symmetries.particleHole = { unitary: matrix(claimed.particleHole.unitary, '/claims/symmetries/particleHole/unitary'), antiunitary: claimed.particleHole.antiunitary ?? true };
  }
  if (claimed?.timeReversal) {
    symmetries.timeReversal = { unitary: matrix(claimed.timeReversal.unitary, '/claims/symmetries/timeReversal/unitary'), antiunitary: claimed.timeReversal.antiunitary ?? true };
  }

  if (problems.length > 0) throw new CompileError(model.id, problems);
  const drive = nambu ? buildNambu(model.id, normal, pairings) : normal;
  return { drive, symmetries, nambu };
}

/** Models with pairing terms act on Nambu components (particles, then holes); see src/numerics/bdg.ts. */
function buildNambu(id: string, normal: LatticeDrive, pairings: PairingTerm[][]): LatticeDrive {
  try {
    return nambuDrive(normal, pairings);
  } catch (error) {
    if (error instanceof NambuInputError) throw new CompileError(id, [{ pointer: '/drive/segments', message: error.message }]);
    throw error;
  }
}
