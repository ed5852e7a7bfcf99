/**
 * The likelihood peaks at the truth: on a catalogue drawn from the model with known parameters (fixed seed),
 * each 1-D slice through the truth peaks within 2 sigma of it, sigma being the slice's own width from its
 * curvature at the peak (sigma = 1/sqrt(-d2 logL/dx2)). For a correct likelihood the peak of a conditional
 * slice is distributed about the truth with that sigma, so each parameter passes with probability about
 * 95%; with 7 parameters one 2-sigma miss in a few seeds is expected, which is why a failure here should
 * be read against the printed offsets. The catalogue includes binaries, field stars, a missing band for some
 * stars, colour-dependent extinction and parallaxes, so every term of the model is exercised.
 */
import { describe, expect, it } from 'vitest';
import { CmdLikelihood } from '../../src/likelihood/cmdLikelihood.js';
import { simulateCatalog } from '../../src/likelihood/simulate.js';
import type { ClusterParameters } from '../../src/likelihood/theta.js';
import { SyntheticIsochrones, TestExtinction } from '../helpers/syntheticIsochrones.js';

const src = new SyntheticIsochrones();
const ext = new TestExtinction(0.5);
const limits = { B: { bright: 10, faint: 21.5 }, V: { bright: 10, faint: 21 }, I: { bright: 9, faint: 20.5 } };
const errorLaw = { B: { a: 0.008, b: 0.05, mRef: 21.5 }, V: { a: 0.008, b: 0.05, mRef: 21 }, I: { a: 0.008, b: 0.05, mRef: 20.5 } };
const truth: ClusterParameters = { logAgeYr: 9.85, feh: -0.8, dm: 12.5, ebv: 0.12, fBinary: 0.3, fField: 0.15, sigmaExtra: 0.02 };

const sim = simulateCatalog(
  {
    seed: 2024,
    nStars: 2500,
    bands: ['B', 'V', 'I'],
    theta: truth,
    errorLaw,
    likelihood: { limits },
    missingFraction: { B: 0.05 },
    parallax: { errorMas: 0.05, fieldMeanMas: 0.6, fieldSdMas: 0.5 },
  },
  src,
  ext,
);
const lik = new CmdLikelihood(sim.catalog, src, ext, { limits });

/** Peak and width of the slice through `truth` along parameter `key`, by successive parabolas. */
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

describe('1-D slices through the truth', () => {
  const steps: [keyof ClusterParameters, number][] = [
    ['logAgeYr', 0.01],
    ['feh', 0.02],
    ['dm', 0.01],
    ['ebv', 0.005],
    ['fBinary', 0.02],
    ['fField', 0.01],
    ['sigmaExtra', 0.001],
  ];
  for (const [key, step] of steps) {
    it(`${key} peaks within 2 sigma of the truth`, () => {
      const { peak, sigma } = slice(key, step);
      console.log(`${key}: truth ${truth[key]}, peak ${peak.toFixed(5)}, sigma ${sigma.toExponential(2)}, offset ${((peak - truth[key]) / sigma).toFixed(2)} sigma`);
      expect(Math.abs(peak - truth[key])).toBeLessThan(2 * sigma);
    }, 600_000);
  }
});
