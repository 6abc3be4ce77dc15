// @ts-check
// Runs every benchmark in scripts/bench/ (each prints its own table) one after another.
import { readdirSync } from 'node:fs';
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import path from 'node:path';

const root = fileURLToPath(new URL('..', import.meta.url));
const dir = path.join(root, 'scripts', 'bench');
const only = process.argv.slice(2);
const files = readdirSync(dir)
  .filter((name) => name.endsWith('.bench.ts'))
  .filter((name) => only.length === 0 || only.some((word) => name.includes(word)))
  .sort();

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
