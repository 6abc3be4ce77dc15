import { defineConfig } from 'vitest/config';
import { fileURLToPath } from 'node:url';

const root = fileURLToPath(new URL('..', import.meta.url));

/**
 * One suite, three folders: unit/ (pure code), integration/ (the built app, real MariaDB, S3 fake,
 * mail fake, all started by scripts/test.mjs), e2e/ (Debian's Chromium through playwright-core).
 */
export default defineConfig({
  root,
  // The `~/` import alias of tsconfig.json (src/), which Astro's own build reads from there.
  resolve: { alias: { '~': `${root}src` } },
  test: {
    include: ['tests/**/*.test.ts'],
    pool: 'forks',
    maxWorkers: 2,
    testTimeout: 30_000,
    hookTimeout: 60_000,
    sequence: { concurrent: false },
  },
});
