/** Workload: as ribbon-counts-2000, on a ribbon 10,000 cells wide (no numpy twin: a dense 20,000 × 20,000 eigenproblem per momentum). */
import { ribbonCountsWorkload } from '../ribbon-counts.ts';

await ribbonCountsWorkload('ribbon-counts-10000', 10000);
