// Runs the upload sweep once in a process of its own, as an app process's timer does, and prints
// its result as one JSON line. `due` claims the turn first (sweepIfDue), `now` sweeps at once
// (sweepStaleUploads). It prints "ready" once loaded and waits for a line on stdin, so a test can
// start several and let them go at the same moment. Settings come from the environment.
//   node node_modules/tsx/dist/cli.mjs tests/support/sweep-process.ts due|now
import { once } from 'node:events';
import { sweepIfDue, sweepStaleUploads } from '~/lib/server/photos/uploads-ledger';
import { pingDatabase } from '~/lib/server/db';

const mode = process.argv[2];
// Connected and loaded before the start, so both processes start level.
await pingDatabase();
console.log('ready');
await once(process.stdin, 'data');
const result = mode === 'due' ? await sweepIfDue() : await sweepStaleUploads();
console.log(JSON.stringify({ result }));
process.exit(0);
