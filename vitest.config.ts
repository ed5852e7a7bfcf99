import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['tests/**/*.test.ts'],
    testTimeout: 60_000,
    hookTimeout: 120_000,
    // Two cores in CI: forks keep native memory of heavy tests apart, and two at a time use the machine.
    pool: 'forks',
    maxWorkers: 2,
  },
});
