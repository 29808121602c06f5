/**
 * Workload: Floquet spectrum and edge weights of a ribbon of the three-step
 * honeycomb drive (Kitagawa, Berg, Rudner, Demler, PRB 82, 235114 (2010)):
 * one bond direction per step, Jτ = 0.45π, sublattice potential δτ = 0.3
 * (τ = 1), 60 cells wide (finite along a₁), 400 momenta along the edge.
 */
import { ribbonSpectrum } from '../../src/numerics/sheet/ribbon.ts';
import { threeStepHoneycombDrive } from '../../test/support/drives/honeycomb.ts';
import { measure } from '../measure.ts';

await measure('ribbon-honeycomb', () => {
  const drive = threeStepHoneycombDrive({ hopping: 0.45 * Math.PI, stepDuration: 1, mass: 0.3 });
  const ribbon = ribbonSpectrum(drive, { width: 60, momenta: 400 });
  let edgeStates = 0;
  ribbon.lowEdgeWeight.forEach((row, j) => row.forEach((w, c) => (edgeStates += w > 0.8 || ribbon.highEdgeWeight[j][c] > 0.8 ? 1 : 0)));
  const first = ribbon.samples[0].quasienergies;
  return {
    states: ribbon.samples.length * first.length,
    statesAbove80PercentOnOneEdge: edgeStates,
    quasienergiesAtFirstMomentum: [first[0], first[first.length - 1]],
    propagatorAccuracy: ribbon.propagatorAccuracy,
  };
});
