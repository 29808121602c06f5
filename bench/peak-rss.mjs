/**
 * Preloaded into every Node workload by bench/run.mjs (`--import`): reports the
 * process's peak resident set size on exit as a tagged stderr line, so the
 * harness measures memory the same way for every workload, whatever it prints.
 */
process.on('exit', () => {
  process.stderr.write(`\n@@peak-rss-kb ${process.resourceUsage().maxRSS}\n`);
});
