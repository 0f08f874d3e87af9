import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['test/**/*.test.{ts,tsx}'],
    // Ink reads these at import: colour codes and CI mode would change every frame.
    env: { FORCE_COLOR: '0', CI: 'false' },
  },
});
