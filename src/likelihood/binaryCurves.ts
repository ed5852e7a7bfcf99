/**
 * The binary sequences: for each mass-ratio node q_j of the q quadrature (qGrid.ts), the curve traced by
 * unresolved binaries of primary mass M (over the whole isochrone) and secondary mass q_j M, whose magnitude
 * in band b is the flux sum mu_b(M, q) = -2.5 log10(10^(-0.4 mu_b(M)) + 10^(-0.4 mu_b(q M))).
 *
 * Each curve is itself a polyline. Its nodes are the primary's polyline nodes plus the primary masses at
 * which the secondary crosses a polyline node (M = M_i / q_j), so that between two nodes both components
 * move linearly in t = log-mass coordinate; the flux sum of two such linear tracks is curved only through
 * the change of flux ratio, by at most (0.92/4)(d(mu2 - mu1))^2/8 mag, which is tiny for the short steps
 * here. Each curve segment inherits the primary segment's exact IMF weight restricted to its t range;
 * the q quadrature weight is added per level at evaluation time. Secondaries below the isochrone's lowest
 * mass follow the polyline's continuation (ModelPolyline.faintSlope), so they fade without a jump.
 *
 * Together the (primary segment x q node) pieces are the "patches" of the (M, q) surface: exact along M,
 * quadrature across q.
 */
import type { ModelPolyline } from './polyline.js';
import type { QGrid } from './qGrid.js';
import type { SegmentSet } from './segmentSet.js';

const FLUX_K = 0.4 * Math.LN10;
const MAG_K = 2.5 / Math.LN10;

export class BinaryCurveBuilder {
  private readonly nBands: number;
  private nodeMag: Float64Array[] = [];
  private nodeLnM = new Float64Array(0);
  private nodeSeg = new Int32Array(0);
  private cap = 0;

  constructor(nBands: number) {
    this.nBands = nBands;
  }

  private ensure(n: number): void {
    if (n <= this.cap) return;
    const cap = Math.max(n, 2 * this.cap);
    this.nodeMag = Array.from({ length: this.nBands }, () => new Float64Array(cap));
    this.nodeLnM = new Float64Array(cap);
    this.nodeSeg = new Int32Array(cap);
    this.cap = cap;
  }

  /**
   * Append the segments of the curves j = first, first + step, first + 2 step, ... (<= grid.n0) to `out`
   * (after reset), for primaries from polyline node `kStart` on (lower-mass primaries make no binary the
   * likelihood can see).
   */
  build(poly: ModelPolyline, grid: QGrid, step: number, out: SegmentSet, kStart = 0, first = 0): void {
    out.reset();
    const K = poly.n;
    this.ensure(2 * K + 2);
    const lnM = poly.lnMass;
    const lnLast = lnM[K - 1];
    const seg = poly.segments;
    for (let j = first; j <= grid.n0; j += step) {
      const lnQ = grid.lnQ[j];
      // Merge primary nodes with the crossings lnM_i - lnQ.
      let n = 0;
      let k = kStart;
      let i = 0;
      while (k < K) {
        const cross = i < K ? lnM[i] - lnQ : Infinity;
        let x: number;
        if (cross < lnM[k] - 1e-12) {
          x = cross;
          i++;
          if (x <= lnM[kStart]) continue;
          // A secondary more than 7.5 mag fainter than the primary in every band (flux fraction below
          // 1e-3) bends the sum by under 1e-3 of its own kink: skip that crossing.
          if (this.secondaryNegligible(poly, i - 1, x, k - 1)) continue;
        } else {
          x = lnM[k];
          if (Math.abs(cross - x) <= 1e-12) i++;
          k++;
        }
        if (x > lnLast) break;
        this.nodeLnM[n] = x;
        this.nodeSeg[n] = Math.max(0, Math.min(k - 1, K - 2));
        n++;
      }
      // Magnitudes of the binary at each node.
      let hint2 = 0;
      for (let u = 0; u < n; u++) {
        const x = this.nodeLnM[u];
        let kp = this.nodeSeg[u];
        // nodeSeg holds the last primary node at or below x; for the last node use the last segment.
        if (kp > K - 2) kp = K - 2;
        const x2 = x + lnQ;
        hint2 = x2 >= lnM[0] ? poly.locate(x2, hint2) : 0;
        for (let b = 0; b < this.nBands; b++) {
          const m1 = poly.magAt(b, x, kp);
          const m2 = poly.magAt(b, x2, hint2);
          const d = m2 - m1;
          this.nodeMag[b][u] = d > 40 ? m1 : m1 - MAG_K * Math.log1p(Math.exp(-FLUX_K * d));
        }
      }
      // Segments between consecutive nodes, with the primary segment's weight restricted to [ta, tb].
      for (let u = 0; u + 1 < n; u++) {
        const kp = this.segmentOf(u, poly);
        const l0 = lnM[kp];
        const span = lnM[kp + 1] - l0;
        const ta = (this.nodeLnM[u] - l0) / span;
        const tb = (this.nodeLnM[u + 1] - l0) / span;
        const dt = tb - ta;
        if (!(dt > 0)) continue;
        const c0 = seg.c0[kp];
        const c1 = seg.c1[kp];
        const c2 = seg.c2[kp];
        out.add(this.nodeMag, u, this.nodeMag, u + 1, c0 + c1 * ta + c2 * ta * ta + Math.log(dt), (c1 + 2 * c2 * ta) * dt, c2 * dt * dt, j);
      }
    }
  }

  private secondaryNegligible(poly: ModelPolyline, iSecondary: number, lnPrimary: number, kp: number): boolean {
    for (let b = 0; b < this.nBands; b++) if (poly.mag[b][iSecondary] - poly.magAt(b, lnPrimary, kp) < 7.5) return false;
    return true;
  }

  /** The primary polyline segment containing the curve segment that starts at node u. */
  private segmentOf(u: number, poly: ModelPolyline): number {
    const x = this.nodeLnM[u];
    let kp = this.nodeSeg[u];
    if (kp > poly.n - 2) kp = poly.n - 2;
    while (kp < poly.n - 2 && x >= poly.lnMass[kp + 1]) kp++;
    return kp;
  }
}
