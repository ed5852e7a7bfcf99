/**
 * The binary path's pruning against the same fast path without it, star by star.
 *
 * The binary curves are kept per q class, each with its own index whose records copy the segments in cell
 * order (cmdLikelihood.ts, gatherClass; segmentIndex.ts). The pruned path (the default) skips a segment
 * when an upper bound on its integral is below e^-14 of the largest bound among the star's segments of all
 * classes gathered so far, and widens each class's query until no segment outside it could pass. The
 * unpruned path (`prune: false`) integrates every segment of the star's q level. Both use the same q level
 * and the same Z_B, so they differ only by the skipped segments.
 * Derivation of the tolerance: the bounds never underestimate a segment's integral (segmentMinQ gives the
 * nearest point of the segment, lnWmax the largest IMF weight on it, qGrid.lnPrune the largest q weight),
 * and the largest bound is at most e^(1.1) x the sum over segments at any level (Gregory weights 7/6 against
 * 3/8 at the ends), so with at most ~300 skipped segments near a star the skipped mass is below
 * 300 e^(-14 + 1.1) = 7.5e-4 of the sum in the worst case, where all skipped bounds sit at the cut: the
 * tolerance below. Bounds overestimate, so the change is far smaller in practice (1.4e-6 on main before the
 * per-class split, in the first case); a segment missed near the star costs far more than the tolerance.
 * The brute-force comparison is in fastVsReference.test.ts.
 */
import { describe, expect, it } from 'vitest';
import { CmdLikelihood } from '../../src/likelihood/cmdLikelihood.js';
import { simulateCatalog } from '../../src/likelihood/simulate.js';
import { SyntheticIsochrones, TestExtinction } from '../helpers/syntheticIsochrones.js';

const limits = { B: { bright: 12, faint: 22.5 }, V: { bright: 12, faint: 22 }, I: { bright: 11, faint: 21.5 } };
const errorLaw = { B: { a: 0.005, b: 0.05, mRef: 22.5 }, V: { a: 0.005, b: 0.05, mRef: 22 }, I: { a: 0.005, b: 0.05, mRef: 21.5 } };

describe('binary pruning (per q class, with index records) against the unpruned path', () => {
  const cases = [
    { name: 'old, metal-poor, f_binary 0.5, bright errors down to 0.005 mag', theta: { logAgeYr: 9.9, feh: -1.0, dm: 14.5, ebv: 0.05, fBinary: 0.5, fField: 0.1, sigmaExtra: 0.0 }, seed: 31, colour: 0 },
    { name: 'young, metal-rich, colour-dependent extinction', theta: { logAgeYr: 8.8, feh: 0.1, dm: 15, ebv: 0.3, fBinary: 0.4, fField: 0.05, sigmaExtra: 0.01 }, seed: 32, colour: 0.8 },
  ];
  for (const c of cases) {
    it(c.name, () => {
      const src = new SyntheticIsochrones();
      const ext = new TestExtinction(c.colour);
      const sim = simulateCatalog({ seed: c.seed, nStars: 250, bands: ['B', 'V', 'I'], theta: c.theta, errorLaw, likelihood: { limits } }, src, ext);
      const fast = new CmdLikelihood(sim.catalog, src, ext, { limits }).responsibilities(c.theta).logL;
      const full = new CmdLikelihood(sim.catalog, src, ext, { limits, prune: false }).responsibilities(c.theta).logL;
      let worst = 0;
      for (let i = 0; i < fast.length; i++) worst = Math.max(worst, Math.abs(fast[i] - full[i]));
      console.log(`${c.name}: largest |pruned - unpruned| = ${worst.toExponential(2)}`);
      expect(worst).toBeLessThan(7.5e-4);
    }, 120_000);
  }
});
