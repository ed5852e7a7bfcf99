/** A Float64Array that grows by doubling, for columns whose length is known only at the end of a stream. */
export class GrowableFloat64 {
  data: Float64Array;
  length = 0;

  constructor(capacity = 1024) {
    this.data = new Float64Array(Math.max(16, capacity));
  }

  push(v: number): void {
    if (this.length === this.data.length) {
      const next = new Float64Array(this.data.length * 2);
      next.set(this.data);
      this.data = next;
    }
    this.data[this.length++] = v;
  }

  /** The filled part (a view; no copy). */
  view(): Float64Array {
    return this.data.subarray(0, this.length);
  }
}

/** An Int32Array that grows by doubling (line numbers of rows). */
export class GrowableInt32 {
  data: Int32Array;
  length = 0;

  constructor(capacity = 1024) {
    this.data = new Int32Array(Math.max(16, capacity));
  }

  push(v: number): void {
    if (this.length === this.data.length) {
      const next = new Int32Array(this.data.length * 2);
      next.set(this.data);
      this.data = next;
    }
    this.data[this.length++] = v;
  }

  view(): Int32Array {
    return this.data.subarray(0, this.length);
  }
}
