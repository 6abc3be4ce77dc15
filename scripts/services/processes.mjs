// @ts-check
// Starting and stopping background services by pid file, and checking ports before we start.
import { spawn } from 'node:child_process';
import { existsSync, mkdirSync, openSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import net from 'node:net';
import path from 'node:path';

/** A failure the user can fix: printed as one line, no stack trace. */
export class SetupError extends Error {}

/** @param {number} ms */
export const sleep = (ms) => new Promise((resolve) => setTimeout(resolve, ms));

/** @param {number | undefined} pid undefined (a process that never started) is not alive */
export function isAlive(pid) {
  try {
    // An undefined pid makes process.kill throw, which answers false below.
    process.kill(/** @type {number} */ (pid), 0);
    return true;
  } catch {
    return false;
  }
}

/** @param {string} pidFile */
export function readPid(pidFile) {
  if (!existsSync(pidFile)) return null;
  const pid = Number(readFileSync(pidFile, 'utf8').trim());
  return Number.isInteger(pid) && pid > 0 ? pid : null;
}

/**
 * Resolves true when nothing listens on host:port.
 * @param {number} port
 * @returns {Promise<boolean>}
 */
export function isPortFree(port, host = '127.0.0.1') {
  return new Promise((resolve) => {
    const server = net.createServer();
    server.once('error', () => resolve(false));
    server.once('listening', () => server.close(() => resolve(true)));
    server.listen(port, host);
  });
}

/**
 * @param {number} port
 * @param {string} variable
 * @param {string} what
 */
export async function requireFreePort(port, variable, what) {
  if (!(await isPortFree(port))) {
    throw new SetupError(`Port ${port} for ${what} is already in use: stop what uses it, or set ${variable} to a free port.`);
  }
}

/**
 * Resolves when host:port accepts a TCP connection, or rejects after `timeoutMs`.
 * @param {number} port
 * @param {{ host?: string, timeoutMs?: number, pid?: number, what?: string }} [options]
 */
export async function waitForPort(port, { host = '127.0.0.1', timeoutMs = 20_000, pid, what } = {}) {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    if (pid && !isAlive(pid)) throw new SetupError(`${what} exited during start-up.`);
    const open = await new Promise((resolve) => {
      const socket = net.connect(port, host);
      socket.once('connect', () => {
        socket.destroy();
        resolve(true);
      });
      socket.once('error', () => resolve(false));
    });
    if (open) return;
    await sleep(100);
  }
  throw new SetupError(`${what} did not open port ${port} within ${timeoutMs / 1000} s.`);
}

/**
 * Starts a detached background process with its output in `logFile` and its pid in `pidFile`,
 * so it can be stopped later by `stopByPidFile` even from another command.
 * @param {string} command
 * @param {string[]} args
 * @param {{ pidFile: string, logFile: string, env?: Record<string, string | undefined>, cwd?: string }} options
 */
export function startBackground(command, args, { pidFile, logFile, env, cwd }) {
  mkdirSync(path.dirname(pidFile), { recursive: true });
  mkdirSync(path.dirname(logFile), { recursive: true });
  const log = openSync(logFile, 'a');
  const child = spawn(command, args, { detached: true, stdio: ['ignore', log, log], env: { ...process.env, ...env }, cwd });
  writeFileSync(pidFile, String(child.pid));
  child.unref();
  return child.pid;
}

/**
 * TERM, wait up to `graceMs`, then KILL; removes the pid file.
 * @param {string} pidFile
 */
export async function stopByPidFile(pidFile, graceMs = 15_000) {
  const pid = readPid(pidFile);
  if (pid && isAlive(pid)) {
    try {
      process.kill(pid, 'SIGTERM');
    } catch {
      /* already gone */
    }
    const deadline = Date.now() + graceMs;
    while (isAlive(pid) && Date.now() < deadline) await sleep(100);
    if (isAlive(pid)) {
      try {
        process.kill(pid, 'SIGKILL');
      } catch {
        /* already gone */
      }
    }
  }
  rmSync(pidFile, { force: true });
  return Boolean(pid);
}
