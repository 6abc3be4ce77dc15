// @ts-check
// Runs every benchmark in scripts/bench/ (each prints its own table) one after another.
import { readdirSync } from 'node:fs';
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import path from 'node:path';
import { ensureDebianPackages, ensureNodeModules } from './services/system.mjs';

const root = fileURLToPath(new URL('..', import.meta.url));
const dir = path.join(root, 'scripts', 'bench');
const only = process.argv.slice(2);
const files = readdirSync(dir)
  .filter((name) => name.endsWith('.bench.ts'))
  .filter((name) => only.length === 0 || only.some((word) => name.includes(word)))
  .sort();

// As `npm start` does: a fresh machine gets MariaDB and the node modules before the first benchmark.
try {
  ensureDebianPackages({ mariadbd: 'mariadb-server' });
  ensureNodeModules();
} catch (error) {
  console.error(`[bench] ${error instanceof Error ? error.message : String(error)}`);
  process.exit(1);
}

let failed = 0;
for (const file of files) {
  console.log(`\n## ${file.replace('.bench.ts', '')}`);
  const run = spawnSync(process.execPath, ['--expose-gc', path.join(root, 'node_modules', 'tsx', 'dist', 'cli.mjs'), path.join(dir, file)], {
    stdio: 'inherit',
    cwd: root,
  });
  if (run.status !== 0) failed += 1;
}
process.exit(failed ? 1 : 0);
