// @ts-check
// Where each run of the app keeps its services: `dev` for `npm start`, `test` for `npm test`,
// `bench` for the library benchmark's generated data set (kept between runs).
// All can run at once: other ports, other data folders. Ports come from environment variables.
import { fileURLToPath } from 'node:url';
import path from 'node:path';
import { createHash } from 'node:crypto';

export const root = fileURLToPath(new URL('../..', import.meta.url));

const defaults = {
  dev: {
    app: ['PORT', 4321],
    db: ['OXBLOOM_DB_PORT', 3307],
    s3: ['OXBLOOM_S3_PORT', 4569],
    smtp: ['OXBLOOM_SMTP_PORT', 2525],
    inbox: ['OXBLOOM_INBOX_PORT', 4580],
  },
  test: {
    app: ['OXBLOOM_TEST_PORT', 4331],
    db: ['OXBLOOM_TEST_DB_PORT', 3317],
    s3: ['OXBLOOM_TEST_S3_PORT', 4579],
    smtp: ['OXBLOOM_TEST_SMTP_PORT', 2535],
    inbox: ['OXBLOOM_TEST_INBOX_PORT', 4590],
  },
  bench: {
    app: ['OXBLOOM_BENCH_PORT', 4471],
    db: ['OXBLOOM_BENCH_DB_PORT', 3457],
    s3: ['OXBLOOM_BENCH_S3_PORT', 4719],
    smtp: ['OXBLOOM_BENCH_SMTP_PORT', 2675],
    inbox: ['OXBLOOM_BENCH_INBOX_PORT', 4730],
  },
};

/** InnoDB's buffer pool and redo log: small for dev and test; the bench's million swatches load and fit in memory. */
const innodb = { dev: ['128M', '16M'], test: ['128M', '16M'], bench: ['1G', '512M'] };

/**
 * @param {Record<string, string | undefined>} environment
 * @param {string} variable
 * @param {number} fallback
 */
function readPort(environment, variable, fallback) {
  const raw = environment[variable];
  if (raw === undefined || raw === '') return fallback;
  const port = Number(raw);
  if (!Number.isInteger(port) || port < 1 || port > 65535) {
    throw new Error(`${variable}=${raw} is not a port number (1-65535).`);
  }
  return port;
}

/**
 * @param {'dev' | 'test' | 'bench'} name
 * @param {Record<string, string | undefined>} environment where ports and OXBLOOM_DATA_ROOT are read
 */
export function loadProfile(name, environment = process.env) {
  const ports = /** @type {Record<"app" | "db" | "s3" | "smtp" | "inbox", number>} */ ({});
  const portVariables = /** @type {Record<"app" | "db" | "s3" | "smtp" | "inbox", string>} */ ({});
  for (const [service, [variable, fallback]] of /** @type {[keyof typeof ports, [string, number]][]} */ (Object.entries(defaults[name]))) {
    ports[service] = readPort(environment, variable, fallback);
    portVariables[service] = variable;
  }
  // OXBLOOM_DATA_ROOT moves every data folder (used by tests of start-up itself).
  const dataRoot = environment.OXBLOOM_DATA_ROOT ?? root;
  const dataDir = path.join(dataRoot, '.data', name);
  // Unix socket paths are limited to ~107 bytes, so the socket lives in /tmp under a short hash.
  const tag = createHash('sha256').update(dataDir).digest('hex').slice(0, 10);
  const host = '127.0.0.1';
  const bucket = 'oxbloom-photos';
  return {
    name,
    host,
    ports,
    portVariables,
    dataDir,
    runDir: path.join(dataDir, 'run'),
    mariadbDir: path.join(dataDir, 'mariadb'),
    mailDir: path.join(dataDir, 'mail'),
    s3Dir: path.join(dataRoot, 'local-s3', 'data', name),
    outDir: name === 'dev' ? path.join(root, 'dist') : path.join(dataDir, 'dist'),
    socket: `/tmp/oxbloom-${tag}.sock`,
    innodbBufferPool: innodb[name][0],
    innodbLogFile: innodb[name][1],
    bucket,
    database: 'oxbloom',
    databaseUser: 'oxbloom',
    databasePassword: 'oxbloom-local',
    appUrl: `http://${host}:${ports.app}`,
  };
}

/** @typedef {ReturnType<typeof loadProfile>} Profile */

/**
 * The environment the app, migrations and seed read (see src/lib/server/config.ts).
 * @param {Profile} profile
 * @param {string} authSecret
 */
export function appEnvironment(profile, authSecret) {
  const { host, ports } = profile;
  return {
    HOST: host,
    PORT: String(ports.app),
    APP_URL: profile.appUrl,
    DATABASE_URL: `mysql://${profile.databaseUser}:${profile.databasePassword}@${host}:${ports.db}/${profile.database}`,
    S3_ENDPOINT: `http://${host}:${ports.s3}`,
    S3_REGION: 'us-east-1',
    S3_BUCKET: profile.bucket,
    S3_ACCESS_KEY_ID: 'S3RVER',
    S3_SECRET_ACCESS_KEY: 'S3RVER',
    SMTP_HOST: host,
    SMTP_PORT: String(ports.smtp),
    MAIL_FROM: 'Oxbloom <no-reply@oxbloom.test>',
    AUTH_SECRET: authSecret,
    AUTH_TRUST_HOST: 'true',
    OXBLOOM_MAIL_DIR: profile.mailDir,
    // The SDK is pinned to a release that supports Node 20; its notice about later releases is noise here.
    AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED: 'true',
  };
}
