/** Timing probe for tests and the benchmark: when the overlay was last drawn, and for which edit. */
export const overlayProbe = { seq: -1, at: 0, draws: 0, postedAt: 0, replyAt: 0, committedAt: 0, solveMs: 0, receivedAt: 0 };

export function overlayDrawn(seq: number): void {
  overlayProbe.seq = seq;
  overlayProbe.at = performance.now();
  overlayProbe.draws += 1;
}

/** Sheet layer draws (count and time spent), for the drag frame-rate benchmark. */
export const sheetProbe = { draws: 0, ms: 0 };
