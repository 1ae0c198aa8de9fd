import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import path from 'node:path';

// Starting and stopping a fake, in a test or as its own process.

const LOOPBACK = new Set(['127.0.0.1', 'localhost', '::1']);

/** A fake has no authentication worth the name, so it must not be reachable from elsewhere. */
export function assertLoopback(host: string, service: string): void {
  if (!LOOPBACK.has(host) && !host.startsWith('127.'))
    throw new Error(`The fake ${service} listens on loopback only, not on ${host}.`);
}

/** Listens on `port` (0 picks a free one); returns the port it got and the fake's base URL. */
export async function listen(
  server: Server,
  port: number,
  host: string,
): Promise<{ port: number; url: string }> {
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, host, () => {
      server.off('error', reject);
      resolve();
    });
  });
  const actual = (server.address() as AddressInfo).port;
  return { port: actual, url: `http://${host.includes(':') ? `[${host}]` : host}:${actual}` };
}

/** Stops the server without waiting for idle keep-alive connections to time out. */
export function closeServer(server: Server): Promise<void> {
  return new Promise<void>((resolve) => {
    server.close(() => resolve());
    server.closeAllConnections();
  });
}

/** `--name value` or `--name=value` from the command line. */
export function argValue(args: string[], name: string): string | undefined {
  const at = args.indexOf(name);
  if (at >= 0) return args[at + 1];
  return args.find((a) => a.startsWith(`${name}=`))?.slice(name.length + 1);
}

/** The port from `--port`, else the fake's own variable, else PORT, else its usual one. */
export function portFrom(args: string[], variable: string, fallback: number): number {
  const raw = argValue(args, '--port') ?? process.env[variable] ?? process.env.PORT ?? String(fallback);
  const port = Number(raw);
  if (!Number.isInteger(port) || port < 0 || port > 65_535) throw new Error(`Not a port: ${raw}`);
  return port;
}

/**
 * Starts the fake when `node --import tsx fake-services/<folder>/server.ts` runs it, not when tests or
 * scripts import it, and closes it on SIGINT or SIGTERM.
 */
export function runAsCli(
  folder: string,
  start: (args: string[]) => Promise<{ close(): Promise<void> }>,
): void {
  const entry = process.argv[1] ? path.resolve(process.argv[1]) : '';
  if (!entry.endsWith(path.sep + path.join('fake-services', folder, 'server.ts'))) return;
  start(process.argv.slice(2)).then(
    (fake) => {
      const stop = () => {
        void fake.close().then(() => process.exit(0));
      };
      process.once('SIGINT', stop);
      process.once('SIGTERM', stop);
    },
    (e: unknown) => {
      console.error(`[fake-${folder}] ${e instanceof Error ? e.message : String(e)}`);
      process.exit(1);
    },
  );
}
