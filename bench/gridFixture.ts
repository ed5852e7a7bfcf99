/**
 * Synthetic stacked-text isochrone tables for the grid benchmarks: the layout of published tables (a `#`
 * header, each isochrone under its own comment block with the column names, whitespace-aligned rows, ages
 * and Z per row), with invented, smoothly varying numbers: a main sequence, a turnoff, a subgiant and a
 * giant branch. Shapes are plausible enough for the phase segmentation to find its landmarks.
 */
import { closeSync, openSync, writeSync } from 'node:fs';

export const FIXTURE_COLUMNS = ['age_yr', 'z', 'm_ini', 'm_act', 'lg_L', 'lg_Te', 'lg_g', 'mag_B', 'mag_V', 'mag_I', 'mag_J', 'mag_H', 'mag_K'];

export const FIXTURE_MAP = (files: string): string => `[grid]
files = [${files}]
age_unit = "yr"
metallicity_scale = "z"
solar_z = 0.0152
citation = "synthetic benchmark tables"
[grid.columns]
age = "age_yr"
metallicity = "z"
mass_initial = "m_ini"
mass_current = "m_act"
log_teff = "lg_Te"
log_g = "lg_g"
log_l = "lg_L"
[grid.bands]
B = "mag_B"
V = "mag_V"
I = "mag_I"
J = "mag_J"
H = "mag_H"
Ks = "mag_K"
`;

/** Write nZ x nAge isochrones of nRows rows each; returns the bytes written. */
export function writeFixture(path: string, nZ: number, nAge: number, nRows: number): number {
  const fd = openSync(path, 'w');
  let bytes = 0;
  const put = (s: string): void => {
    bytes += writeSync(fd, s);
  };
  put('# synthetic isochrone tables for coeval benchmarks (invented numbers)\n#\n');
  for (let iz = 0; iz < nZ; iz++) {
    const z = 0.0005 * 2 ** (iz * 0.5);
    const feh = Math.log10(z / 0.0152);
    for (let ia = 0; ia < nAge; ia++) {
      const logAge = 8.5 + 0.05 * ia;
      const age = 10 ** logAge;
      put(`#\n# Z = ${z.toFixed(6)}  age = ${age.toExponential(6)} yr\n# ${FIXTURE_COLUMNS.join('  ')}\n`);
      const mTo = 1.05 * 10 ** (-(logAge - 9.8) / 2.6) * (1 + 0.08 * feh);
      const lTo = 4.2 * Math.log10(mTo) + 0.1 * feh;
      const tTo = 3.79 + 0.2 * Math.log10(mTo) - 0.05 * feh;
      const nMs = Math.round(nRows * 0.6);
      const lines: string[] = [];
      for (let i = 0; i < nRows; i++) {
        let m: number;
        let ll: number;
        let lt: number;
        if (i < nMs) {
          const f = i / nMs;
          m = 0.1 * (mTo / 0.1) ** f;
          ll = 4.2 * Math.log10(m) + 0.1 * feh;
          lt = 3.79 + 0.2 * Math.log10(m) - 0.05 * feh - 0.02 * f ** 8;
        } else {
          const f = (i - nMs) / (nRows - nMs);
          m = mTo * (1 + 0.08 * f);
          const sgb = Math.min(1, f / 0.3);
          const rgb = Math.max(0, (f - 0.3) / 0.7);
          ll = lTo + 0.25 * sgb + (3.3 - lTo - 0.25) * rgb ** 0.8;
          lt = tTo - 0.02 - 0.1 * sgb - 0.18 * rgb ** 1.5;
        }
        const lg = 4.438 + Math.log10(m) + 4 * (lt - 3.7613) - ll;
        const v = 4.74 - 2.5 * ll + 6 * (3.77 - lt);
        const mags = [v + 0.6 + 6 * (3.77 - lt), v, v - 0.7 - 4 * (3.77 - lt), v - 1.5 - 8 * (3.77 - lt), v - 1.9 - 9 * (3.77 - lt), v - 2.0 - 9.5 * (3.77 - lt)];
        lines.push(
          `${age.toExponential(6)}  ${z.toFixed(6)}  ${m.toFixed(8)}  ${m.toFixed(8)}  ${ll.toFixed(5)}  ${lt.toFixed(5)}  ${lg.toFixed(5)}  ${mags.map((x) => x.toFixed(4)).join('  ')}`,
        );
      }
      put(`${lines.join('\n')}\n`);
    }
  }
  closeSync(fd);
  return bytes;
}
