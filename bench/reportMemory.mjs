/**
 * Preloaded (`node --import`) by bench/limits.ts: on exit, writes the process's peak resident
 * memory to stderr as `tierplan-bench-maxrss=<KiB>`, so the benchmark needs no system tool.
 */
process.on('exit', () => {
  process.stderr.write(`tierplan-bench-maxrss=${process.resourceUsage().maxRSS}\n`);
});
