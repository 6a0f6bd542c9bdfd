import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['test/**/*.test.ts'],
    environment: 'node',
    testTimeout: 180_000, // hang guards only: a slow CI machine must not fail a correct test
    hookTimeout: 240_000,
  },
});
