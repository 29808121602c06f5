/**
 * Shared timing for benchmark workloads: runs the computation once, then prints
 * one JSON line {workload, computeMs, maxRssKb, result} on stdout. bench/run.mjs
 * starts every workload in a fresh Node process, so maxRssKb
 * (process.resourceUsage().maxRSS, kilobytes) is the peak of that workload alone
 * (including the runtime and the TypeScript loader).
 */
export async function measure(workload: string, work: () => unknown): Promise<void> {
  const t0 = performance.now();
  const result = await work();
  const computeMs = performance.now() - t0;
  const maxRssKb = process.resourceUsage().maxRSS;
  process.stdout.write(`${JSON.stringify({ workload, computeMs, maxRssKb, result })}\n`);
}
