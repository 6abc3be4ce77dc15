// npm run backup / npm run restore: a round trip between scratch databases and buckets on the test
// services, checked with MariaDB's own COUNT(*) and CHECKSUM TABLE and SHA-256 of every object
// computed here, and refusals of a tampered backup and of a target that holds data.
import { CreateBucketCommand, DeleteBucketCommand, GetObjectCommand, PutObjectCommand } from '@aws-sdk/client-s3';
import { spawnSync } from 'node:child_process';
import { createHash, randomBytes } from 'node:crypto';
import { cpSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir, userInfo } from 'node:os';
import path from 'node:path';
import mysql from 'mysql2/promise';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { loadProfile } from '../../scripts/services/profile.mjs';
import { testS3 } from '../support/storage';

const profile = loadProfile('test');
const tag = randomBytes(4).toString('hex');
const source = { database: `oxbloom_bk_src_${tag}`, bucket: `oxbloom-bk-src-${tag}` };
const restored = { database: `oxbloom_bk_dst_${tag}`, bucket: `oxbloom-bk-dst-${tag}` };
const workDir = mkdtempSync(path.join(tmpdir(), 'oxbloom-backup-'));
const backupDir = path.join(workDir, 'backup');
const appUrl = new URL(process.env.DATABASE_URL!);
const urlOf = (database: string) => Object.assign(new URL(appUrl), { pathname: `/${database}` }).toString();

/** The test MariaDB as its administrator (the OS account, over the socket), through the mariadb client. */
function asAdministrator(sql: string) {
  const result = spawnSync('mariadb', ['--no-defaults', `--socket=${profile.socket}`, '-u', userInfo().username, '-e', sql], { encoding: 'utf8' });
  if (result.status !== 0) throw new Error(result.stderr);
  return result.stdout;
}

function run(script: 'backup' | 'restore', args: string[], target: { database: string; bucket: string }) {
  return spawnSync(process.execPath, ['node_modules/tsx/dist/cli.mjs', `scripts/${script}.ts`, ...args], {
    encoding: 'utf8',
    env: { ...process.env, DATABASE_URL: urlOf(target.database), S3_BUCKET: target.bucket },
    timeout: 120_000,
  });
}

const sha256 = (bytes: Uint8Array) => createHash('sha256').update(bytes).digest('hex');

async function objectsOf(bucket: string): Promise<Map<string, string>> {
  const { ListObjectsV2Command } = await import('@aws-sdk/client-s3');
  const digests = new Map<string, string>();
  let ContinuationToken: string | undefined;
  do {
    const page = await testS3.send(new ListObjectsV2Command({ Bucket: bucket, ContinuationToken }));
    for (const item of page.Contents ?? []) {
      const object = await testS3.send(new GetObjectCommand({ Bucket: bucket, Key: item.Key }));
      digests.set(item.Key!, sha256(await object.Body!.transformToByteArray()));
    }
    ContinuationToken = page.IsTruncated ? page.NextContinuationToken : undefined;
  } while (ContinuationToken);
  return digests;
}

/**
 * A checksum of a table's stored values: each row's columns as text (NULL marked), CRC32 per row,
 * summed. Generated columns are left out — the database computes them from the others — and so is
 * CHECKSUM TABLE, whose result for a table with generated columns differs between two loads of the
 * same dump.
 */
async function checksumOf(connection: mysql.Connection, database: string, table: string): Promise<string> {
  const [columns] = await connection.query(
    "SELECT column_name AS name FROM information_schema.columns WHERE table_schema = ? AND table_name = ? AND extra NOT LIKE '%GENERATED%' ORDER BY ordinal_position",
    [database, table],
  );
  const values = (columns as { name: string }[]).map(({ name }) => `IFNULL(CAST(\`${name}\` AS CHAR), CHAR(0))`).join(', ');
  const [[{ checksum }]] = (await connection.query(
    `SELECT CAST(COALESCE(SUM(CRC32(CONCAT_WS(CHAR(31), ${values}))), 0) AS CHAR) AS checksum FROM \`${table}\``,
  )) as unknown as [[{ checksum: string }]];
  return checksum;
}

