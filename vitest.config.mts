import { defineConfig } from 'vitest/config';

export default defineConfig({
  resolve: { alias: { 'react-native': 'react-native-web' } },
  test: {
    include: ['tests/**/*.test.ts', 'tests/**/*.test.tsx'],
    testTimeout: 30_000,
    hookTimeout: 120_000,
    globalSetup: ['tests/setup/global-setup.ts'],
    setupFiles: ['tests/setup/fast-check.ts'],
  },
});
