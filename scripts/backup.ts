// `npm run backup [folder]`: a consistent backup of one Oxbloom installation — the database as one
// mariadb-dump taken in a single transaction, then every stored object — with a manifest of rows
// per table, the migration level and each object's SHA-256. See DEVELOPERS.md, "Backup and restore".
//   npm run backup                       the dev services, into backups/<time>/
//   npm run backup -- /somewhere --profile test
import { GetObjectCommand, ListObjectsV2Command } from '@aws-sdk/client-s3';
import { spawn } from 'node:child_process';
import { createHash } from 'node:crypto';
import { createWriteStream, existsSync, mkdirSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import mysql from 'mysql2/promise';
import { rowsPerTable } from '~/lib/backup/dump-rows';
import { BACKUP_FORMAT, DUMP_FILE, MANIFEST_FILE, OBJECTS_FOLDER, safeKey, type Manifest } from '~/lib/backup/manifest';
import { clientInvocation, migrationTag, parseArguments, resolveTarget, type Target } from './backup-target';
import { SetupError } from './services/processes.mjs';

const sha256 = (data: Uint8Array | string) => createHash('sha256').update(data).digest('hex');

/** mariadb-dump of the whole database in one transaction (InnoDB's consistent snapshot, no table locks). */
async function dumpDatabase(target: Target, file: string): Promise<void> {
  const { args, env } = clientInvocation(target);
  const dump = spawn(
    'mariadb-dump',
    [
      ...args,
      '--single-transaction',
      '--skip-lock-tables',
      '--no-tablespaces',
      '--hex-blob',
      '--routines',
      '--triggers',
      '--skip-dump-date',
      target.database.name,
    ],
    { env, stdio: ['ignore', 'pipe', 'pipe'] },
  );
  let errors = '';
  dump.stderr.on('data', (chunk) => (errors += chunk));
  const out = createWriteStream(file);
  dump.stdout.pipe(out);
  const [code] = await Promise.all([
    new Promise<number | null>((resolve, reject) => {
      dump.on('error', reject);
      dump.on('close', resolve);
    }),
    new Promise<void>((resolve) => out.on('finish', () => resolve())),
  ]);
  if (code !== 0) throw new SetupError(`mariadb-dump failed on ${target.label}: ${errors.trim().split('\n').pop() ?? `exit ${code}`}`);
}

/** The migrations applied, as Drizzle's migrator records them in the dumped database. */
async function migrationLevel(target: Target): Promise<{ applied: number; latest: string | null }> {
  const connection = await mysql.createConnection({ uri: target.database.url });
  try {
    const [rows] = await connection.query('SELECT COUNT(*) AS applied, MAX(created_at) AS latest FROM __drizzle_migrations');
    const [{ applied, latest }] = rows as { applied: number; latest: string | number | null }[];
    return { applied: Number(applied), latest: migrationTag(latest === null ? null : Number(latest)) };
  } catch (error) {
    if ((error as { code?: string }).code === 'ER_NO_SUCH_TABLE') return { applied: 0, latest: null };
    throw error;
  } finally {
    await connection.end();
  }
}

/** Copies every object of the bucket into objects/<key>, noting its size, type and SHA-256. */
async function copyObjects(target: Target, folder: string): Promise<Manifest['objects']> {
  const objects: Manifest['objects'] = [];
  let ContinuationToken: string | undefined;
  do {
    const page = await target.s3.send(new ListObjectsV2Command({ Bucket: target.bucket, ContinuationToken }));
    for (const item of page.Contents ?? []) {
      const key = safeKey.parse(item.Key);
      const object = await target.s3.send(new GetObjectCommand({ Bucket: target.bucket, Key: key }));
      const bytes = (await object.Body?.transformToByteArray()) ?? new Uint8Array();
      const file = path.join(folder, OBJECTS_FOLDER, ...key.split('/'));
      mkdirSync(path.dirname(file), { recursive: true });
      writeFileSync(file, bytes);
      objects.push({ key, bytes: bytes.length, sha256: sha256(bytes), contentType: object.ContentType ?? null });
    }
    ContinuationToken = page.IsTruncated ? page.NextContinuationToken : undefined;
  } while (ContinuationToken);
  return objects.sort((a, b) => (a.key < b.key ? -1 : 1));
}

async function main() {
  const { folder: given, profile } = parseArguments(process.argv.slice(2));
  const folder = path.resolve(given ?? path.join('backups', new Date().toISOString().replace(/[:.]/g, '-')));
  if (existsSync(folder) && readdirSync(folder).length > 0) throw new SetupError(`${folder} is not empty: back up into a new or empty folder.`);
  mkdirSync(folder, { recursive: true });
  const target = resolveTarget(profile);

  const started = Date.now();
  // The dump first, then the objects: every photo row in the dump had its files stored before it
  // was committed, so they are all there to copy (unless deleted in the seconds between).
  const dumpFile = path.join(folder, DUMP_FILE);
  await dumpDatabase(target, dumpFile);
  const dump = readFileSync(dumpFile);
  const migrations = await migrationLevel(target);
  const objects = await copyObjects(target, folder);

  const manifest: Manifest = {
    format: BACKUP_FORMAT,
    version: 1,
    createdAt: new Date().toISOString(),
    database: { name: target.database.name, sha256: sha256(dump), bytes: dump.length, rows: rowsPerTable(dump.toString('utf8')), migrations },
    bucket: target.bucket,
    objects,
  };
  writeFileSync(path.join(folder, MANIFEST_FILE), `${JSON.stringify(manifest, null, 2)}\n`);
  const rows = Object.values(manifest.database.rows).reduce((sum, count) => sum + count, 0);
  console.log(
    `[backup] ${target.label}: ${Object.keys(manifest.database.rows).length} tables, ${rows} rows, migration ${migrations.latest ?? 'none'}; ` +
      `${objects.length} objects; in ${folder} (${((Date.now() - started) / 1000).toFixed(1)} s).`,
  );
  target.s3.destroy();
}

main().catch((error) => {
  console.error(`[backup] ${error instanceof SetupError ? error.message : ((error as Error).stack ?? error)}`);
  process.exit(1);
});
