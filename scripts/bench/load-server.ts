// A fresh production server for the load benchmark: the `bench` profile's ports with its own data
// folder (.data/load-bench), a new database migrated and seeded with the demo, a build, and
// `node scripts/serve.mjs`; or the app over the library benchmark's generated database.
import { existsSync, rmSync } from 'node:fs';
import path from 'node:path';

const { loadProfile, appEnvironment, root } = await import('../services/profile.mjs');
const { startServices, startApp, stopServices, authSecret } = await import('../services/index.mjs');
const { migrate, seed, build } = await import('../services/tasks.mjs');

type Profile = ReturnType<typeof loadProfile>;

export interface LoadServer {
  profile: Profile;
  baseUrl: string;
  env: Record<string, string>;
  stop: () => Promise<void>;
}

/** The demo, served fresh: every run starts from a new database and an empty photo store. */
export async function startDemoServer(): Promise<LoadServer> {
  const profile = loadProfile('bench', { ...process.env, OXBLOOM_DATA_ROOT: path.join(root, '.data', 'load-bench') });
  rmSync(profile.s3Dir, { recursive: true, force: true });
  return serve(profile, { fresh: true, seedDemo: true });
}

/**
 * The library benchmark's database (100 000 coupons), if it has been generated (else undefined),
 * served by the demo server's build.
 */
export async function startLibraryServer(demo: LoadServer): Promise<LoadServer | undefined> {
  const profile = { ...loadProfile('bench'), outDir: demo.profile.outDir };
  if (!existsSync(path.join(profile.mariadbDir, 'oxbloom'))) return undefined;
  return serve(profile, { fresh: false, seedDemo: false });
}

async function serve(profile: Profile, { fresh, seedDemo }: { fresh: boolean; seedDemo: boolean }): Promise<LoadServer> {
  const env = { ...appEnvironment(profile, authSecret(profile)), ASTRO_TELEMETRY_DISABLED: '1' };
  const stop = async () => {
    await stopServices(profile);
  };
  try {
    await startServices(profile, { freshDatabase: fresh });
    migrate(env);
    if (seedDemo) seed(env);
    build(profile, env);
    await startApp(profile, env);
  } catch (error) {
    await stop();
    throw error;
  }
  return { profile, baseUrl: profile.appUrl, env, stop };
}
