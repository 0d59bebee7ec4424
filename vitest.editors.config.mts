import { defineConfig } from 'vitest/config';

// Other editors as clients of the bundled language server: real headless Neovim (the Debian
// package `neovim`) with the README's configuration. `npm run test:editors`.
export default defineConfig({
  test: {
    include: ['tests/editors/**/*.editors.test.ts'],
    testTimeout: 120000,
    hookTimeout: 120000,
    fileParallelism: false,
  },
});
