/**
 * The extinction laws by name, as curves A_lambda/A_V of wavenumber (per micrometre) at one R_V.
 */
import { ModelError } from '../../core/errors.js';
import { ccm89, odonnell94 } from './cardelli1989.js';
import { fitzpatrick1999Curve } from './fitzpatrick1999.js';

export const EXTINCTION_LAWS = ['odonnell94', 'ccm89', 'fitzpatrick99'] as const;
export type ExtinctionLaw = (typeof EXTINCTION_LAWS)[number];

export const LAW_CITATIONS: Readonly<Record<ExtinctionLaw, string>> = {
  odonnell94: "Cardelli, Clayton & Mathis 1989 with O'Donnell 1994 in the optical",
  ccm89: 'Cardelli, Clayton & Mathis 1989',
  fitzpatrick99: 'Fitzpatrick 1999',
};

/** R_V values the laws are meant for; CCM89 was fitted over about 2.6-5.6 and F99 shown for 2.3-5.5. */
export const RV_RANGE = [2.0, 6.0] as const;

export function checkRv(rv: number): void {
  if (!(rv >= RV_RANGE[0] && rv <= RV_RANGE[1])) {
    throw new ModelError('R_V is outside the range the extinction laws are defined for', {
      found: rv,
      expected: `${RV_RANGE[0]} <= R_V <= ${RV_RANGE[1]} (3.1 for the diffuse interstellar medium)`,
    });
  }
}

/** A_lambda / A_V as a function of wavenumber for `law` at R_V = rv. */
export function extinctionCurve(law: ExtinctionLaw, rv: number): (xInvUm: number) => number {
  checkRv(rv);
  switch (law) {
    case 'ccm89':
      return (x) => ccm89(x, rv);
    case 'odonnell94':
      return (x) => odonnell94(x, rv);
    case 'fitzpatrick99':
      return fitzpatrick1999Curve(rv);
    default:
      throw new ModelError(`unknown extinction law ${String(law)}`, { found: law, expected: EXTINCTION_LAWS.join(', ') });
  }
}
