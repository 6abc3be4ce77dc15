// `npm run restore <folder>`: brings an installation back to exactly the state of a backup made by
// `npm run backup`. It checks the whole folder against its manifest first (the dump's and every
// object's SHA-256, the migration level) and restores nothing from a folder that does not check
// out; it refuses to overwrite a database or bucket that holds data unless given --replace.
//   npm run restore -- backups/2026-01-01T00-00-00-000Z
//   npm run restore -- /somewhere --profile test --replace
import { DeleteObjectsCommand, ListObjectsV2Command, PutObjectCommand } from '@aws-sdk/client-s3';
import { spawn } from 'node:child_process';
import { createHash } from 'node:crypto';
import { createReadStream, existsSync, readFileSync } from 'node:fs';
import path from 'node:path';
import mysql from 'mysql2/promise';
import { DUMP_FILE, MANIFEST_FILE, OBJECTS_FOLDER, manifestSchema, migrationFault, rowFaults, type Fault, type Manifest } from '~/lib/backup/manifest';
import { clientInvocation, knownMigrations, parseArguments, resolveTarget, type Target } from './backup-target';
import { SetupError } from './services/processes.mjs';

const sha256 = (data: Uint8Array) => createHash('sha256').update(data).digest('hex');
const REPLACE_FLAG = '--replace';

/** Reads the manifest and checks every file of the folder against it; throws naming what does not check out. */
function checkFolder(folder: string): Manifest {
  const manifestFile = path.join(folder, MANIFEST_FILE);
  if (!existsSync(manifestFile)) throw new SetupError(`${folder} is not an Oxbloom backup: it has no ${MANIFEST_FILE}. Nothing was restored.`);
  let raw: unknown;
  try {
    raw = JSON.parse(readFileSync(manifestFile, 'utf8'));
  } catch {
    throw new SetupError(`${manifestFile} is not JSON: the backup is damaged. Nothing was restored.`);
  }
  const parsed = manifestSchema.safeParse(raw);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    throw new SetupError(`${manifestFile} is not a manifest this version can read (${issue.path.join('.')}: ${issue.message}). Nothing was restored.`);
  }
  const manifest = parsed.data;
  const faults: Fault[] = [];
  const dumpFile = path.join(folder, DUMP_FILE);
  if (!existsSync(dumpFile)) faults.push({ what: `${DUMP_FILE} is missing` });
  else if (sha256(readFileSync(dumpFile)) !== manifest.database.sha256)
    faults.push({ what: `${DUMP_FILE} has changed since the backup (its SHA-256 differs)` });
  for (const object of manifest.objects) {
    const file = path.join(folder, OBJECTS_FOLDER, ...object.key.split('/'));
    if (!existsSync(file)) faults.push({ what: `object ${object.key} is missing` });
    else {
      const bytes = readFileSync(file);
      if (bytes.length !== object.bytes || sha256(bytes) !== object.sha256)
        faults.push({ what: `object ${object.key} has changed since the backup (its SHA-256 differs)` });
    }
  }
  const migration = migrationFault(manifest.database.migrations.latest, knownMigrations());
  if (migration) faults.push(migration);
  if (faults.length) {
    const shown = faults.slice(0, 5).map((fault) => fault.what);
    const more = faults.length > shown.length ? `; and ${faults.length - shown.length} more` : '';
    throw new SetupError(`The backup in ${folder} does not check out against its manifest: ${shown.join('; ')}${more}. Nothing was restored.`);
  }
  return manifest;
}

async function listAllKeys(target: Target): Promise<string[]> {
  const keys: string[] = [];
  let ContinuationToken: string | undefined;
  do {
    const page = await target.s3.send(new ListObjectsV2Command({ Bucket: target.bucket, ContinuationToken }));
    for (const item of page.Contents ?? []) if (item.Key) keys.push(item.Key);
    ContinuationToken = page.IsTruncated ? page.NextContinuationToken : undefined;
  } while (ContinuationToken);
  return keys;
}

