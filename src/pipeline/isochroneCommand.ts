import { writeFileSync } from 'node:fs';
import type { Vector } from 'apache-arrow';
import { extname } from 'node:path';
import { isBandId, type BandId } from '../core/bands.js';
import { writeFileAtomic } from '../core/atomicWrite.js';
import { UsageError } from '../core/errors.js';
import { svgToPng } from '../report/render.js';
import { builtinModel, extinctionModel, type ExtinctionLaw } from '../stellar/index.js';
import { isochronePlotSvg, parseCmdAxes } from './isochronePlot.js';
import { isochroneCsv, isochroneTable, PHASE_LABELS, type IsochroneTable } from './isochroneTable.js';

export interface IsochroneCommandArgs {
  age?: number;
  logAge?: number;
  feh: number;
  bands: string;
  dm: number;
  ebv: number;
  alphaFe: number;
  law: ExtinctionLaw;
  rv: number;
  format: 'csv' | 'json' | 'arrow';
  out?: string;
  plot?: string;
  plotColour?: string;
  plotMag?: string;
}

interface Printer {
  result(text: string): void;
  info(text: string): void;
}

export async function runIsochroneCommand(a: IsochroneCommandArgs, out: Printer): Promise<number> {
  if ((a.age === undefined) === (a.logAge === undefined)) {
    throw new UsageError('give the age once: --age (Gyr) or --log-age (log10 yr)', { hint: 'e.g. coeval isochrone --age 12 --feh -1.5' });
  }
  if (a.age !== undefined && !(a.age > 0)) throw new UsageError('--age must be positive (Gyr)', { found: a.age });
  const logAgeYr = a.logAge ?? Math.log10(a.age as number) + 9;
  const bands = a.bands.split(',').map((b) => b.trim());
  for (const b of bands) {
    if (!isBandId(b)) throw new UsageError(`unknown band "${b}" in --bands`, { expected: 'bands among U B V R I G BP RP J H Ks' });
  }
  const source = builtinModel({ alphaFe: a.alphaFe });
  const extinction = extinctionModel({ law: a.law, rv: a.rv });
  const table = isochroneTable(source, extinction, { logAgeYr, feh: a.feh, bands: bands as BandId[], dm: a.dm, ebv: a.ebv });

  if (a.format === 'arrow' && !a.out) throw new UsageError('--format arrow writes a binary file: give --out FILE');
  const body = a.format === 'csv' ? isochroneCsv(table, extinction.provenance) : a.format === 'json' ? isochroneJson(table, extinction.provenance) : await isochroneArrow(table, extinction.provenance);
  if (a.out) {
    writeFileAtomic(a.out, body);
    out.info(`wrote ${table.isochrone.massInitial.length} nodes to ${a.out}`);
  } else {
    out.result(body as string);
  }

  if (a.plot) {
    const axes = parseCmdAxes(a.plotColour ?? `${bands[0]}-${bands[1] ?? bands[0]}`, a.plotMag ?? bands[1] ?? bands[0], bands as BandId[]);
    const svg = await isochronePlotSvg(table, axes);
    const ext = extname(a.plot).toLowerCase();
    if (ext === '.png') writeFileSync(a.plot, await svgToPng(svg));
    else if (ext === '.svg') writeFileAtomic(a.plot, svg);
    else throw new UsageError(`--plot must end in .svg or .png`, { found: a.plot });
    out.info(`wrote the CMD to ${a.plot}`);
  }
  return 0;
}

function isochroneJson(t: IsochroneTable, extinctionProvenance: string): string {
  const iso = t.isochrone;
  return JSON.stringify(
    {
      logAgeYr: iso.logAgeYr,
      feh: iso.feh,
      apparent: t.apparent,
      dm: t.dm,
      ebv: t.ebv,
      provenance: { ...iso.provenance, extinction: t.apparent ? extinctionProvenance : undefined },
      columns: {
        mass_initial: Array.from(iso.massInitial),
        mass_current: Array.from(iso.massCurrent),
        phase: Array.from(iso.phase, (p) => PHASE_LABELS[p] ?? String(p)),
        phase_coord: Array.from(iso.phaseCoord),
        log_l: Array.from(iso.logL),
        log_teff: Array.from(iso.logTeff),
        log_g: Array.from(iso.logg),
        ...Object.fromEntries(iso.bands.map((b, i) => [b, Array.from(t.mags[i])])),
      },
    },
    null,
    1,
  );
}

async function isochroneArrow(t: IsochroneTable, extinctionProvenance: string): Promise<Uint8Array> {
  const arrow = await import('apache-arrow');
  const iso = t.isochrone;
  const cols: Record<string, Vector> = {
    mass_initial: arrow.makeVector(iso.massInitial),
    mass_current: arrow.makeVector(iso.massCurrent),
    phase: arrow.makeVector(iso.phase),
    phase_coord: arrow.makeVector(iso.phaseCoord),
    log_l: arrow.makeVector(iso.logL),
    log_teff: arrow.makeVector(iso.logTeff),
    log_g: arrow.makeVector(iso.logg),
  };
  iso.bands.forEach((b, i) => (cols[b] = arrow.makeVector(t.mags[i])));
  const table = new arrow.Table(cols);
  table.schema.metadata.set('coeval.isochrone', JSON.stringify({ logAgeYr: iso.logAgeYr, feh: iso.feh, apparent: t.apparent, dm: t.dm, ebv: t.ebv }));
  table.schema.metadata.set('coeval.provenance', JSON.stringify({ ...iso.provenance, extinction: t.apparent ? extinctionProvenance : undefined }));
  return arrow.tableToIPC(table, 'file');
}
