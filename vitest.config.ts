import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['src/**/*.test.ts', 'test/**/*.test.ts'],
    environment: 'node',
    testTimeout: 60_000,
    hookTimeout: 60_000,
    pool: 'forks',
    // Two test files at a time: both cores of the reference machine (vitest's default leaves one idle on two cores).
    maxWorkers: 2,
    tags: [{ name: 'slow' }, { name: 'browser' }],
  },
});
