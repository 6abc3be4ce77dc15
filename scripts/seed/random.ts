import { seededRandom } from '~/lib/random';

/** Seeded choices for the demo, so it is the same on every machine. */
export function seededChoices(seed: number) {
  const next = seededRandom(seed);
  return {
    next,
    between: (low: number, high: number) => low + (high - low) * next(),
    pick: <T>(items: readonly T[]): T => items[Math.floor(next() * items.length)],
  };
}
