/**
 * Write a synthetic fit-shaped run directory (scripts/fitRunFixture.ts) to look at plots and reports:
 *   npm run build && node dist/scripts/make-fit-run.js DIR [N_STARS]
 */
import { writeFitRunFixture } from './fitRunFixture.js';

const [dir, n] = process.argv.slice(2);
if (!dir) {
  console.error('usage: node dist/scripts/make-fit-run.js DIR [N_STARS]');
  process.exit(2);
}
const path = writeFitRunFixture(dir, {
  nStars: Number(n ?? 3000),
  posterior: {
    log_age: { mean: 10.08, sd: 0.02 },
    feh: { mean: -1.4, sd: 0.05 },
    dm: { mean: 14.6, sd: 0.03 },
    ebv: { mean: 0.06, sd: 0.008 },
    f_binary: { mean: 0.25, sd: 0.03 },
    f_field: { mean: 0.15, sd: 0.01 },
  },
  fixed: { sigma_extra: 0 },
  nSteps: 1500,
  nWalkers: 24,
  nEnsembles: 4,
});
console.log(path);
