// @ts-check
// The steps between "services are up" and "the app serves": migrate, seed, build.
import { spawnSync } from 'node:child_process';
import { existsSync, readdirSync, statSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { SetupError } from './processes.mjs';
import { root } from './profile.mjs';

/** @typedef {import('./profile.mjs').Profile} Profile */
/** @typedef {Record<string, string | undefined>} Env */

const tsx = path.join(root, 'node_modules', 'tsx', 'dist', 'cli.mjs');
const astro = path.join(root, 'node_modules', 'astro', 'astro.js');

/** @param {string[]} args @param {Env} env @param {string} what */
function runNode(args, env, what) {
  const result = spawnSync(process.execPath, args, { stdio: 'inherit', cwd: root, env: { ...process.env, ...env } });
  if (result.status !== 0) throw new SetupError(`${what} failed (exit ${result.status}); see the lines above.`);
}

/**
 * Runs a step whose failure is told in its last line of stderr; that line becomes ours.
 * @param {string[]} args
 * @param {Env} env
 * @param {string} what
 */
function runStep(args, env, what) {
  const result = spawnSync(process.execPath, args, { stdio: ['ignore', 'inherit', 'pipe'], cwd: root, env: { ...process.env, ...env }, encoding: 'utf8' });
  const lines = (result.stderr ?? '').trim().split('\n').filter(Boolean);
  if (result.status !== 0) throw new SetupError(`${what} failed: ${lines.at(-1) ?? `exit ${result.status}`}`);
  for (const line of lines) process.stderr.write(`${line}\n`);
}

/** @param {Env} env */
export const migrate = (env) => runStep([tsx, 'scripts/migrate.ts'], env, 'Applying the database migrations');
/** @param {Env} env */
export const seed = (env) => runStep([tsx, 'scripts/seed/seed.ts'], env, 'Seeding the database');

/**
 * @param {string} entry
 * @returns {number}
 */
function newestChange(entry) {
  if (!existsSync(entry)) return 0;
  const stat = statSync(entry);
  if (!stat.isDirectory()) return stat.mtimeMs;
  let newest = stat.mtimeMs;
  for (const name of readdirSync(entry)) newest = Math.max(newest, newestChange(path.join(entry, name)));
  return newest;
}

/**
 * Builds the app into profile.outDir unless the last build is newer than every source file.
 * @param {Profile} profile
 * @param {Env} env
 */
export function build(profile, env) {
  const stamp = path.join(profile.outDir, '.built');
  const sources = ['src', 'public', 'db', 'astro.config.mjs', 'package-lock.json', 'tsconfig.json', 'scripts/patches'].map((entry) => path.join(root, entry));
  const lastBuild = existsSync(stamp) ? statSync(stamp).mtimeMs : 0;
  if (lastBuild > Math.max(...sources.map(newestChange))) return false;
  runNode([astro, 'build', '--silent'], { ...env, OXBLOOM_OUT_DIR: profile.outDir, ASTRO_TELEMETRY_DISABLED: '1' }, 'Building the app');
  writeFileSync(stamp, new Date().toISOString());
  return true;
}
