/**
 * The heat record in words: the vocabularies' labels and how numbers and durations read.
 * No zod here, so an island that only shows coupons (the library's table and cards) stays small;
 * `coupons.ts` re-exports all of it beside the schema.
 */

export const labels = {
  visibility: { private: 'Only me', members: 'Members', public: 'Everyone' },
  surfacePrep: { ground: 'Ground (grit)', blasted: 'Blasted', etched: 'Etched', polished: 'Polished', 'as-forged': 'As forged', other: 'Other' },
  process: { oven: 'Oven or kiln', forge: 'Forge', torch: 'Torch', induction: 'Induction', anodize: 'Anodizing' },
  temperatureMethod: { thermocouple: 'Thermocouple', pyrometer: 'Pyrometer', 'oven-setpoint': 'Oven setpoint', estimated: 'Estimated' },
  atmosphere: { air: 'Air', argon: 'Argon', other: 'Other' },
  cooling: {
    'still-air': 'Still air',
    'forced-air': 'Forced air',
    'water-quench': 'Water quench',
    'oil-quench': 'Oil quench',
    'in-furnace': 'In the furnace',
    'in-can': 'In the can',
    other: 'Other',
  },
} as const;

/** A whole number as it is, anything else to one decimal ("12", "12.5"). */
export const formatNumber = (value: number) => (Number.isInteger(value) ? String(value) : value.toFixed(1));

/** A hold in seconds as a reader says it: "45 s", "30 min", "2 h 15 min". */
export function formatDuration(seconds: number): string {
  if (seconds < 60) return `${seconds} s`;
  if (seconds < 3600) return `${formatNumber(seconds / 60)} min`;
  const hours = Math.floor(seconds / 3600);
  const minutes = Math.round((seconds % 3600) / 60);
  return minutes ? `${hours} h ${minutes} min` : `${hours} h`;
}
