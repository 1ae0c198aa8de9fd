// One load-generating process of `npm run bench:holds` (forked, talks over IPC). It gets its share of the
// buyers, says it is ready, and on "go" sends one POST /api/holds per buyer, at most `concurrency` at once,
// then sends back { status, code, start, end } per attempt. Plain node:http rather than fetch: it costs the
// client less CPU, and the client shares the machine's two cores with the server and PostgreSQL.
import http from 'node:http';
import { now, runAll } from './bench-stats.mjs';

const TIMEOUT_MS = 60_000;

function post(agent, url, buyer, body) {
  const payload = JSON.stringify(body);
  const start = now();
  return new Promise((resolve) => {
    const done = (status, code) => resolve({ status, code, start, end: now() });
    const request = http.request(
      url,
      {
        method: 'POST',
        agent,
        timeout: TIMEOUT_MS,
        headers: {
          'Content-Type': 'application/json',
          'Content-Length': Buffer.byteLength(payload),
          Cookie: `next-auth.session-token=${buyer.token}`,
          // Each buyer from a network of its own, so only the per-buyer limits apply (as in race-worker.mjs).
          'X-Real-IP': buyer.ip,
        },
      },
      (response) => {
        const chunks = [];
        response.on('data', (chunk) => chunks.push(chunk));
        response.on('error', (error) => done(0, error.code ?? error.message));
        response.on('end', () => {
          let code = null;
          try {
            code = JSON.parse(Buffer.concat(chunks).toString()).error?.code ?? null;
          } catch {
            /* not JSON: the status says enough */
          }
          done(response.statusCode, code);
        });
      },
    );
    request.on('timeout', () => request.destroy(Object.assign(new Error('timeout'), { code: 'timeout' })));
    request.on('error', (error) => done(0, error.code ?? error.message));
    request.end(payload);
  });
}

process.once('message', ({ baseUrl, batchId, buyers, concurrency }) => {
  // keepAlive with no socket cap: all at once means one connection per buyer; a smaller concurrency reuses them.
  const agent = new http.Agent({ keepAlive: true, maxSockets: Infinity });
  const url = new URL('/api/holds', baseUrl);
  process.once('message', async () => {
    const results = await runAll(buyers.length, concurrency, (i) =>
      post(agent, url, buyers[i], { batchId, finishId: buyers[i].finishId, quantity: 1 }),
    );
    agent.destroy();
    process.send({ results, cpu: process.cpuUsage() }, () => process.disconnect());
  });
  process.send({ ready: true });
});
