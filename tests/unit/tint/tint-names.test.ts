import { describe, expect, it } from 'vitest';
import { tintNameAt } from '~/lib/tint/ladder';
import type { FilmSystemId } from '~/lib/tint/film-systems';
import { tintNames } from '~/lib/tint/tint-names';

const systems: FilmSystemId[] = ['tio2-on-titanium', 'iron-oxide-on-iron', 'nb2o5-on-niobium', 'zro2-on-zirconium'];
/** A name must hold for at least this much film between neighbours (our readability rule: a colour a smith can see). */
const MIN_RUN_NM = 2;
const STEP_NM = 0.1;

/** The runs of names met walking a system's ladder in fine steps from 0 to 1000 nm. */
function runs(system: FilmSystemId) {
  const found: { name: string; fromNm: number; toNm: number }[] = [];
  for (let i = 0; i <= 10_000; i += 1) {
    const thicknessNm = i * STEP_NM;
    const name = tintNameAt(system, thicknessNm);
    const last = found.at(-1);
    if (last?.name === name) last.toNm = thicknessNm;
    else found.push({ name, fromNm: thicknessNm, toNm: thicknessNm });
  }
  return found;
}

describe.each(systems)('band names along the %s ladder', (system) => {
  const ladderRuns = runs(system);

  it(`no name blips: every inner run holds at least ${MIN_RUN_NM} nm`, () => {
    const short = ladderRuns.slice(1, -1).filter((run) => run.toNm - run.fromNm + STEP_NM < MIN_RUN_NM - 1e-9);
    expect(short).toEqual([]);
  });

  it('a name without an order belongs to the first order: it never comes back after an ordered name', () => {
    // Source: REFERENCES.md, the colour sequence of films repeats with thickness [from memory]; a name that
    // repeats must carry its order (as gold and blue do), so plain names end where the second order starts.
    const firstOrdered = ladderRuns.findIndex((run) => /-order /.test(run.name));
    if (firstOrdered < 0) return;
    const laterPlain = ladderRuns.slice(firstOrdered).filter((run) => !/-order /.test(run.name));
    expect(laterPlain).toEqual([]);
  });

  it('a name without an order holds one stretch of the ladder: a name met again after other names carries its order', () => {
    // Source: as above, the colours repeat with thickness [from memory]; a plain name met in two places would
    // name two different films, which a smith reading the band could not tell apart.
    const plainRuns = new Map<string, { fromNm: number; toNm: number }[]>();
    for (const run of ladderRuns.filter((run) => !/-order /.test(run.name))) {
      plainRuns.set(run.name, [...(plainRuns.get(run.name) ?? []), { fromNm: run.fromNm, toNm: run.toNm }]);
    }
    const repeated = [...plainRuns].filter(([, stretches]) => stretches.length > 1);
    expect(repeated).toEqual([]);
  });

  it('orders only go up along the ladder', () => {
    const rank = (name: string) => (name.startsWith('second-order') ? 2 : name.startsWith('third-order') ? 3 : name.startsWith('higher-order') ? 4 : 1);
    let highest = 1;
    for (const run of ladderRuns) {
      expect(rank(run.name)).toBeGreaterThanOrEqual(highest);
      highest = rank(run.name);
    }
  });
});

describe('the band name vocabulary', () => {
  it('has no bare repeating name: rose, violet, teal, green and pale gold always carry their order', () => {
    for (const name of ['rose', 'violet', 'teal', 'green', 'pale gold']) expect(tintNames).not.toContain(name);
    for (const name of ['rose', 'violet', 'teal', 'green', 'grey', 'gold', 'pale gold', 'blue']) expect(tintNames).toContain(`second-order ${name}`);
  });
});
