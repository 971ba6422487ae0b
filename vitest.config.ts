import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['lib/**/*.test.ts', 'ingest/**/*.test.ts', 'seed/**/*.test.ts', 'test/**/*.test.ts'],
    globalSetup: ['test/setup/services.ts'],
    testTimeout: 30_000,
    hookTimeout: 240_000,
    pool: 'forks',
  },
});
