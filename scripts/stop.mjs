// `npm run stop`: stops everything `npm start` started, by pid file.
import { rmSync } from 'node:fs';
import path from 'node:path';
import { loadProfile } from './services/profile.mjs';
import { stopServices } from './services/index.mjs';
import { stopByPidFile } from './services/processes.mjs';

const profile = loadProfile(process.argv.includes('--test') ? 'test' : 'dev');
await stopByPidFile(path.join(profile.runDir, 'supervisor.pid'), 20_000);
const stopped = await stopServices(profile);
rmSync(path.join(profile.runDir, 'supervisor.pid'), { force: true });
console.log(stopped.length ? `Stopped ${stopped.join(', ')}.` : 'Nothing was running.');
