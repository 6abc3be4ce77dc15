/**
 * The value lists of the schema's enum columns, plain and with no Drizzle import, so that the
 * app's domain code and the browser's islands can import them without pulling in the database.
 */

export const alloyFamilies = ['titanium', 'carbon-steel', 'stainless-steel', 'copper', 'bronze', 'brass', 'zirconium', 'niobium'] as const;

export const visibilities = ['private', 'members', 'public'] as const;
export const surfacePreparations = ['ground', 'blasted', 'etched', 'polished', 'as-forged', 'other'] as const;
export const processes = ['oven', 'forge', 'torch', 'induction', 'anodize'] as const;
export const temperatureMethods = ['thermocouple', 'pyrometer', 'oven-setpoint', 'estimated'] as const;
export const atmospheres = ['air', 'argon', 'other'] as const;
export const coolings = ['still-air', 'forced-air', 'water-quench', 'oil-quench', 'in-furnace', 'in-can', 'other'] as const;

export const sheetStatuses = ['draft', 'published'] as const;
export const sheetAudiences = ['class', 'public'] as const;
export const sheetUnits = ['c', 'f'] as const;
export const sheetPageSizes = ['a4', 'letter'] as const;
export const sheetOrientations = ['portrait', 'landscape'] as const;
export const sheetItemKinds = ['heading', 'swatch'] as const;
