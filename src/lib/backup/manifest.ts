import { z } from 'zod';

/**
 * A backup folder: `database.sql` (one mariadb-dump, taken in one transaction), `objects/<key>`
 * (every stored object) and `manifest.json`, which says what the rest must be: the dump's
 * SHA-256 and rows per table, the migration level, and each object's size, type and SHA-256.
 */

export const BACKUP_FORMAT = 'oxbloom-backup';
export const DUMP_FILE = 'database.sql';
export const OBJECTS_FOLDER = 'objects';
export const MANIFEST_FILE = 'manifest.json';

const sha256 = z.string().regex(/^[0-9a-f]{64}$/, 'is not a SHA-256 in hex');

/** Keys become paths under objects/: nothing that climbs out of it. */
export const safeKey = z
  .string()
  .min(1)
  .max(1024)
  .refine((key) => !key.startsWith('/') && !key.split('/').some((part) => part === '..' || part === '.' || part === ''), 'is not a plain object key');

export const manifestSchema = z.object({
  format: z.literal(BACKUP_FORMAT),
  version: z.literal(1),
  createdAt: z.iso.datetime(),
  database: z.object({
    name: z.string().min(1),
    sha256,
    bytes: z.number().int().nonnegative(),
    rows: z.record(z.string(), z.number().int().nonnegative()),
    migrations: z.object({ applied: z.number().int().nonnegative(), latest: z.string().nullable() }),
  }),
  bucket: z.string().min(1),
  objects: z.array(z.object({ key: safeKey, bytes: z.number().int().nonnegative(), sha256, contentType: z.string().nullable() })),
});

export type Manifest = z.infer<typeof manifestSchema>;

/** A fault of a backup folder, or of the data restored from it, in words for the person restoring. */
export interface Fault {
  what: string;
}

/** Rows per table that differ between what the manifest says and what is there. */
export function rowFaults(expected: Record<string, number>, actual: Record<string, number>): Fault[] {
  const tables = [...new Set([...Object.keys(expected), ...Object.keys(actual)])].sort();
  return tables
    .filter((table) => expected[table] !== actual[table])
    .map((table) => ({ what: `table ${table}: ${actual[table] ?? 'missing'} rows, the manifest says ${expected[table] ?? 'no such table'}` }));
}

/** The migration a backup was made at must be one this install knows, or its schema is newer than our code. */
export function migrationFault(latest: string | null, known: string[]): Fault | undefined {
  if (latest === null || known.includes(latest)) return undefined;
  return {
    what: `the backup was made at migration ${latest}, which this copy of Oxbloom does not have: restore it with the version that made it, or a later one`,
  };
}
