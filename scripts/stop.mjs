// @ts-check
// `npm run stop`: stops everything `npm start` started, by pid file.
import path from 'node:path';
import { loadProfile } from './services/profile.mjs';
import { stopServices } from './services/index.mjs';
import { readPid, stopByPidFile } from './services/processes.mjs';

const profile = loadProfile(process.argv.includes('--test') ? 'test' : 'dev');
const supervisorFile = path.join(profile.runDir, 'supervisor.pid');
const supervisor = readPid(supervisorFile);
// The supervisor stops its services itself when it gets TERM; anything left is stopped here.
await stopByPidFile(supervisorFile, 60_000);
const leftovers = await stopServices(profile);
if (supervisor) console.log(`Stopped Oxbloom (pid ${supervisor})${leftovers.length ? ` and ${leftovers.join(', ')}` : ''}.`);
else console.log(leftovers.length ? `Stopped ${leftovers.join(', ')}.` : 'Nothing was running.');
