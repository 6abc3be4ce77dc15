// @ts-check
// Starts and stops the private services of one profile: MariaDB, the S3 fake and the mail fake.
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { randomBytes } from 'node:crypto';
import path from 'node:path';
import { startMariadb, prepareDatabase, stopMariadb } from './mariadb.mjs';
import { isAlive, readPid, requireFreePort, startBackground, stopByPidFile, waitForPort } from './processes.mjs';
import { root } from './profile.mjs';

/** @typedef {import('./profile.mjs').Profile} Profile */

/** @param {Profile} profile @param {string} name */
const pidFile = (profile, name) => path.join(profile.runDir, `${name}.pid`);
/** @param {Profile} profile @param {string} name */
const logFile = (profile, name) => path.join(profile.runDir, `${name}.log`);

/**
 * @param {Profile} profile
 * @param {string} name
 * @param {string} script
 * @param {Record<string, string>} env
 * @param {[number, string, string][]} ports port, its variable, and what listens there
 */
async function startNodeService(profile, name, script, env, ports) {
  const existing = readPid(pidFile(profile, name));
  if (existing && isAlive(existing)) return;
  for (const [port, variable, what] of ports) await requireFreePort(port, variable, what);
  const pid = startBackground(process.execPath, [script], {
    pidFile: pidFile(profile, name),
    logFile: logFile(profile, name),
    env,
    cwd: root,
  });
  for (const [port, , what] of ports) await waitForPort(port, { pid, what });
}

/**
 * @param {Profile} profile
 * @param {{ freshDatabase?: boolean }} [options]
 */
export async function startServices(profile, { freshDatabase = false } = {}) {
  mkdirSync(profile.runDir, { recursive: true });
  await startMariadb(profile);
  prepareDatabase(profile, { fresh: freshDatabase });

  const origins = [profile.appUrl, `http://localhost:${profile.ports.app}`].join(',');
  await startNodeService(
    profile,
    's3',
    path.join(root, 'local-s3', 'server.mjs'),
    { LOCAL_S3_PORT: String(profile.ports.s3), LOCAL_S3_DIR: profile.s3Dir, LOCAL_S3_BUCKET: profile.bucket, LOCAL_S3_ORIGINS: origins },
    [[profile.ports.s3, profile.portVariables.s3, 'the S3 fake']],
  );
  await startNodeService(
    profile,
    'mail',
    path.join(root, 'scripts', 'services', 'mail-fake.mjs'),
    { MAIL_FAKE_SMTP_PORT: String(profile.ports.smtp), MAIL_FAKE_INBOX_PORT: String(profile.ports.inbox), MAIL_FAKE_DIR: profile.mailDir },
    [
      [profile.ports.smtp, profile.portVariables.smtp, 'the mail fake (SMTP)'],
      [profile.ports.inbox, profile.portVariables.inbox, 'the mail fake (inbox page)'],
    ],
  );
}

/**
 * The arguments to `node` that serve a build: scripts/serve.mjs with the build's folder.
 * @param {string} outDir
 */
export function serverArguments(outDir) {
  return [path.join(root, 'scripts', 'serve.mjs'), outDir];
}

/**
 * Starts the built app (`node scripts/serve.mjs <outDir>`) in the background.
 * @param {Profile} profile
 * @param {Record<string, string>} env
 */
export async function startApp(profile, env) {
  await requireFreePort(profile.ports.app, profile.portVariables.app, 'the app');
  const pid = startBackground(process.execPath, serverArguments(profile.outDir), {
    pidFile: pidFile(profile, 'app'),
    logFile: logFile(profile, 'app'),
    env,
    cwd: root,
  });
  await waitForPort(profile.ports.app, { pid, what: 'The app server', timeoutMs: 30_000 });
  return pid;
}

/** @param {Profile} profile */
export async function stopServices(profile) {
  const stopped = [];
  for (const name of ['app', 'mail', 's3']) {
    if (await stopByPidFile(pidFile(profile, name))) stopped.push(name);
  }
  if (await stopMariadb(profile)) stopped.push('mariadb');
  return stopped;
}

/**
 * A random secret for signing sessions, made once per profile and kept with its data.
 * @param {Profile} profile
 */
export function authSecret(profile) {
  const file = path.join(profile.dataDir, 'auth-secret');
  if (!existsSync(file)) {
    mkdirSync(profile.dataDir, { recursive: true });
    writeFileSync(file, randomBytes(32).toString('base64url'), { mode: 0o600 });
  }
  return readFileSync(file, 'utf8').trim();
}

export { logFile };
