// Small helpers for the project's own commands: run a program, wait for a port, print a step.
import { spawn, spawnSync } from 'node:child_process';
import net from 'node:net';

export const root = new URL('../..', import.meta.url).pathname.replace(/\/$/, '');

export function step(message) {
  console.log(`\n\x1b[1m▸ ${message}\x1b[0m`);
}

/** Runs a program to completion with inherited output; throws with its exit code on failure. */
export function run(command, args, options = {}) {
  const result = spawnSync(command, args, { stdio: 'inherit', cwd: root, ...options });
  if (result.error) throw result.error;
  if (result.status !== 0) {
    throw new Error(`${command} ${args.join(' ')} exited with ${result.status ?? result.signal}`);
  }
}

/** Runs a program and returns its exit code (never throws on a non-zero exit). */
export function runStatus(command, args, options = {}) {
  const result = spawnSync(command, args, { stdio: 'inherit', cwd: root, ...options });
  if (result.error) throw result.error;
  return result.status ?? 1;
}

/** Runs a program quietly and returns its trimmed standard output, or null when it fails. */
export function capture(command, args, options = {}) {
  const result = spawnSync(command, args, { encoding: 'utf8', cwd: root, ...options });
  return result.status === 0 ? result.stdout.trim() : null;
}

export const isRoot = () => typeof process.getuid === 'function' && process.getuid() === 0;

let aptUpdated = false;
/** Installs Debian packages when running as root; explains what to do otherwise. */
export function aptInstall(packages, why) {
  if (!isRoot()) {
    throw new Error(`${why} is missing. Install it with: sudo apt-get install -y ${packages.join(' ')}`);
  }
  step(`Installing ${packages.join(', ')} from Debian's packages (${why})`);
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  if (!aptUpdated) {
    run('apt-get', ['update', '-qq'], { env });
    aptUpdated = true;
  }
  run('apt-get', ['install', '-y', '-qq', '--no-install-recommends', ...packages], { env });
}

/** Starts a long-running child in its own process group, so it can be stopped with everything it spawned. */
export function startService(name, command, args, options = {}) {
  const child = spawn(command, args, { cwd: root, detached: true, stdio: ['ignore', 'pipe', 'pipe'], ...options });
  const prefix = `[${name}] `;
  const forward = (stream, target) => {
    let pending = '';
    stream?.on('data', (chunk) => {
      pending += chunk.toString();
      const lines = pending.split('\n');
      pending = lines.pop() ?? '';
      for (const line of lines) if (options.quiet !== true) target.write(prefix + line + '\n');
    });
  };
  forward(child.stdout, process.stdout);
  forward(child.stderr, process.stderr);
  return {
    name,
    child,
    stop(signal = 'SIGTERM') {
      if (child.exitCode !== null || child.signalCode !== null) return;
      try {
        process.kill(-child.pid, signal);
      } catch {
        /* already gone */
      }
    },
  };
}

/** True when something accepts TCP connections on host:port. */
export function isPortOpen(port, host = '127.0.0.1') {
  return new Promise((resolve) => {
    const socket = net.connect({ port, host });
    socket.once('connect', () => {
      socket.destroy();
      resolve(true);
    });
    socket.once('error', () => resolve(false));
  });
}

/** Polls a URL until it answers with the wanted status, or throws after `timeoutMs`. */
export async function waitForHttp(url, { timeoutMs = 60_000, status = 200, process: child } = {}) {
  const deadline = Date.now() + timeoutMs;
  let last = 'no answer';
  while (Date.now() < deadline) {
    if (child && child.exitCode !== null) throw new Error(`${url}: the server exited with ${child.exitCode}`);
    try {
      const response = await fetch(url, { signal: AbortSignal.timeout(2_000) });
      if (response.status === status) return;
      last = `HTTP ${response.status}`;
    } catch (error) {
      last = error instanceof Error ? error.message : String(error);
    }
    await new Promise((resolve) => setTimeout(resolve, 500));
  }
  throw new Error(`${url} did not answer ${status} within ${timeoutMs / 1000} s (last: ${last})`);
}
