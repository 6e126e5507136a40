/**
 * Sorting of index ranges for the sparse LU, without allocating.
 *
 * The lists sorted here come out of depth-first searches: long ascending or
 * descending runs with a few entries out of place (a hub node's column lists
 * every leaf in reverse, then the hub). A quicksort with a median-of-three
 * pivot takes quadratic time on such a list, so this is a natural merge sort:
 * runs found as they are (descending ones reversed), short ones extended to
 * MIN_RUN by insertion, then merged pairwise. O(m log r) for m entries in r
 * runs, O(m) for a list that is already one or two runs.
 */

const MIN_RUN = 16;

/** Sorts the distinct integers a[lo..hi) ascending; `tmp` holds at least hi - lo entries. */
export function sortInts(a: Int32Array, lo: number, hi: number, tmp: Int32Array): void {
  if (hi - lo < 2) return;
  // pass 0: runs of at least MIN_RUN entries, each ascending
  let i = lo;
  let runs = 0;
  while (i < hi) {
    let j = i + 1;
    if (j < hi && a[j] < a[i]) {
      while (j + 1 < hi && a[j + 1] < a[j]) j++;
      j++;
      for (let s = i, e = j - 1; s < e; s++, e--) {
        const t = a[s];
        a[s] = a[e];
        a[e] = t;
      }
    } else {
      while (j < hi && a[j] > a[j - 1]) j++;
    }
    if (j - i < MIN_RUN && j < hi) {
      const end = Math.min(hi, i + MIN_RUN);
      insertionSort(a, i, j, end);
      j = end;
    }
    runs++;
    i = j;
  }
  if (runs === 1) return;
  // merge passes: adjacent ascending runs pairwise, from a into tmp and back
  for (;;) {
    let out = 0; // runs this pass leaves
    i = lo;
    while (i < hi) {
      const mid = runEnd(a, i, hi);
      out++;
      if (mid === hi) {
        for (let t = i; t < hi; t++) tmp[t - lo] = a[t];
        break;
      }
      const end = runEnd(a, mid, hi);
      merge(a, i, mid, end, tmp, lo);
      i = end;
    }
    for (let t = lo; t < hi; t++) a[t] = tmp[t - lo];
    if (out <= 1) return;
  }
}

/** End of the ascending run of a that starts at i. */
function runEnd(a: Int32Array, i: number, hi: number): number {
  let j = i + 1;
  while (j < hi && a[j] > a[j - 1]) j++;
  return j;
}

/** a[lo..sorted) is ascending; inserts a[sorted..end) into it. */
function insertionSort(a: Int32Array, lo: number, sorted: number, end: number): void {
  for (let i = sorted; i < end; i++) {
    const v = a[i];
    let j = i - 1;
    while (j >= lo && a[j] > v) {
      a[j + 1] = a[j];
      j--;
    }
    a[j + 1] = v;
  }
}

/** Merges the ascending runs a[i..mid) and a[mid..end) into tmp[i - base .. end - base). */
function merge(a: Int32Array, i: number, mid: number, end: number, tmp: Int32Array, base: number): void {
  let s = i;
  let t = mid;
  let d = i - base;
  while (s < mid && t < end) tmp[d++] = a[s] < a[t] ? a[s++] : a[t++];
  while (s < mid) tmp[d++] = a[s++];
  while (t < end) tmp[d++] = a[t++];
}

/**
 * Sorts the row indices of every column of a CSC matrix ascending, their values (`w` numbers per
 * entry) along, in place: a column's values go to the dense vector `x` (zero, w * rows long) by row,
 * the indices are sorted, the values come back and x is zero again. `tmp` holds the longest column.
 */
export function sortColumns(n: number, cp: Int32Array, ci: Int32Array, cx: Float64Array, w: number, x: Float64Array, tmp: Int32Array): void {
  for (let j = 0; j < n; j++) {
    const s = cp[j];
    const e = cp[j + 1];
    let sorted = true;
    for (let p = s + 1; p < e; p++) {
      if (ci[p] < ci[p - 1]) {
        sorted = false;
        break;
      }
    }
    if (sorted) continue;
    for (let p = s; p < e; p++) {
      const i = w * ci[p];
      for (let c = 0; c < w; c++) x[i + c] = cx[w * p + c];
    }
    sortInts(ci, s, e, tmp);
    for (let p = s; p < e; p++) {
      const i = w * ci[p];
      for (let c = 0; c < w; c++) {
        cx[w * p + c] = x[i + c];
        x[i + c] = 0;
      }
    }
  }
}