/** Rows per table of the target database, counted exactly. */
async function countRows(connection: mysql.Connection, database: string): Promise<Record<string, number>> {
  const [tables] = await connection.query("SELECT table_name AS name FROM information_schema.tables WHERE table_schema = ? AND table_type = 'BASE TABLE'", [
    database,
  ]);
  const rows: Record<string, number> = {};
  for (const { name } of tables as { name: string }[]) {
    const [[{ count }]] = (await connection.query(`SELECT COUNT(*) AS count FROM \`${name.replaceAll('`', '``')}\``)) as unknown as [[{ count: number }]];
    rows[name] = Number(count);
  }
  return rows;
}

/** Refuses a target that holds data, unless asked to replace it; with --replace, empties it. */
async function prepareTarget(target: Target, connection: mysql.Connection, replace: boolean): Promise<void> {
  const rows = await countRows(connection, target.database.name);
  const filled = Object.entries(rows).filter(([table, count]) => count > 0 && table !== '__drizzle_migrations');
  const keys = await listAllKeys(target);
  if ((filled.length || keys.length) && !replace) {
    const held = [
      filled.length ? `the database ${target.database.name} holds ${filled.reduce((sum, [, count]) => sum + count, 0)} rows in ${filled.length} tables` : '',
      keys.length ? `the bucket ${target.bucket} holds ${keys.length} objects` : '',
    ].filter(Boolean);
    throw new SetupError(
      `${held.join(' and ')}. A restore replaces all of it with the backup: run again with ${REPLACE_FLAG} to do that (back it up first if it matters). Nothing was restored.`,
    );
  }
  // Every table goes, empty or not, so the dump's schema is the only one (the dump drops and creates its own tables too).
  await connection.query('SET FOREIGN_KEY_CHECKS = 0');
  for (const table of Object.keys(rows)) await connection.query(`DROP TABLE \`${table.replaceAll('`', '``')}\``);
  await connection.query('SET FOREIGN_KEY_CHECKS = 1');
  for (let start = 0; start < keys.length; start += 1000) {
    const Objects = keys.slice(start, start + 1000).map((Key) => ({ Key }));
    await target.s3.send(new DeleteObjectsCommand({ Bucket: target.bucket, Delete: { Objects } }));
  }
}

/** Feeds the dump to the mariadb client; the dump makes its tables and fills them. */
async function loadDump(target: Target, file: string): Promise<void> {
  const { args, env } = clientInvocation(target);
  const client = spawn('mariadb', [...args, target.database.name], { env, stdio: ['pipe', 'ignore', 'pipe'] });
  let errors = '';
  client.stderr.on('data', (chunk) => (errors += chunk));
  createReadStream(file).pipe(client.stdin);
  const code = await new Promise<number | null>((resolve, reject) => {
    client.on('error', reject);
    client.on('close', resolve);
  });
  if (code !== 0) throw new SetupError(`Loading ${DUMP_FILE} into ${target.label} failed: ${errors.trim().split('\n').pop() ?? `exit ${code}`}`);
}

async function main() {
  const { folder: given, profile, flags } = parseArguments(process.argv.slice(2));
  if (!given) throw new SetupError('Name the backup folder: npm run restore -- <folder> [--profile dev|test|bench] [--replace]');
  const unknown = [...flags].filter((flag) => flag !== REPLACE_FLAG);
  if (unknown.length) throw new SetupError(`Unknown option ${unknown[0]}: the options are --profile and ${REPLACE_FLAG}.`);
  const folder = path.resolve(given);
  const manifest = checkFolder(folder);
  const target = resolveTarget(profile);
  const started = Date.now();

  const connection = await mysql.createConnection({ uri: target.database.url });
  try {
    await prepareTarget(target, connection, flags.has(REPLACE_FLAG));
    await loadDump(target, path.join(folder, DUMP_FILE));
    for (const object of manifest.objects) {
      const body = readFileSync(path.join(folder, OBJECTS_FOLDER, ...object.key.split('/')));
      await target.s3.send(new PutObjectCommand({ Bucket: target.bucket, Key: object.key, Body: body, ContentType: object.contentType ?? undefined }));
    }
    // What is there now must be what the manifest says, row for row and key for key.
    const faults = rowFaults(manifest.database.rows, await countRows(connection, target.database.name));
    const keys = new Set(await listAllKeys(target));
    for (const object of manifest.objects) if (!keys.delete(object.key)) faults.push({ what: `object ${object.key} is not in the bucket` });
    for (const key of keys) faults.push({ what: `object ${key} is in the bucket but not in the backup` });
    if (faults.length)
      throw new SetupError(
        `The restore does not match the backup: ${faults
          .slice(0, 5)
          .map((fault) => fault.what)
          .join('; ')}.`,
      );
  } finally {
    await connection.end();
    target.s3.destroy();
  }
  const rows = Object.values(manifest.database.rows).reduce((sum, count) => sum + count, 0);
  console.log(
    `[restore] ${target.label} now holds the backup of ${manifest.createdAt}: ${rows} rows, migration ${manifest.database.migrations.latest ?? 'none'}, ` +
      `${manifest.objects.length} objects (${((Date.now() - started) / 1000).toFixed(1)} s).`,
  );
}

main().catch((error) => {
  console.error(`[restore] ${error instanceof SetupError ? error.message : ((error as Error).stack ?? error)}`);
  process.exit(1);
});
