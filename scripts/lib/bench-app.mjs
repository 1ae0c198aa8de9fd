// The app side of `npm run bench:holds`: the load processes that send the burst, the app's log kept
// aside (but its error lines counted), and stopping the app's process group.
import { fork } from 'node:child_process';
import path from 'node:path';
import { root } from './run.mjs';

/** Forks the load processes and hands each its share; `go()` starts them together and gathers results. */
export async function startLoad({ baseUrl, batchId, buyers, workers, concurrency }) {
  const size = Math.ceil(buyers.length / workers);
  const shares = Array.from({ length: workers }, (_, w) => buyers.slice(w * size, (w + 1) * size)).filter((s) => s.length);
  const children = shares.map(() => fork(path.join(root, 'scripts/lib/bench-load.mjs'), [], { stdio: ['ignore', 'inherit', 'inherit', 'ipc'] }));
  const reply = (child) =>
    new Promise((resolve, reject) => {
      child.once('message', resolve);
      child.once('exit', (code) => reject(new Error(`A load process exited early (${code})`)));
    });
  await Promise.all(
    children.map((child, w) => {
      const ready = reply(child);
      child.send({ baseUrl, batchId, buyers: shares[w], concurrency: Math.ceil(concurrency / children.length) });
      return ready;
    }),
  );
  return {
    pids: children.map((c) => c.pid),
    async go() {
      const replies = children.map(reply);
      for (const child of children) child.send('go');
      const all = await Promise.all(replies);
      return { results: all.flatMap((r) => r.results), clientCpuMs: all.map((r) => Math.round((r.cpu.user + r.cpu.system) / 1000)) };
    },
  };
}

/** Keeps the app's log out of the way but counts its error lines, to report them after the burst. */
export function watchLog(child) {
  const log = { tail: [], errors: new Map() };
  for (const stream of [child.stdout, child.stderr]) {
    let pending = '';
    stream.on('data', (chunk) => {
      const lines = (pending + chunk).split('\n');
      pending = lines.pop();
      for (const line of lines) {
        log.tail = [...log.tail.slice(-29), line];
        if (/error|warn|timeout|deadlock/i.test(line) && !/^\s+at /.test(line)) {
          const key = line.slice(0, 200);
          log.errors.set(key, (log.errors.get(key) ?? 0) + 1);
        }
      }
    });
  }
  return log;
}

/** Stops a service's process group and resolves once it has exited (SIGKILL after 10 s). */
export function stopService(service) {
  return new Promise((resolve) => {
    const { child } = service;
    if (child.exitCode !== null || child.signalCode !== null) return resolve();
    child.once('exit', resolve);
    service.stop();
    setTimeout(() => service.stop('SIGKILL'), 10_000).unref();
  });
}
