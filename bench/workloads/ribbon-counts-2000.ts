/**
 * Workload: signed edge counts in every gap of a ribbon 2,000 cells wide of the
 * three-step honeycomb drive (Kitagawa, Berg, Rudner, Demler, PRB 82, 235114
 * (2010); Jτ = 0.45π, δτ = 0.3, τ = 1), finite along a₂: banded Floquet
 * operators and only the states near each gap label (shift-invert), on the
 * momentum grid the velocity bound asks for. RIBBON_CELLS overrides the width
 * (ribbon-counts-10000 runs the same code at 10,000 cells).
 * Twin: bench/numpy/ribbon-counts-2000.py diagonalises the dense operator at a
 * few momenta and extrapolates to the momenta a dense count needs.
 */
import { ribbonCountsWorkload } from '../ribbon-counts.ts';

await ribbonCountsWorkload('ribbon-counts-2000', Number(process.env.RIBBON_CELLS ?? 2000));
