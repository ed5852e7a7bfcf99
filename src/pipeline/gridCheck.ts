/**
 * The `coeval check` step for a user grid: open and check the grid ([grid]), then check the config against
 * it before any sampling: every fitted band must be in the grid, and the priors on age and [Fe/H] must lie
 * inside the ages and metallicities the grid covers. Each error names the config file and line.
 */
import { readFileSync } from 'node:fs';
import type { BandId } from '../core/bands.js';
import { ConfigError, type Location } from '../core/errors.js';
import { configuredBands, locateKey, type LoadedConfig } from '../config/index.js';
import type { PriorConfig } from '../config/sections/priors.js';
import type { GridInfo, GridRow } from '../stellar/grid/index.js';
import type { CheckStep } from './check.js';
import { loadConfiguredGrid } from './gridModel.js';

export interface GridCheck {
  origin: string;
  name: string;
  citation: string;
  nIsochrones: number;
  bands: BandId[];
  logAge: [number, number];
  feh: [number, number];
  gaps: string[];
  /** The prior supports that were checked (log age, [Fe/H]). */
  priors: { parameter: string; support: [number, number] }[];
}

export const gridStep: CheckStep = {
  id: 'grid',
  async run(ctx) {
    const g = ctx.loaded.config.grid;
    if (!g) return undefined;
    const { buildRows, gridInfo, gridProvenance } = await import('../stellar/grid/index.js');
    const loaded = await loadConfiguredGrid(g, ctx.loaded.baseDir);
    const grid = loaded.grid;
    const info: GridInfo = gridInfo(grid);
    const rows = buildRows(grid);
    const where = (path: (string | number)[]): Location => {
      const text = ctx.loaded.file ? safeRead(ctx.loaded.file) : undefined;
      const loc = text ? locateKey(text, path) : undefined;
      return { file: ctx.loaded.file, line: loc?.line, column: loc?.column, key: path.join('.') };
    };
    const gridName = `the grid "${grid.meta.name}" (${loaded.origin})`;
    for (const b of configuredBands(ctx.loaded.config.photometry)) {
      if (!grid.bands.includes(b)) {
        throw new ConfigError(`the band ${b} is fitted, but ${gridName} has no ${b} magnitudes`, {
          where: where(['photometry', b]),
          expected: `one of the grid's bands: ${grid.bands.join(', ')}`,
          hint: 'map that band in [grid.bands] and import the grid again, or fit only bands the grid has',
        });
      }
    }
    const priors = checkPriors(ctx.loaded, rows, gridName, where);
    const prov = gridProvenance(grid);
    ctx.model = `${prov.model}: ${prov.evolution}`;
    const data: GridCheck = {
      origin: loaded.origin,
      name: grid.meta.name,
      citation: grid.meta.citation,
      nIsochrones: grid.isochrones.length,
      bands: grid.bands,
      logAge: [info.logAges[0], info.logAges[info.logAges.length - 1]],
      feh: [info.fehs[0], info.fehs[info.fehs.length - 1]],
      gaps: info.gaps,
      priors,
    };
    const warnings = [...loaded.warnings, ...info.gaps.map((x) => `grid gap: ${x}`)];
    if (!grid.meta.citation) warnings.push('the grid has no citation (grid.citation): summaries will say so');
    return { id: 'grid', title: 'grid', data, warnings };
  },
};

/** The config text, to locate a key for a message. */
function safeRead(file: string): string | undefined {
  try {
    return readFileSync(file, 'utf8');
  } catch {
    return undefined;
  }
}

/** Where a prior puts probability: [lo, hi], or undefined for an unbounded prior. */
function support(p: PriorConfig): [number, number] | undefined {
  switch (p.kind) {
    case 'uniform':
    case 'truncated_normal':
    case 'log_uniform':
      return [p.min, p.max];
    case 'fixed':
      return [p.value, p.value];
    case 'normal':
      return undefined;
  }
}

