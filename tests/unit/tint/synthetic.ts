export { seededRandom } from '~/lib/random';

/** A standard normal deviate (Box–Muller). */
export function gaussian(random: () => number): number {
  return Math.sqrt(-2 * Math.log(1 - random())) * Math.cos(2 * Math.PI * random());
}
