import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['test/**/*.test.ts'],
    setupFiles: ['test/setup/fastCheckSeed.ts'],
    // Integration tests start real brokers and databases; give them room on a 2-core machine.
    testTimeout: 30_000,
    hookTimeout: 60_000,
  },
});
