import { configDefaults, defineConfig } from 'vitest/config';
import { fileURLToPath } from 'node:url';

const root = fileURLToPath(new URL('..', import.meta.url));

/** The browser journeys of a brand-new person: they read and change the demo library as a whole. */
const journeys = 'tests/e2e/*-journey.test.ts';

/**
 * One suite, three folders: unit/ (pure code), integration/ (the built app, real MariaDB, S3 fake,
 * mail fake, all started by scripts/test.mjs), e2e/ (Debian's Chromium through playwright-core).
 * Two run groups: everything else first, two files at a time; then the journeys, one file at a
 * time, so no other file adds, measures or deletes coupons while a journey counts them.
 * `npm test -- <file>` runs that file in whichever group holds it.
 */
export default defineConfig({
  root,
  // The `~/` import alias of tsconfig.json (src/), which Astro's own build reads from there.
  resolve: { alias: { '~': `${root}src` } },
  test: {
    pool: 'forks',
    maxWorkers: 2,
    testTimeout: 30_000,
    hookTimeout: 60_000,
    sequence: { concurrent: false },
    projects: [
      {
        extends: true,
        test: {
          name: 'suite',
          include: ['tests/**/*.test.ts'],
          exclude: [...configDefaults.exclude, journeys],
          sequence: { groupOrder: 0 },
        },
      },
      {
        extends: true,
        test: {
          name: 'journeys',
          include: [journeys],
          fileParallelism: false,
          sequence: { groupOrder: 1 },
        },
      },
    ],
  },
});
