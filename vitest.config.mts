import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['tests/**/*.test.ts'],
    exclude: ['tests/e2e/**', 'tests/editors/**', 'node_modules/**'],
    testTimeout: 20000,
    setupFiles: ['tests/helpers/property-seed.ts'],
  },
});
