/**
 * Built-in stellar model: build time of one isochrone in 3 bands (target <= 0.5 ms, issue 3), with
 * references measured in the same run: the same build with the per-Z cache cleared before each call;
 * builds whose [Fe/H] changes at every call (what a sampler that moves [Fe/H] without a grid would see);
 * and a fixed arithmetic workload (10^6 exp and log), which shows how fast this machine is right now, so
 * that the isochrone times can be read against it on a shared machine. The minimum over repeats is
 * recorded too: on a loaded machine it is the better estimate of the build's own cost.
 * Photometry is the built-in calibration (B, V, I); a stand-in that returns M_bol in every band gives the
 * evolution-only cost as a further reference.
 */
import type { BandId } from '../src/core/bands.js';
import { clearEvolutionCache } from '../src/stellar/evolution/model.js';
import { isochrone, lastBuildStats } from '../src/stellar/isochrone/isochrone.js';
import type { PhotometryModel } from '../src/stellar/types.js';
import { builtinPhotometry } from '../src/stellar/photometry/index.js';
import { medianMs, timeRepeated, type BenchGroup } from './harness.js';

const BANDS: readonly BandId[] = ['B', 'V', 'I'];

const bolometric: PhotometryModel = {
  bands: BANDS,
  provenance: {},
  absoluteMagnitudes(bands, logL, _t, _g, _f, out, n) {
    for (let b = 0; b < bands.length; b++) for (let k = 0; k < n; k++) out[b][k] = 4.74 - 2.5 * logL[k];
  },
};

export const stellarBench: BenchGroup = {
  name: 'stellar',
  describe: 'built-in isochrone build time (B, V, I with the built-in photometry; 12 Gyr [Fe/H] = -1.5, and 1 Gyr solar)',
  async run(ctx) {
    const opts = { photometry: builtinPhotometry(), bands: BANDS };
    const standIn = { photometry: bolometric, bands: BANDS };
    const logAgeOld = Math.log10(12e9);
    // Warm up the JIT on a spread of ages and metallicities.
    for (let i = 0; i < 60; i++) isochrone(8 + (i % 11) * 0.2, -2.2 + (i % 7) * 0.35, opts);
    let k = 0;
    // Age moves by 1e-6 dex per call, so that no call can be served from anything but the per-Z cache.
    const warmOld = medianMs(timeRepeated(() => isochrone(logAgeOld + 1e-6 * k++, -1.5, opts), 101));
    const coldOld = medianMs(
      timeRepeated(() => {
        clearEvolutionCache();
        isochrone(logAgeOld + 1e-6 * k++, -1.5, opts);
      }, 101),
    );
    const movingFeh = medianMs(timeRepeated(() => isochrone(logAgeOld, -1.5 + 1e-4 * (k++ % 1000), opts), 101));
    const warmYoung = medianMs(timeRepeated(() => isochrone(9 + 1e-6 * k++, 0, opts), 101));
    const minOld = Math.min(...timeRepeated(() => isochrone(logAgeOld + 1e-6 * k++, -1.5, opts), 101));
    for (let i = 0; i < 20; i++) isochrone(logAgeOld, -1.5, standIn);
    const evolutionOnly = medianMs(timeRepeated(() => isochrone(logAgeOld + 1e-6 * k++, -1.5, standIn), 101));
    const nodesOld = isochrone(logAgeOld, -1.5, opts).massInitial.length;
    const exactOld = lastBuildStats.exactEvaluations;
    const nodesYoung = isochrone(9, 0, opts).massInitial.length;
    let sink = 0;
    const workload = medianMs(
      timeRepeated(() => {
        for (let i = 1; i <= 1e6; i++) sink += Math.exp(-i * 1e-6) + Math.log(i);
      }, 11),
    );
    const note = 'machine shared with other jobs: timings are noisy';
    ctx.record({ name: 'isochrone, 12 Gyr [Fe/H]=-1.5, 3 bands, median of 101', value: warmOld, unit: 'ms', target: { op: '<=', value: 0.5 }, reference: { name: 'per-Z cache cleared before each call', value: coldOld }, note });
    ctx.record({ name: 'same, minimum of 101', value: minOld, unit: 'ms', target: { op: '<=', value: 0.5 }, reference: { name: '10^6 exp + log on this machine now', value: workload }, note: sink > 0 ? note : '' });
    ctx.record({ name: 'same, [Fe/H] different at every call', value: movingFeh, unit: 'ms', reference: { name: 'fixed [Fe/H]', value: warmOld }, note });
    ctx.record({ name: 'same, M_bol stand-in photometry (evolution and node placement only)', value: evolutionOnly, unit: 'ms', reference: { name: 'built-in photometry', value: warmOld }, note });
    ctx.record({ name: 'isochrone, 1 Gyr [Fe/H]=0, 3 bands, median of 101', value: warmYoung, unit: 'ms', target: { op: '<=', value: 0.5 }, note });
    ctx.record({ name: 'nodes, 12 Gyr [Fe/H]=-1.5', value: nodesOld, unit: 'nodes' });
    ctx.record({ name: 'exact star evaluations behind the phase curves, 12 Gyr [Fe/H]=-1.5', value: exactOld, unit: 'evaluations' });
    ctx.record({ name: 'nodes, 1 Gyr [Fe/H]=0', value: nodesYoung, unit: 'nodes' });
  },
};
