/**
 * The layout of a chain file: one Arrow schema per ensemble, with the parameters' units and labels and the
 * run's identity in its metadata (schema-level key/value pairs, which every Arrow reader exposes), and the
 * unit and label repeated on each parameter's field.
 */
import { Bool, Field, Float64, Int16, Int32, Schema } from 'apache-arrow';
import { InputError, OutputError } from '../core/errors.js';
import type { ParameterInfo } from '../core/parameters.js';

/** Columns every chain file has besides the parameters, in file order around them. */
export const STEP_COLUMN = 'step';
export const WALKER_COLUMN = 'walker';
export const LOG_COLUMNS = ['log_prior', 'log_likelihood', 'log_posterior'] as const;
export const ACCEPTED_COLUMN = 'accepted';
const RESERVED = new Set<string>([STEP_COLUMN, WALKER_COLUMN, ...LOG_COLUMNS, ACCEPTED_COLUMN]);

/** The value of the `coeval.format` metadata key; bump when the layout changes incompatibly. */
export const CHAIN_FORMAT = 'coeval-chain 1';

/** What a chain file says about itself, besides its columns. */
export interface ChainFileHeader {
  parameters: readonly ParameterInfo[];
  runId: string;
  /** Index of the ensemble in the run, 0 .. K-1. */
  ensemble: number;
  /** The ensemble's seed, as the run recorded it. */
  seed: string | number;
  nWalkers: number;
  coevalVersion: string;
}

const KEY = {
  format: 'coeval.format',
  version: 'coeval.version',
  runId: 'coeval.run_id',
  ensemble: 'coeval.ensemble',
  seed: 'coeval.seed',
  nWalkers: 'coeval.n_walkers',
  parameters: 'coeval.parameters',
} as const;

export function chainSchema(h: ChainFileHeader): Schema {
  if (!(Number.isInteger(h.nWalkers) && h.nWalkers >= 1 && h.nWalkers <= 32767)) {
    throw new OutputError(`a chain file holds 1 to 32767 walkers (the walker column is int16), not ${h.nWalkers}`);
  }
  const seen = new Set<string>();
  for (const p of h.parameters) {
    if (RESERVED.has(p.name)) throw new OutputError(`parameter name "${p.name}" is reserved for a chain-file column`, { hint: 'rename the parameter' });
    if (seen.has(p.name)) throw new OutputError(`parameter name "${p.name}" appears twice`);
    seen.add(p.name);
  }
  const fields = [
    new Field(STEP_COLUMN, new Int32(), false),
    new Field(WALKER_COLUMN, new Int16(), false),
    ...h.parameters.map(
      (p) =>
        new Field(
          p.name,
          new Float64(),
          false,
          new Map([
            ['unit', p.unit],
            ['label', p.label],
          ]),
        ),
    ),
    ...LOG_COLUMNS.map((name) => new Field(name, new Float64(), false)),
    new Field(ACCEPTED_COLUMN, new Bool(), false),
  ];
  const metadata = new Map<string, string>([
    [KEY.format, CHAIN_FORMAT],
    [KEY.version, h.coevalVersion],
    [KEY.runId, h.runId],
    [KEY.ensemble, String(h.ensemble)],
    [KEY.seed, String(h.seed)],
    [KEY.nWalkers, String(h.nWalkers)],
    [KEY.parameters, JSON.stringify(h.parameters.map((p) => ({ name: p.name, label: p.label, unit: p.unit })))],
  ]);
  return new Schema(fields, metadata);
}

/** The header of a chain file from its schema; throws InputError when the schema is not a coeval chain's. */
export function headerFromSchema(schema: Schema, file: string): ChainFileHeader {
  const m = schema.metadata;
  const get = (key: string): string => {
    const v = m.get(key);
    if (v === undefined) {
      throw new InputError(`the chain file's schema has no "${key}" metadata`, {
        where: { file },
        expected: `an Arrow IPC stream written by coeval (${CHAIN_FORMAT})`,
      });
    }
    return v;
  };
  const format = get(KEY.format);
  if (format !== CHAIN_FORMAT) {
    throw new InputError(`unsupported chain file format "${format}"`, { where: { file }, expected: CHAIN_FORMAT, hint: 'read it with the coeval version that wrote it' });
  }
  let parameters: ParameterInfo[];
  try {
    parameters = (JSON.parse(get(KEY.parameters)) as ParameterInfo[]).map((p) => ({ name: String(p.name), label: String(p.label), unit: String(p.unit) }));
  } catch (cause) {
    throw new InputError('the chain file\'s parameter list is not valid JSON', { where: { file }, cause });
  }
  const seedText = get(KEY.seed);
  const header: ChainFileHeader = {
    parameters,
    runId: get(KEY.runId),
    ensemble: Number(get(KEY.ensemble)),
    seed: /^-?\d+$/.test(seedText) && Number.isSafeInteger(Number(seedText)) ? Number(seedText) : seedText,
    nWalkers: Number(get(KEY.nWalkers)),
    coevalVersion: get(KEY.version),
  };
  const expected = chainSchema(header).fields.map((f) => `${f.name}:${f.type}`);
  const found = schema.fields.map((f) => `${f.name}:${f.type}`);
  if (expected.join(',') !== found.join(',')) {
    throw new InputError('the chain file\'s columns do not match its metadata', { where: { file }, found: found.join(', '), expected: expected.join(', ') });
  }
  return header;
}
