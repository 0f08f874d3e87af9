import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['test/**/*.test.{ts,tsx}'],
    globalSetup: ['test/support/temp-root.ts'],
    // Many tests run the built CLI as a process; on a busy two-core machine that can take seconds.
    testTimeout: 60000,
    // Ink reads these at import: colour codes and CI mode would change every frame.
    env: { FORCE_COLOR: '0', CI: 'false' },
  },
});
