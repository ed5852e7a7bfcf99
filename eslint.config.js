// Lint: typescript-eslint's recommended rules, plus the import boundaries between stages.
// A stage may import only the stages upstream of it in the data flow (design.md section 1);
// the sampler and the diagnostics see only numbers, never catalogues or stellar models.
import js from '@eslint/js';
import tseslint from 'typescript-eslint';

const STAGES = ['core', 'config', 'catalog', 'stellar', 'likelihood', 'priors', 'sampler', 'diagnostics', 'io', 'report', 'pipeline', 'cli'];

/** What each stage may import (besides itself and node/npm modules). */
const ALLOWED = {
  core: [],
  config: ['core'],
  catalog: ['core', 'config'],
  stellar: ['core'],
  likelihood: ['core', 'catalog', 'stellar'],
  priors: ['core'],
  sampler: ['core'],
  diagnostics: ['core'],
  io: ['core', 'sampler', 'diagnostics'],
  report: ['core', 'catalog', 'stellar', 'diagnostics', 'io'],
  pipeline: ['core', 'config', 'catalog', 'stellar', 'likelihood', 'priors', 'sampler', 'diagnostics', 'io', 'report'],
  cli: STAGES.filter((s) => s !== 'cli'),
};

const boundaryRules = STAGES.map((stage) => {
  const forbidden = STAGES.filter((s) => s !== stage && !ALLOWED[stage].includes(s));
  return {
    files: [`src/${stage}/**/*.ts`],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: forbidden.map((f) => ({
            group: [`../${f}/*`, `../../${f}/*`, `../../../${f}/*`, `../${f}`, `../../${f}`],
            message: `src/${stage} may not import src/${f}: stages import only upstream stages (see DEVELOPERS.md).`,
          })),
        },
      ],
    },
  };
});

export default tseslint.config(
  { ignores: ['dist/**', 'node_modules/**', '.prof/**', 'bench/results.json', 'runs/**', '**/*.js', '!eslint.config.js'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      '@typescript-eslint/no-explicit-any': 'error',
    },
  },
  ...boundaryRules,
);
