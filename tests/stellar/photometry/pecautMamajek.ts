/** Loads the committed Pecaut & Mamajek dwarf-sequence rows (fixtures/pecaut-mamajek-dwarfs.tsv). */
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

export interface DwarfRow {
  spt: string;
  teff: number;
  logL: number;
  radius: number;
  mass: number;
  mv: number;
  bv: number;
  gv: number;
  bpRp: number;
  mg: number;
  vr: number;
  vi: number;
  /** log g from the row's mass and radius: 4.438 + log M - 2 log R (IAU 2015 B3 nominal solar values give log g_sun = 4.438). */
  logg: number;
}

const num = (s: string) => (s === '...' ? NaN : Number(s));

export function loadDwarfSequence(): DwarfRow[] {
  const text = readFileSync(fileURLToPath(new URL('./fixtures/pecaut-mamajek-dwarfs.tsv', import.meta.url)), 'utf8');
  const lines = text.split('\n').filter((l) => l.trim() !== '' && !l.startsWith('#'));
  const header = lines[0].split('\t');
  return lines.slice(1).map((line) => {
    const f = Object.fromEntries(line.split('\t').map((v, i) => [header[i], v]));
    const radius = num(f.R_Rsun);
    const mass = num(f.Msun);
    return {
      spt: f.SpT,
      teff: num(f.Teff),
      logL: num(f.logL),
      radius,
      mass,
      mv: num(f.Mv),
      bv: num(f['B-V']),
      gv: num(f['G-V']),
      bpRp: num(f['Bp-Rp']),
      mg: num(f.M_G),
      vr: num(f['V-Rc']),
      vi: num(f['V-Ic']),
      logg: 4.438 + Math.log10(mass) - 2 * Math.log10(radius),
    };
  });
}
