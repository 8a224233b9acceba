import { defineConfig } from 'vitest/config';

// The browser suite: the built page served by Vite's preview server and driven in
// Debian's headless Chromium through playwright-core (see test/browser/harness.ts).
// Run with: npx vite build && npx vitest run --config vitest.browser.config.ts
export default defineConfig({
  test: {
    include: ['test/browser/**/*.test.ts'],
    environment: 'node',
    fileParallelism: false,
    testTimeout: 120_000,
    hookTimeout: 180_000,
  },
});
