// Where `npm run backup` and `npm run restore` find the database and the object store: the
// running private services of a profile (`--profile dev|test|bench`, dev by default), or, when
// DATABASE_URL is set and no profile is named, DATABASE_URL and the S3_* settings of the
// environment (another server's).
import { S3Client } from '@aws-sdk/client-s3';
import { readFileSync } from 'node:fs';
import { appEnvironment, loadProfile } from './services/profile.mjs';
import { SetupError } from './services/processes.mjs';

export interface Target {
  /** What the target is, in words, for messages. */
  label: string;
  database: { host: string; port: number; user: string; password: string; name: string; url: string };
  s3: S3Client;
  bucket: string;
}

const PROFILES = ['dev', 'test', 'bench'] as const;

/** The folder argument and the flags of a backup or restore command line. */
export function parseArguments(argv: string[]): { folder: string | undefined; profile: string | undefined; flags: Set<string> } {
  const flags = new Set<string>();
  let folder: string | undefined;
  let profile: string | undefined;
  for (let index = 0; index < argv.length; index += 1) {
    const argument = argv[index];
    if (argument === '--profile') profile = argv[++index];
    else if (argument.startsWith('--profile=')) profile = argument.slice('--profile='.length);
    else if (argument.startsWith('--')) flags.add(argument);
    else if (folder === undefined) folder = argument;
    else throw new SetupError(`One folder only, please: ${folder} or ${argument}?`);
  }
  return { folder, profile, flags };
}

export function resolveTarget(profileName: string | undefined): Target {
  let settings: Record<string, string | undefined>;
  let label: string;
  if (profileName === undefined && process.env.DATABASE_URL) {
    settings = process.env;
    label = 'the database of DATABASE_URL';
  } else {
    const name = profileName ?? 'dev';
    if (!(PROFILES as readonly string[]).includes(name)) throw new SetupError(`--profile must be one of ${PROFILES.join(', ')}, not ${name}.`);
    const profile = loadProfile(name as (typeof PROFILES)[number]);
    // No session is signed here: the secret is not needed.
    settings = appEnvironment(profile, '');
    label = `the ${name} services (MariaDB on 127.0.0.1:${profile.ports.db})`;
  }
  const url = new URL(settings.DATABASE_URL ?? '');
  const s3 = new S3Client({
    endpoint: settings.S3_ENDPOINT,
    region: settings.S3_REGION ?? 'us-east-1',
    forcePathStyle: true,
    credentials: { accessKeyId: settings.S3_ACCESS_KEY_ID ?? '', secretAccessKey: settings.S3_SECRET_ACCESS_KEY ?? '' },
    // As the app's client (src/lib/server/storage.ts): s3rver stores chunk framing otherwise.
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
  });
  return {
    label,
    database: {
      host: url.hostname,
      port: Number(url.port || 3306),
      user: decodeURIComponent(url.username),
      password: decodeURIComponent(url.password),
      name: decodeURIComponent(url.pathname.slice(1)),
      url: url.toString(),
    },
    s3,
    bucket: settings.S3_BUCKET ?? 'oxbloom-photos',
  };
}

/** Arguments and environment for the MariaDB command-line tools: over TCP, the password in MYSQL_PWD (never on the command line). */
export function clientInvocation(target: Target): { args: string[]; env: NodeJS.ProcessEnv } {
  const { host, port, user, password } = target.database;
  return {
    args: ['--no-defaults', `--host=${host}`, `--port=${port}`, `--user=${user}`, '--protocol=TCP', '--default-character-set=utf8mb4'],
    env: { ...process.env, MYSQL_PWD: password },
  };
}

/** The migrations this copy of the code has, by tag, in order. */
export function knownMigrations(): string[] {
  const journal = JSON.parse(readFileSync(new URL('../db/migrations/meta/_journal.json', import.meta.url), 'utf8')) as {
    entries: { tag: string; when: number }[];
  };
  return journal.entries.map((entry) => entry.tag);
}

/** The tag of the migration applied at `when` (Drizzle's `created_at` is the journal's `when`). */
export function migrationTag(when: number | null): string | null {
  if (when === null) return null;
  const journal = JSON.parse(readFileSync(new URL('../db/migrations/meta/_journal.json', import.meta.url), 'utf8')) as {
    entries: { tag: string; when: number }[];
  };
  return journal.entries.find((entry) => entry.when === when)?.tag ?? `unknown migration of ${new Date(when).toISOString()}`;
}
