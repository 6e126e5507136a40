/**
 * A sweep's points on their way to standard output. The sweep JSON holds one
 * array per quantity, but the solver yields one point (all quantities) at a
 * time; the points are gathered in a block of fixed size and each full block
 * is written to a temporary file column by column, so that each quantity's
 * array can then be read back in order. Memory stays one block whatever the
 * number of points, and nothing reaches standard output before the last point
 * solved (a refusal at any frequency prints nothing, as the contract says).
 */
import { closeSync, mkdtempSync, openSync, readSync, rmSync, writeSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

/** About this many bytes of points are held in memory at once. */
export const SPOOL_BLOCK_BYTES = 8 * 1024 * 1024;

/** A failure of the temporary file (a full disk, a read-only folder): not the model's fault. */
export class SpoolError extends Error {}

export class ColumnSpool {
  /** complex values per point */
  readonly width: number;
  /** points per block */
  readonly blockPoints: number;
  private readonly block: Float64Array;
  private inBlock = 0;
  private readonly blocks: { offset: number; points: number }[] = [];
  private fd: number | null = null;
  private end = 0;
  private finished = false;

  constructor(width: number, blockPoints = Math.max(1, Math.floor(SPOOL_BLOCK_BYTES / (16 * Math.max(1, width))))) {
    this.width = width;
    this.blockPoints = blockPoints;
    this.block = new Float64Array(2 * width * blockPoints);
  }

  /** Adds one point: `width` complex values, real and imaginary parts interleaved. */
  push(point: Float64Array): void {
    const { width, blockPoints, block } = this;
    const at = 2 * this.inBlock;
    for (let k = 0; k < width; k++) {
      const o = 2 * k * blockPoints + at;
      block[o] = point[2 * k];
      block[o + 1] = point[2 * k + 1];
    }
    if (++this.inBlock === blockPoints) this.flush();
  }

  /** No more points: the last partial block goes to the file, if there is one. */
  finish(): void {
    if (this.fd !== null) this.flush();
    this.finished = true;
  }

  /** Column `k` (one quantity at every point, re and im interleaved), in pieces, in point order. */
  *column(k: number): Generator<Float64Array> {
    if (!this.finished) throw new Error('the spool is still being written');
    const { blockPoints, block } = this;
    if (this.fd === null) {
      yield block.subarray(2 * k * blockPoints, 2 * k * blockPoints + 2 * this.inBlock);
      return;
    }
    const buffer = new Float64Array(2 * blockPoints);
    const bytes = new Uint8Array(buffer.buffer);
    for (const b of this.blocks) {
      const length = 16 * b.points;
      const position = b.offset + k * length;
      let got = 0;
      while (got < length) {
        const n = this.io(() => readSync(this.fd!, bytes, got, length - got, position + got), 'read');
        if (n === 0) throw new SpoolError('the temporary file of the sweep was cut short');
        got += n;
      }
      yield buffer.subarray(0, 2 * b.points);
    }
  }

  /** Closes the temporary file (it has no name any more, so nothing is left behind). */
  close(): void {
    if (this.fd !== null) {
      try {
        closeSync(this.fd);
      } catch {
        /* closing is best effort */
      }
      this.fd = null;
    }
  }

  private flush(): void {
    const points = this.inBlock;
    if (points === 0) return;
    if (this.fd === null) this.open();
    const { width, blockPoints, block } = this;
    const offset = this.end;
    for (let k = 0; k < width; k++) {
      const bytes = new Uint8Array(block.buffer, 16 * k * blockPoints, 16 * points);
      let put = 0;
      while (put < bytes.length) put += this.io(() => writeSync(this.fd!, bytes, put, bytes.length - put, offset + k * 16 * points + put), 'write');
    }
    this.blocks.push({ offset, points });
    this.end = offset + 16 * width * points;
    this.inBlock = 0;
  }

  private open(): void {
    const dir = this.io(() => mkdtempSync(join(tmpdir(), 'coilwright-sweep-')), 'create');
    try {
      this.fd = this.io(() => openSync(join(dir, 'points'), 'w+', 0o600), 'create');
    } finally {
      // unlinked at once: the open file stays readable and disappears with the process
      rmSync(dir, { recursive: true, force: true });
    }
  }

  private io<T>(f: () => T, what: 'create' | 'write' | 'read'): T {
    try {
      return f();
    } catch (e) {
      const code = (e as NodeJS.ErrnoException).code ?? '';
      const why = code === 'ENOSPC' ? 'no space left on the device' : code === 'EACCES' || code === 'EROFS' ? 'it may not be written' : (e as Error).message;
      throw new SpoolError(`could not ${what} the sweep's temporary file in ${tmpdir()} (${why}${code ? `, ${code}` : ''}); free some space there, set TMPDIR to another folder, or probe fewer values`);
    }
  }
}
