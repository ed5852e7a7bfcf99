import type { BandId } from '../core/bands.js';
import { ModelError } from '../core/errors.js';
import type { ExtinctionModel, Isochrone, IsochroneSource } from '../stellar/index.js';
import { Phase } from '../stellar/index.js';

/** An isochrone made ready to print or plot: magnitudes absolute, or apparent when dm/ebv are given. */
export interface IsochroneTable {
  isochrone: Isochrone;
  /** mags[b][k]: magnitude of node k in band b, including dm and A_b when requested. */
  mags: Float64Array[];
  apparent: boolean;
  dm: number;
  ebv: number;
}

export const PHASE_LABELS: Record<number, string> = {
  [Phase.MainSequence]: 'main_sequence',
  [Phase.HertzsprungGap]: 'hertzsprung_gap',
  [Phase.GiantBranch]: 'giant_branch',
  [Phase.CoreHeliumBurning]: 'core_helium_burning',
  [Phase.EarlyAGB]: 'early_agb',
  [Phase.ThermallyPulsingAGB]: 'tp_agb',
};

export function isochroneTable(
  source: IsochroneSource,
  extinction: ExtinctionModel,
  req: { logAgeYr: number; feh: number; bands: BandId[]; dm?: number; ebv?: number },
): IsochroneTable {
  const iso = source.isochrone(req.logAgeYr, req.feh, { bands: req.bands });
  if (!iso) {
    const d = source.domain;
    throw new ModelError(`the stellar model has no isochrone at log age ${req.logAgeYr}, [Fe/H] ${req.feh}`, {
      expected: `log age in [${d.logAgeYr[0]}, ${d.logAgeYr[1]}] and [Fe/H] in [${d.feh[0]}, ${d.feh[1]}]`,
      hint: 'choose an age and metallicity inside the model\'s range',
    });
  }
  const n = iso.massInitial.length;
  const dm = req.dm ?? 0;
  const ebv = req.ebv ?? 0;
  const mags = iso.absMag.map((m) => Float64Array.from(m));
  if (dm !== 0 || ebv !== 0) {
    const ratios = req.bands.map(() => new Float64Array(n));
    extinction.ratios(req.bands, iso.logTeff, iso.logg, req.feh, ratios, n);
    for (let b = 0; b < mags.length; b++) for (let k = 0; k < n; k++) mags[b][k] += dm + ratios[b][k] * ebv;
  }
  return { isochrone: iso, mags, apparent: dm !== 0 || ebv !== 0, dm, ebv };
}

/** CSV with the provenance as `#` comment lines above the header. */
export function isochroneCsv(t: IsochroneTable, extinctionProvenance: string): string {
  const iso = t.isochrone;
  const p = iso.provenance;
  const lines = [
    `# coeval isochrone: log10(age/yr) = ${iso.logAgeYr}, [Fe/H] = ${iso.feh}`,
    `# model: ${p.model}`,
    `# evolution: ${p.evolution}`,
    `# solar Z of the model: ${p.solarZ}; [alpha/Fe] = ${p.alphaFe}`,
    ...iso.bands.map((b) => `# band ${b}: ${p.bands[b] ?? 'no provenance recorded'}`),
    t.apparent ? `# magnitudes are apparent: distance modulus ${t.dm}, E(B-V) ${t.ebv}; extinction: ${extinctionProvenance}` : '# magnitudes are absolute and unreddened',
    ...p.caveats.map((c) => `# caveat: ${c}`),
  ];
  lines.push(['mass_initial', 'mass_current', 'phase', 'phase_coord', 'log_l', 'log_teff', 'log_g', ...iso.bands].join(','));
  for (let k = 0; k < iso.massInitial.length; k++) {
    lines.push(
      [
        iso.massInitial[k].toPrecision(8),
        iso.massCurrent[k].toPrecision(8),
        PHASE_LABELS[iso.phase[k]] ?? String(iso.phase[k]),
        iso.phaseCoord[k].toFixed(6),
        iso.logL[k].toFixed(5),
        iso.logTeff[k].toFixed(5),
        iso.logg[k].toFixed(4),
        ...t.mags.map((m) => m[k].toFixed(4)),
      ].join(','),
    );
  }
  return `${lines.join('\n')}\n`;
}
