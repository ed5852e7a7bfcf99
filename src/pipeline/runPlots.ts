/**
 * The figures of a run directory: built from the chains, the per-star results and the manifest, rendered
 * to SVG (and PNG on request), and written to plots/<name>.svg. `coeval plot` and `coeval report` both
 * use `buildRunFigures`; the report inlines the SVGs instead of linking the files.
 */
import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { writeFileAtomic } from '../core/atomicWrite.js';
import { InputError, UsageError } from '../core/errors.js';
import { readStarsTable, RUN_LAYOUT, type StarsTable } from '../io/index.js';
import { renderSvg, svgToPng } from '../report/render.js';
import { cmdAxesFor } from './figures/cmdAxes.js';
import { cmdFigure } from './figures/cmdFigure.js';
import { cornerFigure } from './figures/cornerFigure.js';
import { FIGURE_NAMES, type FigureName, type RunFigure } from './figures/runFigure.js';
import { runStellarSetup } from './figures/runStellarSetup.js';
import { tauFigure } from './figures/tauFigure.js';
import { traceFigure } from './figures/traceFigure.js';
import { openRunPosterior, type RunPosterior } from './runPosterior.js';

export interface RunFigureOptions {
  /** Figures to make; default: every one the run has the data for. */
  which?: readonly FigureName[];
  /** CMD axes, e.g. colour "B-V" and magnitude "V"; default from the fitted bands (figures/cmdAxes.ts). */
  colour?: string;
  mag?: string;
  /** Burn-in in steps; default: suggested from tau, as `coeval diagnose` does. */
  discard?: number;
  /** Posterior draws whose isochrones are drawn in the CMD. */
  nIsochrones?: number;
  /** Most stars drawn per CMD panel (crowded regions are thinned; see report/plots/thinPoints.ts). */
  maxPoints?: number;
  /** Seed for the choice of draws, of the stars drawn, and of the posterior-predictive catalogue. */
  seed?: number;
  /** Most stars in the posterior-predictive catalogue (simulating costs about 0.15 ms a star). */
  ppcStars?: number;
}

export const FIGURE_DEFAULTS = { nIsochrones: 80, maxPoints: 5000, seed: 1, ppcStars: 50000 } as const;

export interface RenderedFigure extends Omit<RunFigure, 'spec'> {
  svg: string;
}

export interface RunFigures {
  posterior: RunPosterior;
  figures: RenderedFigure[];
  /** Figures not made, and why (only when they were not asked for by name). */
  skipped: { name: FigureName; reason: string }[];
}

/** Parse `--which corner,cmd` (names checked). */
export function parseWhich(text: string | undefined): FigureName[] | undefined {
  if (text === undefined || text.trim() === '') return undefined;
  const names = text.split(',').map((s) => s.trim()).filter(Boolean);
  const bad = names.filter((n) => !(FIGURE_NAMES as readonly string[]).includes(n));
  if (bad.length > 0) throw new UsageError(`unknown figure ${bad.map((b) => `"${b}"`).join(', ')}`, { expected: `names among ${FIGURE_NAMES.join(', ')}, separated by commas` });
  return FIGURE_NAMES.filter((n) => names.includes(n));
}

function checkWhole(name: string, v: number | undefined, min: number): void {
  if (v !== undefined && !(Number.isInteger(v) && v >= min && v <= 0xffffffff)) throw new UsageError(`--${name} must be a whole number >= ${min}, got ${v}`);
}