function checkPriors(loaded: LoadedConfig, rows: GridRow[], gridName: string, where: (p: (string | number)[]) => Location): GridCheck['priors'] {
  const pr = loaded.config.priors;
  const out: GridCheck['priors'] = [];
  if (!pr) return out;
  const fehLo = rows[0].feh;
  const fehHi = rows[rows.length - 1].feh;
  const fehRange = `[Fe/H] ${fmt(fehLo)} .. ${fmt(fehHi)}`;
  let fehSupport: [number, number] = [fehLo, fehHi];
  if (pr.feh) {
    const s = support(pr.feh);
    if (!s) {
      throw new ConfigError(`the prior on feh is unbounded (normal), but ${gridName} covers only ${fehRange}`, {
        where: where(['priors', 'feh']),
        expected: `a bounded prior inside ${fehRange}`,
        hint: `use truncated_normal with min >= ${fmt(fehLo)} and max <= ${fmt(fehHi)}`,
      });
    }
    if (s[0] < fehLo - 1e-6 || s[1] > fehHi + 1e-6) {
      throw new ConfigError(`the prior on feh reaches ${s[0] < fehLo ? s[0] : s[1]}, outside ${gridName}`, {
        where: where(['priors', 'feh']),
        found: { min: s[0], max: s[1] },
        expected: `a prior inside the grid's ${fehRange}`,
        hint: 'narrow the prior, or use a grid that covers these metallicities',
      });
    }
    fehSupport = s;
    out.push({ parameter: 'feh', support: s });
  }
  // The ages covered at every metallicity the prior allows: rows inside the prior's range and the rows around it.
  let lo = -Infinity;
  let hi = Infinity;
  const touched = rows.filter((r, i) => {
    const next = rows[i + 1]?.feh ?? Infinity;
    const prev = rows[i - 1]?.feh ?? -Infinity;
    return next > fehSupport[0] && prev < fehSupport[1];
  });
  for (const r of touched) {
    lo = Math.max(lo, r.logAge[0]);
    hi = Math.min(hi, r.logAge[r.logAge.length - 1]);
  }
  const ageKey = pr.log_age ? 'log_age' : pr.age_gyr ? 'age_gyr' : undefined;
  if (ageKey) {
    const p = (pr.log_age ?? pr.age_gyr)!;
    const s = support(p);
    const toLog = (x: number): number => (ageKey === 'age_gyr' ? Math.log10(x) + 9 : x);
    const ageRange = ageKey === 'age_gyr' ? `age ${fmtGyr(lo)} .. ${fmtGyr(hi)} Gyr (log age ${lo.toFixed(4)} .. ${hi.toFixed(4)})` : `log age ${lo.toFixed(4)} .. ${hi.toFixed(4)}`;
    const atFeh = `at [Fe/H] ${fmt(fehSupport[0])} .. ${fmt(fehSupport[1])}`;
    if (!s) {
      throw new ConfigError(`the prior on ${ageKey} is unbounded (normal), but ${gridName} covers only ${ageRange} ${atFeh}`, {
        where: where(['priors', ageKey]),
        expected: `a bounded prior inside ${ageRange}`,
        hint: 'use truncated_normal or uniform with bounds inside the grid',
      });
    }
    const sl: [number, number] = [toLog(s[0]), toLog(s[1])];
    if (sl[0] < lo - 1e-9 || sl[1] > hi + 1e-9) {
      throw new ConfigError(`the prior on ${ageKey} reaches ${sl[0] < lo - 1e-9 ? s[0] : s[1]}, outside the ages ${gridName} covers ${atFeh}`, {
        where: where(['priors', ageKey]),
        found: { min: s[0], max: s[1] },
        expected: `a prior inside ${ageRange}`,
        hint: 'narrow the prior, or use a grid that covers these ages at every metallicity the [Fe/H] prior allows',
      });
    }
    out.push({ parameter: 'log_age', support: sl });
  }
  return out;
}

/** Enough digits to type back a grid value exactly (a prior on a node must match it). */
function fmt(x: number): string {
  return String(Number(x.toPrecision(10)));
}

function fmtGyr(logAge: number): string {
  return (10 ** (logAge - 9)).toPrecision(4);
}
