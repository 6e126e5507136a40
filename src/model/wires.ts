/** Orthogonal wire polylines: tidying and keeping ends on moving pins. */

/** Drop repeated points and middle points of straight runs. */
export function tidyWire(pts: number[]): number[] {
  const out: number[] = [];
  for (let i = 0; i < pts.length; i += 2) {
    const x = pts[i], y = pts[i + 1];
    const n = out.length;
    if (n >= 2 && out[n - 2] === x && out[n - 1] === y) continue;
    if (n >= 4) {
      const ax = out[n - 4], ay = out[n - 3], bx = out[n - 2], by = out[n - 1];
      if ((ax === bx && bx === x) || (ay === by && by === y)) {
        out[n - 2] = x;
        out[n - 1] = y;
        continue;
      }
    }
    out.push(x, y);
  }
  if (out.length === 2) out.push(out[0], out[1]);
  return out;
}

/** An L-shaped route from a to b: first along the longer axis. */
export function elbow(ax: number, ay: number, bx: number, by: number, horizontalFirst?: boolean): number[] {
  if (ax === bx || ay === by) return [ax, ay, bx, by];
  const hFirst = horizontalFirst ?? Math.abs(bx - ax) >= Math.abs(by - ay);
  return hFirst ? [ax, ay, bx, ay, bx, by] : [ax, ay, ax, by, bx, by];
}

/** Move one end of an orthogonal wire to (x, y), bending the neighbouring segment so the wire stays orthogonal. */
export function moveWireEnd(pts: number[], end: 0 | 1, x: number, y: number): number[] {
  const fwd = end === 0 ? pts.slice() : reversePts(pts);
  const n = fwd.length;
  if (n === 4) {
    const ox = fwd[2], oy = fwd[3];
    const wasHorizontal = fwd[1] === oy;
    const moved = x === ox || y === oy ? [x, y, ox, oy] : wasHorizontal ? [x, y, x, oy, ox, oy] : [x, y, ox, y, ox, oy];
    return end === 0 ? moved : reversePts(moved);
  }
  if (fwd[1] === fwd[3] && fwd[0] !== fwd[2]) fwd[3] = y; // first segment horizontal: keep it horizontal
  else fwd[2] = x; // vertical: keep it vertical
  fwd[0] = x;
  fwd[1] = y;
  return end === 0 ? fwd : reversePts(fwd);
}

export function reversePts(pts: number[]): number[] {
  const out: number[] = new Array(pts.length);
  for (let i = 0, j = pts.length - 2; j >= 0; i += 2, j -= 2) {
    out[i] = pts[j];
    out[i + 1] = pts[j + 1];
  }
  return out;
}

export function translatePts(pts: number[], dx: number, dy: number): number[] {
  const out = pts.slice();
  for (let i = 0; i < out.length; i += 2) {
    out[i] += dx;
    out[i + 1] += dy;
  }
  return out;
}

/** Index (in points) of the segment of `pts` nearest to (x, y). */
export function nearestSegment(pts: number[], x: number, y: number): number {
  let best = 0;
  let bestD = Infinity;
  for (let j = 0; j + 3 < pts.length; j += 2) {
    const ax = pts[j], ay = pts[j + 1], bx = pts[j + 2], by = pts[j + 3];
    const cx = Math.max(Math.min(x, Math.max(ax, bx)), Math.min(ax, bx));
    const cy = Math.max(Math.min(y, Math.max(ay, by)), Math.min(ay, by));
    const d = Math.hypot(cx - x, cy - y);
    if (d < bestD) { bestD = d; best = j / 2; }
  }
  return best;
}

/**
 * Slide one segment sideways (a horizontal one up or down, a vertical one
 * left or right) and keep both wire ends where they are: a segment at an end
 * gets a new short link to that end.
 */
export function slideSegment(pts: number[], seg: number, dx: number, dy: number): number[] {
  const j = seg * 2;
  const horizontal = pts[j + 1] === pts[j + 3];
  const ox = horizontal ? 0 : dx;
  const oy = horizontal ? dy : 0;
  if (ox === 0 && oy === 0) return pts;
  const out = pts.slice();
  out[j] += ox; out[j + 1] += oy; out[j + 2] += ox; out[j + 3] += oy;
  const last = pts.length - 4;
  if (j === last) out.push(pts[pts.length - 2], pts[pts.length - 1]);
  if (j === 0) out.unshift(pts[0], pts[1]);
  return out;
}
