/**
 * One star's density integrates to 1 over the observed window (issue target: within 1%). Two bands, so that
 * a grid over the whole window is affordable; the window cuts the cluster sequence at both ends so that the
 * selection normalisation Z matters. Every grid point is a "star" with errors equal to the typical errors
 * the normalisation assumes (a constant law), and the field fraction is zero, so the integral tests the
 * cluster terms alone. The midpoint rule with a step of 0.4 sigma errs by at most about (h/sigma)^2/24 ~ 0.7% at
 * the window's edges and far less inside (no Monte Carlo error: the grid is deterministic).
 */
import { describe, expect, it } from 'vitest';
import { sharedFloat64 } from '../../src/catalog/types.js';
import { CmdLikelihood } from '../../src/likelihood/cmdLikelihood.js';
import type { LikelihoodOptions } from '../../src/likelihood/options.js';
import { SyntheticIsochrones, TestExtinction } from '../helpers/syntheticIsochrones.js';

const src = new SyntheticIsochrones();
const ext = new TestExtinction();
const sigma = 0.1;
const win = { B: { bright: 15.2, faint: 19.2 }, V: { bright: 14.6, faint: 18.4 } };
const step = 0.4 * sigma;

function integral(options: Partial<LikelihoodOptions>, fBinary: number, fField = 0): number {
  const nB = Math.round((win.B.faint - win.B.bright) / step);
  const nV = Math.round((win.V.faint - win.V.bright) / step);
  const hB = (win.B.faint - win.B.bright) / nB;
  const hV = (win.V.faint - win.V.bright) / nV;
  const n = nB * nV;
  const mag = [sharedFloat64(n), sharedFloat64(n)];
  const err = [sharedFloat64(n, sigma), sharedFloat64(n, sigma)];
  let k = 0;
  for (let i = 0; i < nB; i++) {
    for (let j = 0; j < nV; j++) {
      mag[0][k] = win.B.bright + (i + 0.5) * hB;
      mag[1][k] = win.V.bright + (j + 0.5) * hV;
      k++;
    }
  }
  const lik = new CmdLikelihood({ bands: ['B', 'V'], nStars: n, mag, err }, src, ext, {
    limits: win,
    errorLaw: { B: { a: sigma, b: 0, mRef: 20 }, V: { a: sigma, b: 0, mRef: 20 } },
    ...options,
  });
  const logL = lik.responsibilities({ logAgeYr: 9.9, feh: -1, dm: 12, ebv: 0.05, fBinary, fField, sigmaExtra: 0 }).logL;
  let s = 0;
  for (let i = 0; i < n; i++) s += Math.exp(logL[i]);
  console.log(`integral over the window (${JSON.stringify(options).slice(0, 60)}, f_binary ${fBinary}, f_field ${fField}): ${(s * hB * hV).toFixed(5)}`);
  return s * hB * hV;
}

describe('normalisation over the observed window', () => {
  it('singles and binaries, no completeness', () => {
    expect(Math.abs(integral({}, 0.3) - 1)).toBeLessThan(0.01);
  }, 600_000);
  it('with a completeness table', () => {
    const completeness = { band: 'V' as const, mag: [16.5, 17.8, 18.4], fraction: [1, 0.7, 0.35] };
    expect(Math.abs(integral({ completeness }, 0.3) - 1)).toBeLessThan(0.01);
  }, 600_000);
  it('the field density alone (f_field = 1), uniform and KDE of a comparison field', () => {
    expect(Math.abs(integral({}, 0.3, 1) - 1)).toBeLessThan(1e-6);
    // A comparison field with a gradient and a clump, invented for this test.
    const n = 400;
    const cmpB = new Float64Array(n);
    const cmpV = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      const u = (i + 0.5) / n;
      cmpV[i] = win.V.bright + (win.V.faint - win.V.bright) * Math.sqrt(u);
      cmpB[i] = cmpV[i] + 0.4 + 0.8 * ((i * 0.618034) % 1);
    }
    expect(Math.abs(integral({ field: { kind: 'kde', comparisonMag: [cmpB, cmpV] } }, 0.3, 1) - 1)).toBeLessThan(0.01);
  }, 600_000);
  it('binaries counted among catalogued systems, Salpeter IMF', () => {
    expect(Math.abs(integral({ binaryFractionOf: 'catalogued', imf: 'salpeter1955' }, 0.5) - 1)).toBeLessThan(0.01);
  }, 600_000);
});
