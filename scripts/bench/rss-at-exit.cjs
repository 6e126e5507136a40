// Preloaded (node -r) into a command-line run by scripts/bench-long-sweep.mjs:
// on exit, writes the process's peak resident memory as one JSON line to fd 3.
process.on('exit', () => {
  try {
    require('node:fs').writeSync(3, `${JSON.stringify({ maxRssMB: process.resourceUsage().maxRSS / 1024 })}\n`);
  } catch {
    /* no fd 3: nothing to report */
  }
});
