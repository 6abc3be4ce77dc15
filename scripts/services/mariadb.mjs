// @ts-check
// A private MariaDB for one profile: its own data folder, loopback only, stopped by pid file.
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync } from 'node:fs';
import { userInfo } from 'node:os';
import path from 'node:path';
import { SetupError, isAlive, readPid, requireFreePort, sleep, startBackground, stopByPidFile } from './processes.mjs';

/** @typedef {import('./profile.mjs').Profile} Profile */

/** @param {Profile} profile */
const pidFileOf = (profile) => path.join(profile.runDir, 'mariadb.pid');
/** @param {Profile} profile */
const logFileOf = (profile) => path.join(profile.runDir, 'mariadb.log');

/** @param {Profile} profile @param {string} sql */
function client(profile, sql) {
  return spawnSync('mariadb', ['--no-defaults', `--socket=${profile.socket}`, '-u', userInfo().username, '-e', sql], { encoding: 'utf8' });
}

/** @param {Profile} profile */
function ping(profile) {
  return spawnSync('mariadb-admin', ['--no-defaults', `--socket=${profile.socket}`, '-u', userInfo().username, 'ping'], { stdio: 'ignore' }).status === 0;
}

/** @param {Profile} profile */
function lastLogLines(profile) {
  try {
    return readFileSync(logFileOf(profile), 'utf8').trim().split('\n').slice(-3).join(' | ');
  } catch {
    return 'no log';
  }
}

/** @param {Profile} profile */
export async function startMariadb(profile) {
  const pidFile = pidFileOf(profile);
  const running = readPid(pidFile);
  if (running && isAlive(running) && ping(profile)) return { reused: true };

  await requireFreePort(profile.ports.db, profile.portVariables.db, 'MariaDB');
  if (!existsSync(path.join(profile.mariadbDir, 'mysql'))) {
    mkdirSync(profile.mariadbDir, { recursive: true });
    const init = spawnSync(
      'mariadb-install-db',
      ['--no-defaults', `--user=${userInfo().username}`, `--datadir=${profile.mariadbDir}`, '--auth-root-authentication-method=socket', '--skip-test-db'],
      { encoding: 'utf8' },
    );
    if (init.error) throw new SetupError(`mariadb-install-db could not run (${init.error.message}): is Debian's mariadb-server installed?`);
    if (init.status !== 0) throw new SetupError(`mariadb-install-db failed: ${(init.stderr || init.stdout || '').trim().split('\n').pop()}`);
  }

  // Temporary tables in a folder of its own: other servers on the machine share /tmp.
  const tmpDir = path.join(profile.runDir, 'tmp');
  mkdirSync(tmpDir, { recursive: true });
  const args = [
    '--no-defaults',
    ...(process.getuid?.() === 0 ? ['--user=root'] : []),
    `--datadir=${profile.mariadbDir}`,
    `--socket=${profile.socket}`,
    `--pid-file=${path.join(profile.runDir, 'mariadbd.pid')}`,
    `--port=${profile.ports.db}`,
    '--bind-address=127.0.0.1',
    `--log-error=${logFileOf(profile)}`,
    `--tmpdir=${tmpDir}`,
    '--skip-name-resolve',
    '--character-set-server=utf8mb4',
    '--collation-server=utf8mb4_unicode_ci',
    '--default-time-zone=+00:00',
    `--innodb-buffer-pool-size=${profile.innodbBufferPool}`,
    `--innodb-log-file-size=${profile.innodbLogFile}`,
    '--max-connections=200',
  ];
  const pid = startBackground('mariadbd', args, { pidFile, logFile: path.join(profile.runDir, 'mariadbd.out'), cwd: profile.mariadbDir });
  const deadline = Date.now() + 30_000;
  while (!ping(profile)) {
    if (!isAlive(pid)) throw new SetupError(`MariaDB stopped during start-up: ${lastLogLines(profile)}`);
    if (Date.now() > deadline) throw new SetupError(`MariaDB did not answer within 30 s: ${lastLogLines(profile)}`);
    await sleep(100);
  }
  return { reused: false };
}

/**
 * Creates the app's database and user (idempotent); `fresh` drops the database first.
 * @param {Profile} profile
 * @param {{ fresh?: boolean }} [options]
 */
export function prepareDatabase(profile, { fresh = false } = {}) {
  const { database, databaseUser: user, databasePassword: password } = profile;
  const sql = [
    fresh ? `DROP DATABASE IF EXISTS \`${database}\`;` : '',
    `CREATE DATABASE IF NOT EXISTS \`${database}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;`,
    `CREATE USER IF NOT EXISTS '${user}'@'127.0.0.1' IDENTIFIED BY '${password}';`,
    `CREATE USER IF NOT EXISTS '${user}'@'localhost' IDENTIFIED BY '${password}';`,
    `GRANT ALL PRIVILEGES ON \`${database}\`.* TO '${user}'@'127.0.0.1';`,
    `GRANT ALL PRIVILEGES ON \`${database}\`.* TO '${user}'@'localhost';`,
  ].join(' ');
  const result = client(profile, sql);
  if (result.status !== 0) throw new SetupError(`Could not create the database: ${result.stderr.trim()}`);
}

/** @param {Profile} profile */
export function stopMariadb(profile) {
  return stopByPidFile(pidFileOf(profile), 60_000);
}
