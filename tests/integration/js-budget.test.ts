import { describe, expect, it } from 'vitest';
import { baseUrl } from '../support/app';
import { BUDGET_KB, pageScripts } from '../../scripts/js-budget.mjs';

// Source: BRIEF.md, targets: "JavaScript shipped by any page ≤ 120 kB gzipped (read-only pages:
// none needed to show their data)". Sizes are what the built app serves, gzipped here with zlib.

describe('the JavaScript budget', () => {
  it.each(['/', '/safety', '/tint-ladder', '/heat-planner', '/library', '/library?view=grid&sort=temperature', '/library/search'])(
    '%s ships at most 120 kB gzipped',
    async (path) => {
      const { total, files } = await pageScripts(baseUrl, path);
      expect(BUDGET_KB).toBe(120);
      expect(total / 1000, `${path}: ${[...files.keys()].join(', ')}`).toBeLessThanOrEqual(BUDGET_KB);
    },
  );

  it('counts an island with the modules it imports (the library ships React, TanStack Query and Table)', async () => {
    const { files, total } = await pageScripts(baseUrl, '/library');
    // React DOM's client alone is about 60 kB gzipped (from memory), so a total under 50 kB would
    // mean the imports of the island's modules were missed.
    expect(total / 1000).toBeGreaterThan(50);
    expect([...files.keys()].some((url) => /LibraryTable\.[\w-]+\.js$/.test(url))).toBe(true);
  });
});
