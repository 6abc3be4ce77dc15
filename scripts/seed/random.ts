import { seededRandom as numbers } from '../../src/lib/random';

/** Seeded choices for the demo, so it is the same on every machine. */
export function seededRandom(seed: number) {
  const next = numbers(seed);
  return {
    next,
    between: (low: number, high: number) => low + (high - low) * next(),
    integer: (low: number, high: number) => Math.floor(low + (high - low + 1) * next()),
    pick: <T>(items: readonly T[]): T => items[Math.floor(next() * items.length)],
  };
}
