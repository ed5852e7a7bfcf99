/**
 * What produced a run's numbers, as label/value pairs for the report: the run and versions, the catalogue,
 * the stellar model with each band's calibration, the extinction law and R_V, the sampler's settings, the
 * seeds and the timings; the model's caveats and the priors as lists; and the resolved config as TOML.
 * A run without a fit section (a sampler test-bed) gets what its manifest has.
 */
import { stringify as toToml } from 'smol-toml';
import type { RunPosterior } from './runPosterior.js';

export interface ReportProvenance {
  items: [string, string][];
  caveats: string[];
  priors: string[];
  configToml?: string;
}

function seconds(s: number): string {
  if (!Number.isFinite(s)) return String(s);
  if (s < 60) return `${s.toFixed(s < 10 ? 1 : 0)} s`;
  const m = Math.floor(s / 60);
  return m < 60 ? `${m} min ${Math.round(s - 60 * m)} s` : `${Math.floor(m / 60)} h ${m % 60} min`;
}

export function reportProvenance(p: RunPosterior): ReportProvenance {
  const { manifest, diagnosis } = p.run;
  const fit = p.fit;
  const items: [string, string][] = [
    ['run', `${manifest.runId}, started ${manifest.createdAt}, status ${manifest.status ?? 'not recorded'}`],
    ['coeval version', `${manifest.coevalVersion} (fit)`],
  ];
  if (!fit) {
    items.push(['provenance', p.run.provenance]);
  } else {
    const m = fit.model;
    items.push(['catalogue', `${fit.catalogue.path} (${fit.catalogue.format}, ${fit.catalogue.nStars.toLocaleString('en-US')} stars after filters)`]);
    items.push(['bands fitted', fit.bands.join(', ')]);
    items.push(['stellar model', m.name]);
    items.push(['evolution', m.evolution]);
    items.push(['solar Z, [alpha/Fe]', `${m.solarZ}, ${m.alphaFe}`]);
    for (const b of fit.bands) items.push([`calibration of ${b}`, m.bands[b] ?? 'not recorded']);
    items.push(['extinction law and R_V', m.extinction]);
    const fixed = Object.entries(fit.fixed ?? {});
    if (fixed.length > 0) items.push(['fixed parameters', fixed.map(([k, v]) => `${k} = ${v}`).join(', ')]);
    if (fit.truth && Object.keys(fit.truth).length > 0) items.push(['true values (simulated catalogue)', Object.entries(fit.truth).map(([k, v]) => `${k} = ${v}`).join(', ')]);
  }
  const s = fit?.config.sampler;
  const moves = s?.moves.map((mv) => `${mv.move} (weight ${mv.weight})`).join(', ');
  items.push([
    'sampler',
    `affine-invariant ensemble sampler: ${manifest.nEnsembles} ensemble(s) x ${manifest.nWalkers} walkers, ${diagnosis.totalSteps.toLocaleString('en-US')} steps, burn-in ${diagnosis.discard.toLocaleString('en-US')} steps (${p.run.discardSource})` +
      (s ? `; moves ${moves}; stop ${s.stop === 'auto' ? `automatic (${s.tau_multiple} tau, tau changing by less than ${100 * s.tau_change}%, R-hat and ESS past the verdict's thresholds, at most ${s.steps.toLocaleString('en-US')} steps)` : `after ${s.steps.toLocaleString('en-US')} steps`}; every ${s.thin} step(s) stored; start: ${s.init}` : ''),
  ]);
  items.push(['seeds', manifest.seeds.join(', ')]);
  if (fit?.timings && Object.keys(fit.timings).length > 0) items.push(['wall-clock time', Object.entries(fit.timings).map(([k, v]) => `${k} ${seconds(v)}`).join('; ')]);
  let configToml: string | undefined;
  if (fit) {
    try {
      configToml = toToml(fit.config);
    } catch {
      configToml = JSON.stringify(fit.config, null, 2);
    }
  }
  return {
    items,
    caveats: fit ? fit.model.caveats : [],
    priors: fit ? [...fit.priors] : ['not recorded (the run was not made by coeval fit)'],
    configToml,
  };
}
