/**
 * The Nelder–Mead downhill simplex minimiser (Nelder & Mead 1965, Comput. J. 7, 308), in the precise form
 * set out by Lagarias, Reeds, Wright & Wright (1998, SIAM J. Optim. 9, 112, section 2): order, reflect,
 * expand, contract outside or inside, shrink; ties broken in favour of the older vertex. Coefficients are
 * the dimension-adaptive ones of Gao & Han (2012, Comput. Optim. Appl. 51, 259): reflection 1, expansion
 * 1 + 2/n, contraction 3/4 - 1/(2n), shrink 1 - 1/n, which keep the method from stalling beyond a few
 * dimensions. Written here because no maintained npm package offers it with async objectives (our
 * objective runs on a worker pool); it is the optimiser that places walkers near the posterior mode.
 *
 * A vertex where the objective is +Infinity (outside the support) is simply the worst; NaN is an error.
 */

export interface NelderMeadOptions {
  /** Initial simplex: x0 plus step[i] along axis i. Default 5% of |x0[i]|, or 0.00025 where x0[i] = 0
   *  (the usual convention of MATLAB's fminsearch; common practice). */
  step?: ArrayLike<number>;
  /** Stop when the objective values across the simplex differ by at most this; default 1e-8. */
  fTolerance?: number;
  /** ...and every vertex is within this of the best, per coordinate; default 1e-8. */
  xTolerance?: number;
  /** Iteration cap; default 200 n. */
  maxIterations?: number;
}

export interface NelderMeadResult {
  x: Float64Array;
  f: number;
  iterations: number;
  evaluations: number;
  /** Whether the tolerances were met before the iteration cap. */
  converged: boolean;
}

export type Objective = (x: Float64Array) => number | Promise<number>;

export async function nelderMead(objective: Objective, x0: ArrayLike<number>, options: NelderMeadOptions = {}): Promise<NelderMeadResult> {
  const n = x0.length;
  if (n < 1) throw new RangeError('Nelder–Mead needs at least one dimension');
  const alpha = 1;
  const beta = n >= 2 ? 1 + 2 / n : 2;
  const gamma = n >= 2 ? 0.75 - 1 / (2 * n) : 0.5;
  const delta = n >= 2 ? 1 - 1 / n : 0.5;
  const fTol = options.fTolerance ?? 1e-8;
  const xTol = options.xTolerance ?? 1e-8;
  const maxIterations = options.maxIterations ?? 200 * n;
  let evaluations = 0;
  const f = async (x: Float64Array): Promise<number> => {
    evaluations++;
    const v = await objective(x);
    if (Number.isNaN(v)) throw new RangeError(`the objective is NaN at (${Array.from(x).join(', ')})`);
    return v;
  };

  // Vertices, kept sorted by value (best first).
  let xs: Float64Array[] = [Float64Array.from(x0)];
  for (let i = 0; i < n; i++) {
    const v = Float64Array.from(x0);
    const h = options.step ? options.step[i] : x0[i] !== 0 ? 0.05 * Math.abs(x0[i]) : 0.00025;
    v[i] += h;
    xs.push(v);
  }
  let fs = await Promise.all(xs.map(f));
  const sortSimplex = (): void => {
    // Stable sort keeps older vertices ahead on ties, as Lagarias et al. prescribe.
    const idx = fs.map((_, i) => i).sort((a, b) => fs[a] - fs[b] || a - b);
    xs = idx.map((i) => xs[i]);
    fs = idx.map((i) => fs[i]);
  };
  sortSimplex();
  const centroid = new Float64Array(n);
  const along = (t: number): Float64Array => {
    // centroid + t (centroid - worst)
    const out = new Float64Array(n);
    for (let j = 0; j < n; j++) out[j] = centroid[j] + t * (centroid[j] - xs[n][j]);
    return out;
  };
  let iterations = 0;
  let converged = false;
  while (iterations < maxIterations) {
    if (isSmall(xs, fs, fTol, xTol)) {
      converged = true;
      break;
    }
    iterations++;
    centroid.fill(0);
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) centroid[j] += xs[i][j] / n;
    const xr = along(alpha);
    const fr = await f(xr);
    if (fr < fs[0]) {
      const xe = along(alpha * beta);
      const fe = await f(xe);
      replaceWorst(fe < fr ? xe : xr, fe < fr ? fe : fr);
    } else if (fr < fs[n - 1]) {
      replaceWorst(xr, fr);
    } else {
      const outside = fr < fs[n];
      const xc = along(outside ? alpha * gamma : -gamma);
      const fc = await f(xc);
      if (outside ? fc <= fr : fc < fs[n]) {
        replaceWorst(xc, fc);
      } else {
        // Shrink every vertex towards the best.
        for (let i = 1; i <= n; i++) for (let j = 0; j < n; j++) xs[i][j] = xs[0][j] + delta * (xs[i][j] - xs[0][j]);
        const shrunk = await Promise.all(xs.slice(1).map(f));
        for (let i = 1; i <= n; i++) fs[i] = shrunk[i - 1];
        sortSimplex();
      }
    }
  }
  return { x: xs[0], f: fs[0], iterations, evaluations, converged };

  function replaceWorst(x: Float64Array, fx: number): void {
    // Insert after every vertex with a value <= fx (the new vertex loses ties).
    xs.pop();
    fs.pop();
    let k = 0;
    while (k < fs.length && fs[k] <= fx) k++;
    xs.splice(k, 0, x);
    fs.splice(k, 0, fx);
  }
}

function isSmall(xs: Float64Array[], fs: number[], fTol: number, xTol: number): boolean {
  const n = xs.length - 1;
  if (!Number.isFinite(fs[n])) return false;
  if (fs[n] - fs[0] > fTol) return false;
  for (let i = 1; i <= n; i++) for (let j = 0; j < n; j++) if (Math.abs(xs[i][j] - xs[0][j]) > xTol) return false;
  return true;
}