export async function buildRunFigures(runDir: string, o: RunFigureOptions = {}): Promise<RunFigures> {
  checkWhole('seed', o.seed, 1);
  checkWhole('isochrones', o.nIsochrones, 0);
  checkWhole('max-points', o.maxPoints, 100);
  checkWhole('ppc-stars', o.ppcStars, 100);
  const p = openRunPosterior(runDir, { discard: o.discard });
  const asked = o.which;
  const wanted = asked ?? FIGURE_NAMES;
  const skipped: RunFigures['skipped'] = [];
  const stars = wanted.includes('cmd') || wanted.includes('ppc') ? await readStarsTable(p.run.runDir) : undefined;
  const cmdMissing = !p.fit ? 'the run was not made by `coeval fit` (manifest.json has no fit section)' : !stars ? `the run has no ${RUN_LAYOUT.stars}` : undefined;
  const figures: RunFigure[] = [];
  let setup;
  for (const name of wanted) {
    if ((name === 'cmd' || name === 'ppc') && cmdMissing) {
      if (asked) throw new UsageError(`cannot draw the ${name} figure: ${cmdMissing}`, { where: { file: p.run.runDir }, hint: 'ask for corner, trace or tau only' });
      skipped.push({ name, reason: cmdMissing });
      continue;
    }
    switch (name) {
      case 'corner':
        figures.push(cornerFigure(p));
        break;
      case 'trace':
        figures.push(traceFigure(p));
        break;
      case 'tau':
        figures.push(tauFigure(p));
        break;
      case 'cmd':
      case 'ppc': {
        const fit = p.fit!;
        const axes = cmdAxesFor(fit.bands, o.colour, o.mag);
        const lacking = [axes.blue, axes.red, axes.mag].filter((b) => !(stars as StarsTable).bands.includes(b));
        if (lacking.length > 0) {
          throw new InputError(`${RUN_LAYOUT.stars} has no magnitudes in ${[...new Set(lacking)].join(', ')}`, {
            where: { file: (stars as StarsTable).path },
            expected: `a column per fitted band (${fit.bands.join(', ')})`,
            hint: 'run the fit again, or choose other bands with --colour and --mag',
          });
        }
        setup ??= await runStellarSetup(fit);
        const common = { axes, seed: o.seed ?? FIGURE_DEFAULTS.seed, maxPoints: o.maxPoints ?? FIGURE_DEFAULTS.maxPoints };
        if (name === 'cmd') figures.push(cmdFigure(p, stars as StarsTable, setup, { ...common, nIsochrones: o.nIsochrones ?? FIGURE_DEFAULTS.nIsochrones }));
        else {
          const { ppcFigure } = await import('./figures/ppcFigure.js');
          figures.push(ppcFigure(p, stars as StarsTable, setup, { ...common, maxStars: o.ppcStars ?? FIGURE_DEFAULTS.ppcStars }));
        }
        break;
      }
    }
  }
  const rendered: RenderedFigure[] = [];
  for (const f of figures) rendered.push({ name: f.name, title: f.title, caption: f.caption, svg: await renderSvg(f.spec) });
  return { posterior: p, figures: rendered, skipped };
}

export interface WrittenPlot {
  name: FigureName;
  svgPath: string;
  pngPath?: string;
}

/** `coeval plot`: write plots/<name>.svg, and .png with `png`. */
export async function plotRun(runDir: string, o: RunFigureOptions & { png?: boolean; pngScale?: number } = {}): Promise<{ written: WrittenPlot[]; skipped: RunFigures['skipped']; runDir: string }> {
  const r = await buildRunFigures(runDir, o);
  const dir = join(r.posterior.run.runDir, RUN_LAYOUT.plotsDir);
  mkdirSync(dir, { recursive: true });
  const written: WrittenPlot[] = [];
  for (const f of r.figures) {
    const svgPath = join(dir, `${f.name}.svg`);
    writeFileAtomic(svgPath, f.svg);
    const w: WrittenPlot = { name: f.name, svgPath };
    if (o.png) {
      w.pngPath = join(dir, `${f.name}.png`);
      writeFileAtomic(w.pngPath, await svgToPng(f.svg, o.pngScale ?? 2));
    }
    written.push(w);
  }
  return { written, skipped: r.skipped, runDir: r.posterior.run.runDir };
}
