// @ts-check
// `npm start`: install what is missing, start the private services, migrate, seed the demo on
// first run, build, and serve on http://127.0.0.1:4321. Ctrl-C (or `npm run stop`) stops it all.
// `npm start -- --dev` serves with Astro's dev server instead of a build.
import { spawn } from 'node:child_process';
import path from 'node:path';
import { ensureDebianPackages, ensureNodeModules } from './services/system.mjs';
import { loadProfile, appEnvironment, root } from './services/profile.mjs';
import { SetupError, isAlive, readPid, requireFreePort, waitForPort } from './services/processes.mjs';

const started = Date.now();
const devServer = process.argv.includes('--dev');
/** @type {import('./services/profile.mjs').Profile} */
let profile;

async function main() {
  profile = loadProfile('dev');
  const previous = readPid(path.join(profile.runDir, 'supervisor.pid'));
  if (previous && previous !== process.pid && isAlive(previous)) {
    throw new SetupError(`Oxbloom is already running (pid ${previous}); stop it with: npm run stop`);
  }
  ensureDebianPackages({ mariadbd: 'mariadb-server' });
  ensureNodeModules();

  const { startServices, stopServices, authSecret, serverArguments } = await import('./services/index.mjs');
  const { migrate, seed, build } = await import('./services/tasks.mjs');
  const { writeFileSync, mkdirSync, rmSync } = await import('node:fs');
  mkdirSync(profile.runDir, { recursive: true });
  writeFileSync(path.join(profile.runDir, 'supervisor.pid'), String(process.pid));

  let stopping = false;
  const shutdown = async (code = 0) => {
    if (stopping) return;
    stopping = true;
    console.log('\n[oxbloom] stopping…');
    const stopped = await stopServices(profile);
    rmSync(path.join(profile.runDir, 'supervisor.pid'), { force: true });
    console.log(`[oxbloom] stopped ${stopped.join(', ') || 'nothing'}.`);
    process.exit(code);
  };
  process.on('SIGINT', () => shutdown(0));
  process.on('SIGTERM', () => shutdown(0));

  try {
    await requireFreePort(profile.ports.app, profile.portVariables.app, 'the app');
    await startServices(profile);
    const env = appEnvironment(profile, authSecret(profile));
    migrate(env);
    seed(env);
    if (!devServer && build(profile, env)) console.log('[oxbloom] built.');

    const command = devServer
      ? [path.join(root, 'node_modules', 'astro', 'astro.js'), 'dev', '--host', profile.host, '--port', String(profile.ports.app)]
      : serverArguments(profile.outDir);
    const app = spawn(process.execPath, command, { stdio: 'inherit', cwd: root, env: { ...process.env, ...env } });
    writeFileSync(path.join(profile.runDir, 'app.pid'), String(app.pid));
    app.on('exit', (code) => shutdown(code ?? 0));
    await waitForPort(profile.ports.app, { pid: app.pid, what: 'The app server', timeoutMs: 60_000 });
    const seconds = ((Date.now() - started) / 1000).toFixed(1);
    console.log(`[oxbloom] ready in ${seconds} s at ${profile.appUrl} — captured mail at http://${profile.host}:${profile.ports.inbox} — Ctrl-C to stop.`);
  } catch (error) {
    await stopServices(profile).catch(() => {});
    rmSync(path.join(profile.runDir, 'supervisor.pid'), { force: true });
    throw error;
  }
}

main().catch((error) => {
  console.error(`[oxbloom] ${error instanceof SetupError ? error.message : (error.stack ?? error)}`);
  process.exit(1);
});
