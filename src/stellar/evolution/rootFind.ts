/**
 * Root of a function bracketed by a sign change, by the Illinois variant of regula falsi, with a bisection
 * step every fourth iteration so that the bracket always shrinks. Written by hand: it is a dozen lines, it
 * must not allocate (it runs several times per isochrone), and no standalone maintained package offers a
 * bracketed solver on plain functions. It also converges on discontinuous functions (to the jump), which
 * the phase boundaries of the evolution model need at M_FGB. The tolerance is on the bracket's width,
 * relative to the root, or absolute for roots of size below 1.
 */
export function bracketedRoot(f: (x: number) => number, a: number, b: number, fa: number, fb: number, tol = 1e-13, maxIter = 200): number {
  if (fa === 0) return a;
  if (fb === 0) return b;
  if (fa * fb > 0) throw new RangeError(`bracketedRoot: no sign change on [${a}, ${b}]`);
  let side = 0;
  let c = a;
  for (let i = 0; i < maxIter; i++) {
    c = (a * fb - b * fa) / (fb - fa);
    if (!(c > Math.min(a, b) && c < Math.max(a, b)) || i % 4 === 3) c = 0.5 * (a + b);
    const fc = f(c);
    if (fc === 0) return c;
    if (fc * fb > 0) {
      b = c;
      fb = fc;
      if (side === -1) fa *= 0.5;
      side = -1;
    } else {
      a = c;
      fa = fc;
      if (side === 1) fb *= 0.5;
      side = 1;
    }
    // Stop when the bracket is below tol relative to the root (absolute for roots below 1 in size).
    if (Math.abs(b - a) <= tol * Math.max(1, Math.abs(c))) break;
  }
  return c;
}
