import type { ModelConfig } from '../config/sections/model.js';
import { builtinModel, extinctionModel, type BuiltinExtinctionModel, type IsochroneSource } from '../stellar/index.js';

/** The stellar model and extinction law a config asks for. */
export interface StellarSetup {
  source: IsochroneSource;
  extinction: BuiltinExtinctionModel;
}

/** The built-in model with the `[model]` settings. */
export function builtinSetup(model: ModelConfig): StellarSetup {
  return {
    source: builtinModel({ alphaFe: model.alpha_fe, eta: model.reimers_eta }),
    extinction: extinctionModel({ law: model.extinction_law, rv: model.rv }),
  };
}
