// @ts-check
// The local S3-compatible store (s3rver) for photos. Started by scripts/start.mjs and
// scripts/test.mjs; any S3-compatible service replaces it in production.
// Reads: LOCAL_S3_PORT, LOCAL_S3_DIR, LOCAL_S3_BUCKET, LOCAL_S3_ORIGINS (comma-separated).
import S3rver from 's3rver';
import { mkdirSync } from 'node:fs';
import { corsConfiguration } from './cors.mjs';

const port = Number(process.env.LOCAL_S3_PORT ?? 4569);
const directory = process.env.LOCAL_S3_DIR ?? new URL('./data/dev', import.meta.url).pathname;
const bucket = process.env.LOCAL_S3_BUCKET ?? 'oxbloom-photos';
const origins = (process.env.LOCAL_S3_ORIGINS ?? 'http://127.0.0.1:4321,http://localhost:4321').split(',');

mkdirSync(directory, { recursive: true });
const server = new S3rver({
  port,
  address: '127.0.0.1',
  directory,
  silent: true,
  configureBuckets: [{ name: bucket, configs: [corsConfiguration(origins)] }],
});

await server.run();
console.log(`local S3 on http://127.0.0.1:${port} bucket ${bucket} (data in ${directory})`);

const stop = () => server.close().finally(() => process.exit(0));
process.on('SIGTERM', stop);
process.on('SIGINT', stop);
