/**
 * Accumulates stamps in growable typed arrays and merges them into unique slots, ordered by
 * row (a counting sort, then one pass per row with a column marker): linear in the count
 * of stamps, for networks of half a million parts.
 */
export class StampList {
  private readonly n: number;
  private size = 0;
  private r = new Int32Array(64);
  private c = new Int32Array(64);
  private k0 = new Float64Array(64);
  private k1 = new Float64Array(64);
  private k2 = new Float64Array(64);

  constructor(n: number) {
    this.n = n;
  }

  add(r: number, c: number, k0: number, k1: number, k2: number): void {
    if (k0 === 0 && k1 === 0 && k2 === 0) return;
    if (this.size === this.r.length) this.grow();
    const s = this.size++;
    this.r[s] = r;
    this.c[s] = c;
    this.k0[s] = k0;
    this.k1[s] = k1;
    this.k2[s] = k2;
  }

  private grow(): void {
    const cap = this.r.length * 2;
    const ints = (a: Int32Array): Int32Array<ArrayBuffer> => {
      const b = new Int32Array(cap);
      b.set(a);
      return b;
    };
    const floats = (a: Float64Array): Float64Array<ArrayBuffer> => {
      const b = new Float64Array(cap);
      b.set(a);
      return b;
    };
    this.r = ints(this.r);
    this.c = ints(this.c);
    this.k0 = floats(this.k0);
    this.k1 = floats(this.k1);
    this.k2 = floats(this.k2);
  }

  finish(): { rows: Int32Array; cols: Int32Array; c0: Float64Array; c1: Float64Array; c2: Float64Array } {
    const n = this.n;
    const m = this.size;
    const start = new Int32Array(n + 1);
    for (let s = 0; s < m; s++) start[this.r[s] + 1]++;
    for (let i = 0; i < n; i++) start[i + 1] += start[i];
    const order = new Int32Array(m);
    const next = start.slice(0, n);
    for (let s = 0; s < m; s++) order[next[this.r[s]]++] = s;
    const slotOf = new Int32Array(n).fill(-1);
    const rows: number[] = [];
    const cols: number[] = [];
    const c0: number[] = [];
    const c1: number[] = [];
    const c2: number[] = [];
    for (let i = 0; i < n; i++) {
      const first = rows.length;
      for (let t = start[i]; t < start[i + 1]; t++) {
        const s = order[t];
        const c = this.c[s];
        let slot = slotOf[c];
        if (slot < first) {
          slot = rows.length;
          slotOf[c] = slot;
          rows.push(i);
          cols.push(c);
          c0.push(0);
          c1.push(0);
          c2.push(0);
        }
        c0[slot] += this.k0[s];
        c1[slot] += this.k1[s];
        c2[slot] += this.k2[s];
      }
    }
    return {
      rows: Int32Array.from(rows),
      cols: Int32Array.from(cols),
      c0: Float64Array.from(c0),
      c1: Float64Array.from(c1),
      c2: Float64Array.from(c2),
    };
  }
}
