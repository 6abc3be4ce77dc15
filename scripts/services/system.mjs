// @ts-check
// Installs what a fresh Debian machine lacks: Debian packages, then the node modules.
import { spawnSync } from 'node:child_process';
import { existsSync, statSync } from 'node:fs';
import path from 'node:path';
import { SetupError } from './processes.mjs';
import { root } from './profile.mjs';

/** @param {string} name */
function hasCommand(name) {
  return spawnSync('sh', ['-c', `command -v ${name}`], { stdio: 'ignore' }).status === 0 || existsSync(`/usr/sbin/${name}`) || existsSync(`/usr/bin/${name}`);
}

/**
 * @param {string} command
 * @param {string[]} args
 * @param {string} what
 * @param {import('node:child_process').SpawnSyncOptions} [options]
 */
function run(command, args, what, options = {}) {
  const result = spawnSync(command, args, { stdio: 'inherit', cwd: root, ...options });
  if (result.error || result.status !== 0) {
    throw new SetupError(`${what} failed (${command} ${args.join(' ')} exited with ${result.status ?? result.error?.message}).`);
  }
}

/**
 * `needs` maps a command to the Debian package that provides it. Missing ones are installed with
 * apt-get (as root, or through sudo when that works without a password).
 * @param {Record<string, string>} needs
 */
export function ensureDebianPackages(needs) {
  const missing = [
    ...new Set(
      Object.entries(needs)
        .filter(([command]) => !hasCommand(command))
        .map(([, pkg]) => pkg),
    ),
  ];
  if (missing.length === 0) return;
  const asRoot = process.getuid?.() === 0;
  const sudo = asRoot ? [] : ['sudo', '-n'];
  if (!asRoot && spawnSync('sudo', ['-n', 'true'], { stdio: 'ignore' }).status !== 0) {
    throw new SetupError(`Missing Debian packages: ${missing.join(' ')}. Install them with: sudo apt-get install -y ${missing.join(' ')}`);
  }
  console.log(`[setup] installing Debian packages: ${missing.join(' ')}`);
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  const [command, ...prefix] = [...sudo, 'apt-get'];
  run(command, [...prefix, 'update', '-qq'], 'apt-get update', { env });
  run(command, [...prefix, 'install', '-y', '-qq', ...missing], `Installing ${missing.join(' ')}`, { env });
}

/** Runs `npm ci` when node_modules is missing or older than package-lock.json. */
export function ensureNodeModules() {
  const lock = path.join(root, 'package-lock.json');
  const installed = path.join(root, 'node_modules', '.package-lock.json');
  if (existsSync(installed) && statSync(installed).mtimeMs >= statSync(lock).mtimeMs) return;
  console.log('[setup] installing node modules (npm ci)');
  run('npm', ['ci', '--no-audit', '--no-fund'], 'npm ci');
}
