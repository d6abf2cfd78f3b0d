import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['tests/**/*.test.ts'],
    testTimeout: 30_000,
    // Browser tests wait in their setup for the one shared demo build, which takes minutes on a busy 2-core machine.
    hookTimeout: 900_000,
    pool: 'forks',
  },
});
