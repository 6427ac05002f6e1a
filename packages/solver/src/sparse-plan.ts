/**
 * The symbolic side of the sparse LU: a pivot sequence with the filled row patterns of L and
 * U it leads to, and the numeric arrays a refactorisation along it fills.
 */

/** A pivot sequence with its symbolic analysis and the numeric arrays it fills. */
export interface Plan {
  rowPerm: Int32Array;
  colPerm: Int32Array;
  colInv: Int32Array;
  lPtr: Int32Array;
  lCol: Int32Array;
  /** Row i of U: diagonal first, then the other columns. */
  uPtr: Int32Array;
  uCol: Int32Array;
  lRe: Float64Array;
  lIm: Float64Array;
  uRe: Float64Array;
  uIm: Float64Array;
  dRe: Float64Array;
  dIm: Float64Array;
}

/**
 * Symbolic analysis: the filled row patterns of L and U for a pivot sequence, given the
 * matrix's pattern by rows (`rowPtr` into `rowSlots`, the entry slots of each row) and `cols`.
 */
export function symbolicPlan(n: number, rowPtr: Int32Array, rowSlots: Int32Array, cols: Int32Array, rowPerm: Int32Array, colPerm: Int32Array): Plan {
  const colInv = new Int32Array(n);
  for (let k = 0; k < n; k++) colInv[colPerm[k]] = k;
  const mark = new Int32Array(n).fill(-1);
  const heap = new MinHeap(n);
  let lCol: number[] = [];
  const uColParts: Int32Array[] = [];
  const lPtr = new Int32Array(n + 1);
  const uPtr = new Int32Array(n + 1);
  let uCount = 0;
  const uRow: number[] = [];
  for (let i = 0; i < n; i++) {
    mark[i] = i;
    uRow.length = 0;
    uRow.push(i);
    const orig = rowPerm[i];
    for (let t = rowPtr[orig]; t < rowPtr[orig + 1]; t++) {
      const c = colInv[cols[rowSlots[t]]];
      if (mark[c] === i) continue;
      mark[c] = i;
      if (c < i) heap.push(c);
      else uRow.push(c);
    }
    while (heap.size > 0) {
      const k = heap.pop();
      lCol.push(k);
      const part = uColParts[k];
      for (let q = 1; q < part.length; q++) {
        const j = part[q];
        if (mark[j] === i) continue;
        mark[j] = i;
        if (j < i) heap.push(j);
        else uRow.push(j);
      }
    }
    lPtr[i + 1] = lCol.length;
    uColParts.push(Int32Array.from(uRow));
    uCount += uRow.length;
    uPtr[i + 1] = uCount;
  }
  const uCol = new Int32Array(uCount);
  for (let i = 0; i < n; i++) uCol.set(uColParts[i], uPtr[i]);
  const lColArr = Int32Array.from(lCol);
  lCol = [];
  return {
    rowPerm,
    colPerm,
    colInv,
    lPtr,
    lCol: lColArr,
    uPtr,
    uCol,
    lRe: new Float64Array(lColArr.length),
    lIm: new Float64Array(lColArr.length),
    uRe: new Float64Array(uCount),
    uIm: new Float64Array(uCount),
    dRe: new Float64Array(n),
    dIm: new Float64Array(n),
  };
}

/** A binary min-heap of small integers, for the symbolic pass. */
class MinHeap {
  private readonly a: Int32Array;
  size = 0;
  constructor(capacity: number) {
    this.a = new Int32Array(Math.max(1, capacity));
  }
  push(v: number): void {
    const a = this.a;
    let i = this.size++;
    a[i] = v;
    while (i > 0) {
      const p = (i - 1) >> 1;
      if (a[p] <= a[i]) break;
      const t = a[p];
      a[p] = a[i];
      a[i] = t;
      i = p;
    }
  }
  pop(): number {
    const a = this.a;
    const top = a[0];
    const last = a[--this.size];
    let i = 0;
    const n = this.size;
    if (n > 0) {
      a[0] = last;
      for (;;) {
        const l = 2 * i + 1;
        const r = l + 1;
        let m = i;
        if (l < n && a[l] < a[m]) m = l;
        if (r < n && a[r] < a[m]) m = r;
        if (m === i) break;
        const t = a[m];
        a[m] = a[i];
        a[i] = t;
        i = m;
      }
    }
    return top;
  }
}
