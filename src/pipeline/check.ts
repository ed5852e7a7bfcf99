/**
 * `check`: validate a config and everything it points at, without fitting, and summarise what was found.
 * The check is a list of steps, each producing one section of the report; a step throws a CoevalError
 * (located, with its exit code) when something is wrong, and adds warnings when something only looks wrong.
 * Later stages add their own steps (stellar grid, prior ranges) by appending to CHECK_STEPS or passing a
 * list to `checkConfig`.
 */
import type { Catalog } from '../catalog/index.js';
import { configuredBands, type LoadedConfig } from '../config/index.js';
import { summarizeCatalogue, type CatalogueSummary } from './catalogueSummary.js';
import { gridStep } from './gridCheck.js';

export interface CheckSection {
  /** Stable key for JSON output, e.g. `catalogue`. */
  id: string;
  title: string;
  /** Machine-readable findings. */
  data: unknown;
  warnings: string[];
}

/** Shared between steps: what earlier steps produced (the catalogue, later the model). */
export interface CheckContext {
  loaded: LoadedConfig;
  catalog?: Catalog;
  /** Which stellar model the check used, with its provenance, once a step has opened one. */
  model?: string;
}

export interface CheckStep {
  id: string;
  /** Returns undefined when the step has nothing to check for this config (e.g. no [grid] section). */
  run(ctx: CheckContext): Promise<CheckSection | undefined>;
}

export interface CheckReport {
  config?: string;
  overrides: string[];
  sections: CheckSection[];
  warnings: number;
  /** Which stellar model and calibration the check used (none, for the catalogue-only check). */
  model: string;
}

export const configStep: CheckStep = {
  id: 'config',
  async run({ loaded }) {
    const c = loaded.config;
    return {
      id: 'config',
      title: 'config',
      data: { file: loaded.file, sections: Object.keys(c), bands: configuredBands(c.photometry), overrides: loaded.overrides },
      warnings: [],
    };
  },
};

export const catalogueStep: CheckStep = {
  id: 'catalogue',
  async run(ctx) {
    const { readConfiguredCatalog } = await import('../catalog/index.js');
    ctx.catalog = await readConfiguredCatalog(ctx.loaded);
    const summary: CatalogueSummary = summarizeCatalogue(ctx.catalog, ctx.loaded.config);
    return { id: 'catalogue', title: 'catalogue', data: summary, warnings: summary.warnings };
  },
};

/** The steps `coeval check` runs, in order. */
export const CHECK_STEPS: CheckStep[] = [configStep, catalogueStep, gridStep];

export async function checkConfig(loaded: LoadedConfig, steps: readonly CheckStep[] = CHECK_STEPS): Promise<CheckReport> {
  const ctx: CheckContext = { loaded };
  const sections: CheckSection[] = [];
  for (const step of steps) {
    const section = await step.run(ctx);
    if (section) sections.push(section);
  }
  return {
    config: loaded.file,
    overrides: loaded.overrides,
    sections,
    warnings: sections.reduce((n, s) => n + s.warnings.length, 0),
    model: ctx.model ?? 'none (this check reads only the config and the catalogue; no stellar model or photometric calibration is involved)',
  };
}
