/**
 * Growable columnar storage for isochrone nodes while they are being placed. Nodes are appended (so a
 * batch of new nodes is contiguous and can go to the photometry model in one call) and kept in order by a
 * linked list per phase interval (so that inserting between two nodes costs nothing). One store is reused
 * by every isochrone build; only the final arrays are allocated per isochrone.
 */
export class NodeStore {
  n = 0;
  private cap = 0;
  nBands = 0;
  m0: Float64Array<ArrayBuffer> = new Float64Array(0);
  mass = new Float64Array(0);
  logL = new Float64Array(0);
  logTeff = new Float64Array(0);
  logg = new Float64Array(0);
  fraction = new Float64Array(0);
  coordinate = new Float64Array(0);
  spacing = new Float64Array(0);
  phase = new Uint8Array(0);
  dense = new Uint8Array(0);
  next = new Int32Array(0);
  /** mags[b][k]: absolute magnitude of node k in band b. */
  mags: Float64Array[] = [];

  reset(nBands: number): void {
    this.n = 0;
    if (nBands !== this.nBands) {
      this.nBands = nBands;
      this.mags = Array.from({ length: nBands }, () => new Float64Array(this.cap));
    }
  }

  /** Append a node; returns its index. Its `next` is -1. */
  add(): number {
    if (this.n === this.cap) this.grow(Math.max(1024, 2 * this.cap));
    this.next[this.n] = -1;
    return this.n++;
  }

  private grow(cap: number): void {
    const f = (a: Float64Array): Float64Array<ArrayBuffer> => {
      const b = new Float64Array(cap);
      b.set(a);
      return b;
    };
    this.m0 = f(this.m0);
    this.mass = f(this.mass);
    this.logL = f(this.logL);
    this.logTeff = f(this.logTeff);
    this.logg = f(this.logg);
    this.fraction = f(this.fraction);
    this.coordinate = f(this.coordinate);
    this.spacing = f(this.spacing);
    this.mags = this.mags.map(f);
    const p = new Uint8Array(cap);
    p.set(this.phase);
    this.phase = p;
    const d = new Uint8Array(cap);
    d.set(this.dense);
    this.dense = d;
    const nx = new Int32Array(cap);
    nx.set(this.next);
    this.next = nx;
    this.cap = cap;
  }
}
