/**
 * Plots and the HTML report of a run directory: a fit-shaped run (scripts/fitRunFixture.ts: a manifest
 * with a fit section for the built-in model, AR(1) chains, a synthetic stars.arrow) and a sampler test-bed
 * run without a fit section. The CLI commands run once each.
 */
import { existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { writeAr1Run } from '../../scripts/ar1Run.js';
import { writeFitRunFixture } from '../../scripts/fitRunFixture.js';
import { readManifest } from '../../src/io/index.js';
import { defaultCmdAxes } from '../../src/pipeline/figures/cmdAxes.js';
import { posteriorPredictiveCatalogue } from '../../src/pipeline/posteriorPredictive.js';
import { buildRunFigures, plotRun } from '../../src/pipeline/runPlots.js';
import { runStellarSetup } from '../../src/pipeline/figures/runStellarSetup.js';
import { readStarsTable } from '../../src/io/index.js';
import { reportContent, reportRun } from '../../src/pipeline/runReport.js';
import { summaryTable } from '../../src/report/summaryFormats.js';
import { expectUserError, runCli } from '../helpers/cli.js';

const dir = mkdtempSync(join(tmpdir(), 'coeval-plots-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const N_STARS = 1500;
const fitRun = writeFitRunFixture(join(dir, 'fit'), {
  nStars: N_STARS,
  posterior: {
    log_age: { mean: 10.05, sd: 0.02 },
    feh: { mean: -1.3, sd: 0.05 },
    dm: { mean: 14.5, sd: 0.03 },
    ebv: { mean: 0.05, sd: 0.01 },
    f_binary: { mean: 0.25, sd: 0.03 },
  },
  fixed: { f_field: 0.15, sigma_extra: 0 },
  nSteps: 400,
  nWalkers: 12,
  nEnsembles: 2,
});
const testbedRun = writeAr1Run(join(dir, 'testbed'), {
  parameters: [
    { name: 'x0', label: 'x0', unit: '' },
    { name: 'x1', label: 'x1', unit: '' },
  ],
  mean: [1, 2],
  sd: [0.5, 1],
  rho: 0.5,
  nWalkers: 8,
  nEnsembles: 2,
  nSteps: 300,
  seed: 4,
});
const MODEL = readManifest(fitRun).provenance!.model;

/** The text of every <text> element (and its <tspan> lines), joined by spaces: titles wrap over lines. */
function svgText(svg: string): string {
  return [...svg.matchAll(/<text[^>]*>(.*?)<\/text>/g)].map((m) => m[1].replace(/<[^>]+>/g, ' ').replace(/&amp;/g, '&')).join(' ').replace(/\s+/g, ' ');
}

describe('figures of a fit run', async () => {
  const r = await buildRunFigures(fitRun, { maxPoints: 1000, nIsochrones: 20 });
  const fig = (name: string): string => r.figures.find((f) => f.name === name)?.svg ?? '';

  it('makes every figure the run has data for, each a plain SVG', () => {
    expect(r.figures.map((f) => f.name)).toEqual(['corner', 'trace', 'tau', 'cmd', 'ppc']);
    expect(r.skipped).toEqual([]);
    for (const f of r.figures) {
      expect(f.svg.startsWith('<svg'), f.name).toBe(true);
      expect(f.svg.trimEnd().endsWith('</svg>'), f.name).toBe(true);
      expect(f.caption.length, f.name).toBeGreaterThan(80);
    }
  });

  it('corner: every parameter on an axis, the summary numbers above the diagonal, the truth marked', () => {
    const text = svgText(fig('corner'));
    for (const label of ['log10(age / yr)', '[Fe/H]', '(m-M)_0 (mag)', 'E(B-V) (mag)', 'binary fraction']) expect(text).toContain(label);
    const s = summaryTable(r.posterior.run.summary);
    // The quoted median of log age is the summary's, with its decimals.
    expect(text).toContain(`log10(age / yr) = ${s.rows[0][2]}`);
    expect(fig('corner')).toMatch(/fill="#D55E00"/);
  });

  it('trace: a panel per parameter, coloured by ensemble, with the burn-in line', () => {
    const text = svgText(fig('trace'));
    expect(text).toContain('ensemble');
    expect(text).toContain('step');
    expect(fig('trace')).toMatch(/stroke-dasharray="4,3"/);
  });

  it('tau: the 50 tau guide, labelled', () => {
    const text = svgText(fig('tau'));
    expect(text).toContain('τ = N / 50');
    expect(text).toContain('steps after the burn-in (N)');
  });

  it('CMD: B-V against V, magnitudes reversed, the stellar model named, the stars thinned to the limit', () => {
    expect(defaultCmdAxes(['B', 'V', 'I'])).toEqual({ blue: 'B', red: 'V', mag: 'V' });
    const svg = fig('cmd');
    const text = svgText(svg);
    expect(text).toContain('B − V');
    expect(text).toContain('P(member)');
    expect(text.replace(/\s+/g, ' ')).toContain(`stellar model: ${MODEL}`);
    // Bright at the top: the tick label 13 sits above (smaller y) the tick label 22.
    const tickY = (label: string): number => Number(new RegExp(`translate\\(-?[\\d.]+,([\\d.]+)\\)"[^>]*>${label}<`).exec(svg)?.[1] ?? NaN);
    expect(tickY('13')).toBeLessThan(tickY('22'));
    const caption = r.figures.find((f) => f.name === 'cmd')!.caption;
    // One square per star drawn, as many as the caption says.
    const squares = (svg.match(/<path transform="translate\([^"]*\)" d="M-[\d.]+,-[\d.]+h/g) ?? []).length;
    expect(caption).toContain(`(${squares.toLocaleString('en-US')} of `);
    // The fixture's field spreads wider in colour than its members: the axes follow the members.
    expect(caption).toMatch(/\(\d[\d,]* of \d[\d,]* stars drawn: .*; \d[\d,]* stars lie beyond the colour range of the likely members/);
    expect(caption).toContain(MODEL);
  });

  it('PPC: the observed and a simulated CMD side by side, on the same axes', () => {
    const svg = fig('ppc');
    const text = svgText(svg);
    expect(text).toContain('observed (1,500 stars)');
    expect(text).toContain('simulated from the posterior (1,500 stars)');
    expect(text.replace(/\s+/g, ' ')).toContain(`stellar model: ${MODEL}`);
    // Both panels carry the same tick labels on both axes.
    const ticks = [...svg.matchAll(/>(\d+(?:\.\d+)?)<\/text>/g)].map((m) => m[1]);
    for (const t of ['14', '18', '22']) expect(ticks.filter((x) => x === t).length, t).toBe(2);
    const colourTicks = ticks.filter((x) => x.includes('.'));
    expect(colourTicks.length).toBeGreaterThanOrEqual(6);
    for (const t of colourTicks) expect(colourTicks.filter((x) => x === t).length, t).toBe(2);
  });

  it('PPC catalogue: as many stars as observed, split over the draws, with the expected field share', async () => {
    const stars = (await readStarsTable(fitRun))!;
    const setup = await runStellarSetup(r.posterior.fit!);
    const sim = posteriorPredictiveCatalogue(r.posterior, stars, setup, { seed: 3, nDraws: 7 });
    expect(sim.nStars).toBe(N_STARS);
    expect(sim.nDraws).toBe(7);
    for (const m of sim.mag) expect(m.length).toBe(N_STARS);
    // The fixture has no membership priors and f_field fixed at 0.15: the field count is binomial(1500, 0.15),
    // sd sqrt(1500 x 0.15 x 0.85) = 13.8; 4 sd.
    const nField = sim.component.reduce((s, c) => s + (c === 2 ? 1 : 0), 0);
    expect(Math.abs(nField - 0.15 * N_STARS)).toBeLessThan(4 * Math.sqrt(N_STARS * 0.15 * 0.85));
    // Every simulated magnitude lies in the window (the catalogue's own range in each band).
    sim.bands.forEach((b, k) => {
      const obs = stars.mag[b]!;
      const lo = Math.min(...obs);
      const hi = Math.max(...obs);
      for (const m of sim.mag[k]) if (Number.isFinite(m)) expect(m >= lo && m <= hi).toBe(true);
    });
  });

  it('PPC of a catalogue larger than the cap: as many observed stars, chosen at random, beside the simulated ones', async () => {
    const c = await buildRunFigures(fitRun, { which: ['ppc'], ppcStars: 600, maxPoints: 300, seed: 2 });
    const text = svgText(c.figures[0].svg);
    expect(text).toContain('observed (random 600 of 1,500)');
    expect(text).toContain('simulated from the posterior (600 stars)');
    expect(c.figures[0].caption).toMatch(/^Left: a random 600 of the 1,500 observed stars, as many as were simulated/);
  });

  it('plot writes plots/<name>.svg and, with png, a PNG of each', async () => {
    const w = await plotRun(fitRun, { which: ['tau', 'cmd'], png: true, pngScale: 1, nIsochrones: 10, maxPoints: 500 });
    expect(w.written.map((x) => x.name)).toEqual(['tau', 'cmd']);
    for (const x of w.written) {
      expect(readFileSync(x.svgPath, 'utf8').startsWith('<svg')).toBe(true);
      const png = readFileSync(x.pngPath!);
      expect(Array.from(png.subarray(1, 4))).toEqual([0x50, 0x4e, 0x47]);
    }
  });
});

describe('the report of a fit run', async () => {
  const r = await buildRunFigures(fitRun, { maxPoints: 800, nIsochrones: 15 });
  const content = reportContent(r);
  const { renderReportHtml } = await import('../../src/report/html.js');
  const html = renderReportHtml(content);

  it('holds the summary table, the verdict and the LaTeX row', () => {
    const s = summaryTable(r.posterior.run.summary);
    for (const row of s.rows) expect(html).toContain(`<td>${row[0]}</td><td>${row[1]}</td><td>${row[2]}</td>`);
    expect(html).toContain(r.posterior.run.diagnosis.verdict.headline.replace(/</g, '&lt;').replace(/>/g, '&gt;'));
    expect(html).toMatch(/\$10\.\d+\^\{\+0\.0\d+\}_\{-0\.0\d+\}\$ &amp;/);
  });

  it('states the provenance: model, per-band calibration, extinction and R_V, priors, sampler, version, run id, timings', () => {
    expect(html).toContain(MODEL.replace(/&/g, '&amp;'));
    for (const b of ['B', 'V', 'I']) expect(html).toContain(`<dt>calibration of ${b}</dt>`);
    expect(html).toMatch(/<dt>extinction law and R_V<\/dt><dd>[^<]*R_V = 3\.1/);
    expect(html).toContain('<code>log_age ~ uniform(9.6, 10.15)</code>');
    expect(html).toMatch(/<dt>sampler<\/dt><dd>affine-invariant ensemble sampler: 2 ensemble\(s\) x 12 walkers, 400 steps/);
    expect(html).toContain(`<dt>coeval version</dt>`);
    expect(html).toContain(readManifest(fitRun).runId);
    expect(html).toMatch(/<dt>wall-clock time<\/dt><dd>check 0\.8 s; initialisation 13 s; sampling 5 min 1 s/);
    expect(html).toContain('<h3>Where the model is approximate</h3>');
    expect(html).toContain('<h3>Resolved configuration</h3>');
  });

  it('gives the cautions: approximate built-in model, model systematics beyond the error bars, established grids and the literature', () => {
    const cautions = html.slice(html.indexOf('<div class="cautions">'), html.indexOf('<h2>Verdict</h2>'));
    expect(cautions).toMatch(/built-in stellar model\. It is an approximation/);
    expect(cautions).toMatch(/error bars are statistical only/);
    expect(cautions).toMatch(/usually moves the age, distance and metallicity by more than these error bars/);
    expect(cautions).toMatch(/established published isochrone grid/);
    expect(cautions).toMatch(/compare the result with what the literature reports/);
  });

  it('embeds every figure inline, with ids scoped per figure', () => {
    for (const f of r.figures) expect(html).toContain(`<figure id="fig-${f.name}">`);
    expect((html.match(/<svg /g) ?? []).length).toBe(r.figures.length);
    const ids = [...html.matchAll(/\bid="([^"]+)"/g)].map((m) => m[1]);
    expect(new Set(ids).size).toBe(ids.length);
    for (const m of html.matchAll(/url\(#([^)]+)\)/g)) expect(ids).toContain(m[1]);
  });

  it('is self-contained: no scripts, no links to anything outside the file', () => {
    expect(html).not.toMatch(/<script/i);
    expect(html).not.toMatch(/<(link|img|iframe|object|embed)\b/i);
    expect(html).not.toMatch(/@import/i);
    // The only URLs are the SVG and XLink namespace names, which are identifiers, not fetched.
    const urls = [...html.matchAll(/\b(?:https?|ftp):\/\/[^\s"'<>)]+/gi)].map((m) => m[0]);
    expect(new Set(urls)).toEqual(new Set(['http://www.w3.org/2000/svg', 'http://www.w3.org/1999/xlink']));
    for (const m of html.matchAll(/\b(?:xlink:)?href="([^"]*)"/g)) expect(m[1].startsWith('#'), m[1]).toBe(true);
    for (const m of html.matchAll(/url\(([^)]*)\)/g)) expect(m[1].startsWith('#'), m[1]).toBe(true);
  });

  it('reportRun writes report.html into the run directory', async () => {
    const w = await reportRun(fitRun, { which: ['corner', 'tau'] });
    expect(w.path).toBe(join(fitRun, 'report.html'));
    expect(w.figures).toEqual(['corner', 'tau']);
    expect(readFileSync(w.path, 'utf8')).toContain('<figure id="fig-corner">');
  });
});

describe('a run without a fit section (sampler test-bed)', () => {
  it('gets corner, trace and tau, and says why there is no CMD', async () => {
    const r = await buildRunFigures(testbedRun);
    expect(r.figures.map((f) => f.name)).toEqual(['corner', 'trace', 'tau']);
    expect(r.skipped.map((s) => s.name)).toEqual(['cmd', 'ppc']);
    expect(r.skipped[0].reason).toMatch(/no fit section/);
    const html = (await import('../../src/report/html.js')).renderReportHtml(reportContent(r));
    expect(html).toContain('analytic test-bed');
    expect(html).toContain('not recorded (the run was not made by coeval fit)');
  });
});

describe('coeval plot and coeval report', () => {
  it('plot --which tau writes the SVG; a CMD of a test-bed run is refused with a reason', () => {
    const ok = runCli(['plot', testbedRun, '--which', 'tau']);
    expect(ok.status, ok.stderr).toBe(0);
    expect(ok.stdout.trim()).toBe(join(testbedRun, 'plots', 'tau.svg'));
    expect(existsSync(join(testbedRun, 'plots', 'tau.svg'))).toBe(true);
    expectUserError(runCli(['plot', testbedRun, '--which', 'cmd']), 2, /usage error at .*testbed: cannot draw the cmd figure: the run was not made by `coeval fit`/);
    expectUserError(runCli(['plot', testbedRun, '--which', 'corner,hr']), 2, /unknown figure "hr"/, /expected: names among corner, trace, tau, cmd, ppc/);
    expectUserError(runCli(['plot', testbedRun, '--seed', '0']), 2, /--seed must be a whole number >= 1, got 0/);
  });

  it('report prints the path of report.html', () => {
    const r = runCli(['report', testbedRun]);
    expect(r.status, r.stderr).toBe(0);
    expect(r.stdout.trim()).toBe(join(testbedRun, 'report.html'));
    expect(r.stderr).toMatch(/report with 3 figure\(s\) \(corner, trace, tau\)/);
  });
});
