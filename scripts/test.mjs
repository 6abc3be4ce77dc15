// @ts-check
// `npm test`: the whole suite on its own services (other ports and data than `npm start`, so both
// can run at once). Installs what is missing, type-checks, starts a fresh MariaDB database, the S3
// fake and the mail fake, migrates, seeds the demo, builds and starts the app, runs vitest, stops.
// Extra arguments go to vitest, e.g. `npm test -- tests/unit`.
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { ensureDebianPackages, ensureNodeModules } from './services/system.mjs';
import { loadProfile, appEnvironment, root } from './services/profile.mjs';
import { SetupError, isAlive, readPid } from './services/processes.mjs';

const started = Date.now();
const vitestArgs = process.argv.slice(2);
const seconds = () => `${((Date.now() - started) / 1000).toFixed(1)} s`;
/** @param {string} what */
const step = (what) => console.log(`[test] ${what} (${seconds()})`);

/** @param {string} reportFile */
function summarise(reportFile) {
  if (!existsSync(reportFile)) return;
  const report = JSON.parse(readFileSync(reportFile, 'utf8'));
  const skipped = (report.numPendingTests ?? 0) + (report.numTodoTests ?? 0);
  console.log(`\ntests: ${report.numPassedTests} passed, ${report.numFailedTests} failed, ${skipped} skipped`);
}

/**
 * @param {string} what
 * @param {string[]} script path of the checker under node_modules
 * @param {string[]} args
 * @param {string} failure
 */
function runChecker(what, script, args, failure) {
  step(what);
  const check = spawnSync(process.execPath, [path.join(root, 'node_modules', ...script), ...args], {
    stdio: 'inherit',
    cwd: root,
    env: { ...process.env, ASTRO_TELEMETRY_DISABLED: '1' },
  });
  if (check.status !== 0) throw new SetupError(failure);
}

/** The formatter, the linter and the type checker, before any service starts. */
function staticChecks() {
  runChecker(
    'checking the format (prettier --check)',
    ['prettier', 'bin', 'prettier.cjs'],
    ['--check', '--log-level', 'warn', '.'],
    'Some files are not formatted: run `npm run format`.',
  );
  runChecker('linting (eslint)', ['eslint', 'bin', 'eslint.js'], ['--max-warnings', '0', '.'], 'eslint found problems; see above (`npm run lint`).');
  runChecker('type-checking (astro check)', ['astro', 'astro.js'], ['check', '--minimumSeverity', 'warning'], 'astro check found problems; see above.');
}

async function main() {
  ensureDebianPackages({ mariadbd: 'mariadb-server', chromium: 'chromium', 'heif-enc': 'libheif-examples', pdfinfo: 'poppler-utils' });
  ensureNodeModules();
  const { startServices, startApp, stopServices, authSecret, logFile } = await import('./services/index.mjs');
  const { migrate, seed, build } = await import('./services/tasks.mjs');
  const profile = loadProfile('test');

  // One test run at a time: a second one would stop the first one's services.
  const runnerFile = path.join(profile.runDir, 'runner.pid');
  const other = readPid(runnerFile);
  if (other && other !== process.pid && isAlive(other)) {
    throw new SetupError(`Another npm test is running (pid ${other}) on the test ports; wait for it to finish.`);
  }
  mkdirSync(profile.runDir, { recursive: true });
  writeFileSync(runnerFile, String(process.pid));

  await stopServices(profile);
  rmSync(profile.mailDir, { recursive: true, force: true });
  rmSync(profile.s3Dir, { recursive: true, force: true });

  let status = 1;
  try {
    if (process.env.OXBLOOM_TEST_SKIP_CHECK === '1') step('skipping the format, lint and type checks (OXBLOOM_TEST_SKIP_CHECK=1)');
    else staticChecks();

    step('starting MariaDB, the S3 fake and the mail fake');
    await startServices(profile, { freshDatabase: true });
    // TRUST_PROXY lets each test file act from its own client address (X-Forwarded-For), so
    // per-address rate limits in one file don't trip another.
    const env = { ...appEnvironment(profile, authSecret(profile)), ASTRO_TELEMETRY_DISABLED: '1', TRUST_PROXY: '1' };
    migrate(env);
    seed(env);
    step('building the app');
    build(profile, env);
    await startApp(profile, env);
    step(`app on ${profile.appUrl}; running vitest`);

    const reportFile = path.join(profile.dataDir, 'vitest-report.json');
    rmSync(reportFile, { force: true });
    const vitest = spawnSync(
      process.execPath,
      [
        path.join(root, 'node_modules', 'vitest', 'vitest.mjs'),
        'run',
        '--config',
        'tests/vitest.config.ts',
        '--reporter=default',
        '--reporter=json',
        `--outputFile.json=${reportFile}`,
        ...vitestArgs,
      ],
      { stdio: 'inherit', cwd: root, env: { ...process.env, ...env, OXBLOOM_TEST_BASE_URL: profile.appUrl, OXBLOOM_TEST_APP_LOG: logFile(profile, 'app') } },
    );
    status = vitest.status ?? 1;
    summarise(reportFile);
  } finally {
    await stopServices(profile);
    rmSync(runnerFile, { force: true });
    step(`done, services stopped`);
  }
  return status;
}

main()
  .then((status) => process.exit(status))
  .catch((error) => {
    console.error(`[test] ${error instanceof SetupError ? error.message : (error.stack ?? error)}`);
    process.exit(1);
  });