/** Rows and a checksum of the stored values of every table of a database. */
async function tablesOf(database: string): Promise<Record<string, { rows: number; checksum: string }>> {
  const connection = await mysql.createConnection({ uri: urlOf(database) });
  try {
    const [tables] = await connection.query("SELECT table_name AS name FROM information_schema.tables WHERE table_schema = ? AND table_type = 'BASE TABLE'", [
      database,
    ]);
    const result: Record<string, { rows: number; checksum: string }> = {};
    for (const { name } of tables as { name: string }[]) {
      const [[{ rows }]] = (await connection.query(`SELECT COUNT(*) AS \`rows\` FROM \`${name}\``)) as unknown as [[{ rows: number }]];
      result[name] = { rows: Number(rows), checksum: await checksumOf(connection, database, name) };
    }
    return result;
  } finally {
    await connection.end();
  }
}

beforeAll(async () => {
  const grant = (database: string) =>
    `CREATE DATABASE \`${database}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci; ` +
    `GRANT ALL PRIVILEGES ON \`${database}\`.* TO 'oxbloom'@'127.0.0.1'; GRANT ALL PRIVILEGES ON \`${database}\`.* TO 'oxbloom'@'localhost';`;
  asAdministrator(grant(source.database) + grant(restored.database));
  // The source: a copy of the test database (migrated and seeded with the demo), made with the
  // database's own tools, plus a row whose text a naive reading of the dump would miscount.
  const copy = spawnSync(
    'sh',
    [
      '-c',
      `mariadb-dump --no-defaults --socket=${profile.socket} -u ${userInfo().username} --single-transaction --hex-blob ${profile.database} | mariadb --no-defaults --socket=${profile.socket} -u ${userInfo().username} ${source.database}`,
    ],
    { encoding: 'utf8' },
  );
  expect(copy.status, copy.stderr).toBe(0);
  asAdministrator(
    `INSERT INTO \`${source.database}\`.app_settings (setting_key, value) VALUES ('backup-check', 'it''s (tricky): \\\\ ),( \\n ✦ INSERT INTO \`users\` VALUES (1);')`,
  );
  for (const bucket of [source.bucket, restored.bucket]) await testS3.send(new CreateBucketCommand({ Bucket: bucket }));
  // Objects like the app's: a photo folder's files, with their content types.
  for (let index = 0; index < 12; index += 1) {
    const folder = `users/backup-check/photos/${randomBytes(8).toString('hex')}/`;
    await testS3.send(
      new PutObjectCommand({ Bucket: source.bucket, Key: `${folder}original.jpg`, Body: randomBytes(2000 + index * 37), ContentType: 'image/jpeg' }),
    );
    await testS3.send(new PutObjectCommand({ Bucket: source.bucket, Key: `${folder}ab12-display.webp`, Body: randomBytes(900), ContentType: 'image/webp' }));
  }
}, 120_000);

afterAll(async () => {
  asAdministrator(`DROP DATABASE IF EXISTS \`${source.database}\`; DROP DATABASE IF EXISTS \`${restored.database}\`;`);
  const { DeleteObjectsCommand } = await import('@aws-sdk/client-s3');
  for (const bucket of [source.bucket, restored.bucket]) {
    const keys = [...(await objectsOf(bucket)).keys()];
    if (keys.length) await testS3.send(new DeleteObjectsCommand({ Bucket: bucket, Delete: { Objects: keys.map((Key) => ({ Key })) } }));
    await testS3.send(new DeleteBucketCommand({ Bucket: bucket }));
  }
  rmSync(workDir, { recursive: true, force: true });
}, 60_000);

