import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['engine/**/*.test.ts', 'bot/**/*.test.ts', 'adapters/**/*.test.ts', 'cli/**/*.test.ts', 'test/**/*.test.ts'],
    globalSetup: ['test/setup/build-once.ts'],
    testTimeout: 30_000,
    hookTimeout: 60_000,
  },
});
