import { describe, expect, it } from 'vitest';
import { casagrande2010 } from '../../../src/stellar/photometry/casagrande2010.js';
import { casagrande2021 } from '../../../src/stellar/photometry/casagrande2021.js';
import { teffEdges, type ColourTeffRelation } from '../../../src/stellar/photometry/colourRelation.js';
import { flowerBvRelation } from '../../../src/stellar/photometry/flower1996.js';
import { ramirezMelendez2005Giants } from '../../../src/stellar/photometry/ramirezMelendez2005.js';
import { andraeBcG } from '../../../src/stellar/photometry/andrae2018.js';

/*
 * Invertibility: a colour is found from Teff by inverting Teff(colour), which needs Teff to be strictly
 * monotone in the colour over the range used, at every log g and [Fe/H] the model can ask for. Checked
 * on a grid (log g -1 to 5.5 by 0.25, [Fe/H] -3.0 to +0.6 by 0.1, 400 colours per range).
 */
const RELATIONS: [string, ColourTeffRelation][] = [
  ...Object.entries(casagrande2010),
  ...Object.entries(ramirezMelendez2005Giants).map(([k, v]) => [`giants ${k}`, v] as [string, ColourTeffRelation]),
  ...Object.entries(casagrande2021).filter(([k]) => k !== 'G-RP'),
  ['Flower B-V', flowerBvRelation],
];

describe('each relation is monotone over its range (invertible)', () => {
  const scratch = new Float64Array(2);
  for (const [name, rel] of RELATIONS) {
    it(name, () => {
      let worst = Infinity;
      let where = '';
      for (let logg = -1; logg <= 5.5 + 1e-9; logg += 0.25) {
        for (let feh = -3; feh <= 0.6 + 1e-9; feh += 0.1) {
          const e = teffEdges(rel, logg, feh, scratch);
          const sign = Math.sign(e.colourCool - e.colourHot); // Teff falls as the colour goes from hot to cool
          for (let k = 0; k <= 400; k++) {
            const x = e.colourHot + ((e.colourCool - e.colourHot) * k) / 400;
            // Along the direction hot -> cool, dTeff must be negative.
            const slope = -sign * rel.dTeffDx(x, logg, feh);
            if (slope < worst) {
              worst = slope;
              where = `log g ${logg.toFixed(2)}, [Fe/H] ${feh.toFixed(1)}, colour ${x.toFixed(3)}`;
            }
          }
        }
      }
      expect(worst, `smallest |dTeff/dcolour| ${worst.toFixed(1)} K/mag at ${where}`).toBeGreaterThan(0);
    });
  }
});

describe('zero points', () => {
  it('BC_G,sun = +0.06 (Andrae et al. 2018, a0 of the 4000-8000 K set; with M_bol,sun = 4.74)', () => {
    expect(andraeBcG(5772)).toBeCloseTo(0.06, 10);
  });
});
