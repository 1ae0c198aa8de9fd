import net from 'node:net';
import { afterAll, describe, expect, it } from 'vitest';
import { createSequelize } from '@/lib/db/connection';
import { checkDatabase } from '@/lib/db/health';
import { adminUrl } from './support/database';

/** A port on loopback that nothing listens on: bound, then released. */
async function closedPort(): Promise<number> {
  const server = net.createServer();
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as net.AddressInfo;
  await new Promise((resolve) => server.close(resolve));
  return port;
}

const opened: { close: () => Promise<void> }[] = [];
afterAll(async () => {
  await Promise.all(opened.map((s) => s.close()));
});

describe('the database health check', () => {
  it('reports a running server as up, with its version', async () => {
    const sequelize = createSequelize({ url: adminUrl(), poolMax: 1, statementTimeoutMs: 2_000 });
    opened.push(sequelize);
    const health = await checkDatabase(sequelize);
    expect(health.status).toBe('up');
    if (health.status === 'up') expect(health.serverVersion).toMatch(/^\d+(\.\d+)?/);
  });

  it('reports a server that is not there as down, quickly and without throwing', async () => {
    const url = new URL(adminUrl());
    url.port = String(await closedPort());
    const sequelize = createSequelize({ url: url.toString(), poolMax: 1, statementTimeoutMs: 2_000, acquireTimeoutMs: 1_500 });
    opened.push(sequelize);
    const health = await checkDatabase(sequelize, 3_000);
    expect(health).toMatchObject({ status: 'down', reason: 'connection refused' });
    expect(health.latencyMs).toBeLessThan(3_000);
  });
});
