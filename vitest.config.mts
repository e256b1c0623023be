import { configDefaults, defineConfig } from 'vitest/config';

// Suites that hold a screen to a time budget (*.timed.test.ts) run in a pass of their own after all the others
// (scripts/test.ts sets LOFTLINE_TIMED=1), so the load of parallel suites on a 2-core machine does not decide them.
const timedOnly = process.env.LOFTLINE_TIMED === '1';

export default defineConfig({
  resolve: { alias: { 'react-native': 'react-native-web' } },
  test: {
    include: timedOnly ? ['tests/**/*.timed.test.ts'] : ['tests/**/*.test.ts', 'tests/**/*.test.tsx'],
    exclude: timedOnly ? configDefaults.exclude : [...configDefaults.exclude, 'tests/**/*.timed.test.ts'],
    testTimeout: 30_000,
    hookTimeout: 120_000,
    globalSetup: ['tests/setup/global-setup.ts'],
    setupFiles: ['tests/setup/fast-check.ts'],
  },
});
