/**
 * The likelihood on the built-in stellar model (Hurley, Pols & Tout 2000 evolution, built-in photometry and
 * extinction): a catalogue drawn from that model with known parameters (fixed seed), and 1-D slices of the
 * likelihood through the truth that peak within 2 sigma of it (sigma from each slice's own curvature; see
 * slices.test.ts for why 2 sigma). Fewer stars and parameters than the synthetic-model slices, for time.
 */
import { describe, expect, it } from 'vitest';
import { CmdLikelihood } from '../../src/likelihood/cmdLikelihood.js';
import { simulateCatalog } from '../../src/likelihood/simulate.js';
import type { ClusterParameters } from '../../src/likelihood/theta.js';
import { extinctionModel } from '../../src/stellar/extinction/index.js';
import { builtinModel } from '../../src/stellar/isochrone/builtinModel.js';

const src = builtinModel();
const ext = extinctionModel();
const limits = { B: { bright: 11, faint: 21.5 }, V: { bright: 10.5, faint: 21 }, I: { bright: 9.5, faint: 20.5 } };
const errorLaw = { B: { a: 0.008, b: 0.05, mRef: 21.5 }, V: { a: 0.008, b: 0.05, mRef: 21 }, I: { a: 0.008, b: 0.05, mRef: 20.5 } };
const truth: ClusterParameters = { logAgeYr: 9.6, feh: -0.5, dm: 12.0, ebv: 0.1, fBinary: 0.25, fField: 0.1, sigmaExtra: 0.02 };
const sim = simulateCatalog({ seed: 77, nStars: 1500, bands: ['B', 'V', 'I'], theta: truth, errorLaw, likelihood: { limits } }, src, ext);
const lik = new CmdLikelihood(sim.catalog, src, ext, { limits });

function slice(key: keyof ClusterParameters, step0: number): { peak: number; sigma: number } {
  const f = (x: number) => lik.evaluate({ ...truth, [key]: x });
  let x = truth[key];
  let d = step0;
  let l0 = f(x);
  for (let it = 0; it < 30; it++) {
    const lm = f(x - d);
    const lp = f(x + d);
    const c = lm - 2 * l0 + lp;
    if (!(c < 0)) {
      d *= 2;
      continue;
    }
    const vertex = x + (d * (lm - lp)) / (2 * c);
    const sigma = d / Math.sqrt(-c);
    if (Math.abs(vertex - x) > d) {
      x = vertex;
      l0 = f(x);
      continue;
    }
    if (d > 3 * sigma || d < sigma / 3) {
      d = sigma;
      continue;
    }
    return { peak: vertex, sigma };
  }
  throw new Error(`slice along ${key} did not converge`);
}

describe('slices on the built-in stellar model', () => {
  it('evaluates to a finite log L at the truth, with status ok', () => {
    expect(Number.isFinite(lik.evaluate(truth))).toBe(true);
    expect(lik.status).toBe('ok');
  }, 600_000);
  for (const [key, step] of [['logAgeYr', 0.01], ['feh', 0.02], ['dm', 0.01], ['ebv', 0.005]] as [keyof ClusterParameters, number][]) {
    it(`${key} peaks within 2 sigma of the truth`, () => {
      const { peak, sigma } = slice(key, step);
      console.log(`built-in model, ${key}: truth ${truth[key]}, peak ${peak.toFixed(5)}, sigma ${sigma.toExponential(2)}, offset ${((peak - truth[key]) / sigma).toFixed(2)} sigma`);
      expect(Math.abs(peak - truth[key])).toBeLessThan(2 * sigma);
    }, 600_000);
  }
});