describe('npm run backup, then npm run restore into a fresh database and bucket', () => {
  it('writes a manifest whose row counts and checksums are those of the source', async () => {
    const backup = run('backup', [backupDir], source);
    expect(backup.status, backup.stderr).toBe(0);
    const manifest = JSON.parse(readFileSync(path.join(backupDir, 'manifest.json'), 'utf8'));
    const tables = await tablesOf(source.database);
    // Source: COUNT(*) in the source database itself, not the dump the backup read.
    expect(manifest.database.rows).toEqual(Object.fromEntries(Object.entries(tables).map(([name, table]) => [name, table.rows])));
    expect(manifest.database.rows.coupons).toBeGreaterThan(100);
    expect(manifest.database.migrations.latest).toBe(JSON.parse(readFileSync('db/migrations/meta/_journal.json', 'utf8')).entries.at(-1).tag);
    const objects = await objectsOf(source.bucket);
    expect(new Map(manifest.objects.map((object: { key: string; sha256: string }) => [object.key, object.sha256]))).toEqual(objects);
    expect(sha256(readFileSync(path.join(backupDir, 'database.sql')))).toBe(manifest.database.sha256);
  }, 120_000);

  it('brings the fresh database and bucket to exactly the source’s rows and objects', async () => {
    const restore = run('restore', [backupDir], restored);
    expect(restore.status, restore.stderr).toBe(0);
    // Source: MariaDB's CHECKSUM TABLE … EXTENDED reads every row of both databases.
    expect(await tablesOf(restored.database)).toEqual(await tablesOf(source.database));
    expect(await objectsOf(restored.bucket)).toEqual(await objectsOf(source.bucket));
  }, 120_000);

  it('refuses to overwrite a database that holds data, unless told to replace it', async () => {
    const before = await tablesOf(restored.database);
    const again = run('restore', [backupDir], restored);
    expect(again.status).toBe(1);
    expect(again.stderr.trim()).toMatch(
      /^\[restore\] the database oxbloom_bk_dst_\w+ holds \d+ rows in \d+ tables and the bucket \S+ holds \d+ objects\. .* --replace/,
    );
    expect(await tablesOf(restored.database)).toEqual(before);

    const replaced = run('restore', [backupDir, '--replace'], restored);
    expect(replaced.status, replaced.stderr).toBe(0);
    expect(await tablesOf(restored.database)).toEqual(await tablesOf(source.database));
  }, 120_000);

  it('refuses a backup with a tampered object, naming it, and changes nothing', async () => {
    const tampered = path.join(workDir, 'tampered');
    cpSync(backupDir, tampered, { recursive: true });
    const manifest = JSON.parse(readFileSync(path.join(tampered, 'manifest.json'), 'utf8'));
    const victim = manifest.objects[3].key as string;
    const file = path.join(tampered, 'objects', ...victim.split('/'));
    const bytes = readFileSync(file);
    bytes[bytes.length >> 1] ^= 0x01;
    writeFileSync(file, bytes);
    const before = await tablesOf(restored.database);
    const beforeObjects = await objectsOf(restored.bucket);

    const restore = run('restore', [tampered, '--replace'], restored);
    expect(restore.status).toBe(1);
    expect(restore.stderr.trim()).toBe(
      `[restore] The backup in ${tampered} does not check out against its manifest: object ${victim} has changed since the backup (its SHA-256 differs). Nothing was restored.`,
    );
    expect(await tablesOf(restored.database)).toEqual(before);
    expect(await objectsOf(restored.bucket)).toEqual(beforeObjects);
  }, 120_000);

  it('refuses a folder that is not a backup', () => {
    const empty = mkdtempSync(path.join(workDir, 'empty-'));
    const restore = run('restore', [empty], restored);
    expect(restore.status).toBe(1);
    expect(restore.stderr.trim()).toBe(`[restore] ${empty} is not an Oxbloom backup: it has no manifest.json. Nothing was restored.`);
  });
});
