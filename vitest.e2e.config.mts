import { defineConfig } from 'vitest/config';

// End-to-end suite: a real VS Code (code-server) driven by headless Chromium. `npm run test:e2e`.
export default defineConfig({
  test: {
    include: ['tests/e2e/**/*.e2e.test.ts'],
    testTimeout: 120000,
    hookTimeout: 900000,
    fileParallelism: false,
  },
});
