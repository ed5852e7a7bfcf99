import { describe, expect, it } from 'vitest';
import { parseConfigText } from '../../src/config/index.js';
import { ConfigError } from '../../src/core/errors.js';
import { movesFromConfig } from '../../src/sampler/movesFromConfig.js';

const BASE = `
[catalogue]
path = "stars.csv"

[photometry.V]
mag = "Vmag"
err = "e_Vmag"

[photometry.I]
mag = "Imag"
err = "e_Imag"
`;

function configError(text: string): ConfigError {
  try {
    parseConfigText(text, { file: 'test.toml' });
  } catch (e) {
    if (e instanceof ConfigError) return e;
    throw e;
  }
  throw new Error('expected a ConfigError');
}

describe('[sampler] config section', () => {
  it('has defaults when omitted, and they build a valid move mixture', () => {
    const { config } = parseConfigText(BASE, { file: 'x.toml' });
    expect(config.sampler.ensembles).toBe(4);
    expect(config.sampler.stop).toBe('auto');
    expect(config.sampler.tau_multiple).toBe(50);
    expect(config.sampler.tau_change).toBe(0.01);
    expect(config.sampler.workers).toBe('auto');
    expect(config.sampler.init).toBe('optimum');
    expect(config.sampler.moves.map((m) => m.move)).toEqual(['stretch', 'de']);
    expect(movesFromConfig(config.sampler.moves).map((m) => m.move.name)).toEqual(['stretch', 'de']);
  });

  it('reads moves with their parameters', () => {
    const { config } = parseConfigText(
      `${BASE}
[sampler]
walkers = 40
stop = "fixed"
steps = 5000
seed = 7

[[sampler.moves]]
move = "stretch"
weight = 0.6
a = 2.5

[[sampler.moves]]
move = "de"
weight = 0.3
mode_hop = 0.05

[[sampler.moves]]
move = "walk"
weight = 0.1
subset = 4
`,
      { file: 'x.toml' },
    );
    expect(config.sampler.walkers).toBe(40);
    expect(config.sampler.moves).toEqual([
      { move: 'stretch', weight: 0.6, a: 2.5 },
      { move: 'de', weight: 0.3, mode_hop: 0.05 },
      { move: 'walk', weight: 0.1, subset: 4 },
    ]);
  });

  it('too few walkers', () => {
    const e = configError(`${BASE}\n[sampler]\nwalkers = 3\n`);
    expect(e.where?.key).toBe('sampler.walkers');
    expect(e.message).toMatch(/too few walkers \(3\)/);
    expect(e.where?.line).toBe(14);
  });

  it('unknown move', () => {
    const e = configError(`${BASE}\n[[sampler.moves]]\nmove = "strech"\n`);
    expect(e.where?.key).toBe('sampler.moves.0.move');
    expect(e.found).toBe('strech');
    expect(e.expected).toMatch(/"stretch"/);
  });

  it('weights that do not sum to a positive number', () => {
    const e = configError(`${BASE}\n[[sampler.moves]]\nmove = "stretch"\nweight = 0\n\n[[sampler.moves]]\nmove = "de"\nweight = 0\n`);
    expect(e.where?.key).toBe('sampler.moves');
    expect(e.message).toMatch(/the move weights sum to 0/);
    const neg = configError(`${BASE}\n[[sampler.moves]]\nmove = "stretch"\nweight = -1\n`);
    expect(neg.where?.key).toBe('sampler.moves.0.weight');
  });

  it('a parameter given to the wrong move', () => {
    const e = configError(`${BASE}\n[[sampler.moves]]\nmove = "de"\na = 3\n`);
    expect(e.message).toBe('key a belongs to the stretch move, not to de');
  });

  it('an unknown key, with a suggestion', () => {
    const e = configError(`${BASE}\n[sampler]\nwalker = 32\n`);
    expect(e.where?.key).toBe('sampler.walker');
    expect(e.hint).toMatch(/"walkers"/);
  });
});
