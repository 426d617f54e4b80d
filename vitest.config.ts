import { defineConfig } from 'vitest/config';

// Two projects: fast unit/integration tests, and browser tests that drive the real UI
// through the loopback server with Debian's Chromium. The machine has 2 cores.
export default defineConfig({
  test: {
    maxWorkers: 2,
    // Temporary folders of the whole run under one folder, removed at the end (tests/support/temp-root.ts).
    globalSetup: ['tests/support/temp-root.ts'],
    projects: [
      {
        test: {
          name: 'unit',
          include: ['tests/unit/**/*.test.ts', 'tests/integration/**/*.test.ts'],
          testTimeout: 60_000,
          hookTimeout: 60_000,
        },
      },
      {
        test: {
          name: 'e2e',
          include: ['tests/e2e/**/*.test.ts'],
          testTimeout: 180_000,
          hookTimeout: 180_000,
          fileParallelism: false,
          // Screens redraw after a host round trip and deferred rendering: on a loaded 2-core
          // machine that can take more than expect.poll's default 1 s.
          expect: { poll: { timeout: 15_000 } },
        },
      },
    ],
  },
});
