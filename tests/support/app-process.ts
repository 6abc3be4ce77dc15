// Extra app processes for tests of crashes, outages and several servers: the built app
// (`node scripts/serve.mjs <outDir>`, built by scripts/test.mjs) on a port of its own, with the
// test services' settings unless overridden. Every process started here must be stopped in afterAll.
import { spawn, type ChildProcess } from 'node:child_process';
import net from 'node:net';
import { loadProfile } from '../../scripts/services/profile.mjs';
import { waitForPort } from '../../scripts/services/processes.mjs';
import { serverArguments } from '../../scripts/services/index.mjs';

export async function freePort(): Promise<number> {
  const server = net.createServer();
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as net.AddressInfo;
  await new Promise((resolve) => server.close(resolve));
  return port;
}

export interface AppProcess {
  url: string;
  port: number;
  child: ChildProcess;
  /** What the process wrote so far (stdout and stderr). */
  output: () => string;
  /** SIGKILL, and wait for the exit. */
  kill: () => Promise<void>;
  /** SIGTERM (SIGKILL after 5 s), and wait for the exit. */
  stop: () => Promise<void>;
}

/** Starts the built app on `port` (a free one by default) with the test environment plus `overrides`. */
export async function startAppProcess(overrides: Record<string, string> = {}, port?: number): Promise<AppProcess> {
  const chosen = port ?? (await freePort());
  const url = `http://127.0.0.1:${chosen}`;
  const child = spawn(process.execPath, serverArguments(loadProfile('test').outDir), {
    env: { ...process.env, HOST: '127.0.0.1', PORT: String(chosen), APP_URL: url, ...overrides },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let output = '';
  child.stdout!.on('data', (chunk) => (output += chunk));
  child.stderr!.on('data', (chunk) => (output += chunk));
  const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
  const signal = async (name: NodeJS.Signals) => {
    if (child.exitCode !== null || child.signalCode !== null) return;
    child.kill(name);
    await exited;
  };
  try {
    await waitForPort(chosen, { pid: child.pid, what: 'An extra app process', timeoutMs: 30_000 });
  } catch (error) {
    child.kill('SIGKILL');
    throw new Error(`${(error as Error).message}\n${output}`);
  }
  return {
    url,
    port: chosen,
    child,
    output: () => output,
    kill: () => signal('SIGKILL'),
    stop: async () => {
      const timer = setTimeout(() => child.kill('SIGKILL'), 5_000);
      await signal('SIGTERM');
      clearTimeout(timer);
    },
  };
}
