/**
 * Shared timing for benchmark workloads: runs the computation once, then prints
 * one JSON line {workload, computeMs, result} on stdout. computeMs excludes
 * process start-up and module loading; bench/run.mjs adds the wall time of the
 * whole process and its peak RSS (bench/peak-rss.mjs).
 */
export async function measure(workload: string, work: () => unknown): Promise<void> {
  const t0 = performance.now();
  const result = await work();
  const computeMs = performance.now() - t0;
  process.stdout.write(`${JSON.stringify({ workload, computeMs, result })}\n`);
}
