// The benchmark's measuring tools: a concurrency-capped runner, the summary of one burst, and two
// samplers that say where the time went (CPU per process family, and what PostgreSQL's sessions do).
import fs from 'node:fs';
import { capture } from './run.mjs';

/** A high-resolution wall clock in ms, comparable between processes (the bursts span several). */
export const now = () => performance.timeOrigin + performance.now();

/** Runs attempt(0..n-1) with at most `concurrency` in flight; results keep the attempts' order. */
export async function runAll(n, concurrency, attempt) {
  const results = new Array(n);
  let next = 0;
  const lane = async () => {
    while (next < n) {
      const i = next++;
      results[i] = await attempt(i);
    }
  };
  await Promise.all(Array.from({ length: Math.max(1, Math.min(concurrency, n)) }, lane));
  return results;
}

const percentile = (sorted, p) => (sorted.length ? sorted[Math.max(0, Math.ceil(p * sorted.length) - 1)] : null);
const round = (x, digits = 1) => (x === null ? null : Math.round(x * 10 ** digits) / 10 ** digits);

/**
 * One burst's figures from results { status, code, start, end } (status 0: no answer at all).
 * Throughput is answered attempts over the wall time from the first send to the last answer.
 */
export function summarize(results) {
  const answered = results.filter((r) => r.status !== 0);
  const count = (list, key) => list.reduce((counts, r) => ({ ...counts, [key(r)]: (counts[key(r)] ?? 0) + 1 }), {});
  const refused = count(results.filter((r) => r.status > 0 && r.status !== 201 && r.status < 500), (r) => r.code ?? `http_${r.status}`);
  const errors = results.filter((r) => r.status === 0 || r.status >= 500);
  // reduce, not Math.min(...list): a spread of 100,000 arguments overflows the stack.
  const first = results.reduce((m, r) => Math.min(m, r.start), Infinity);
  const last = answered.reduce((m, r) => Math.max(m, r.end), -Infinity);
  const wallMs = answered.length ? last - first : null;
  const latencies = answered.map((r) => r.end - r.start).sort((a, b) => a - b);
  const winners = results.filter((r) => r.status === 201).map((r) => r.end - r.start).sort((a, b) => a - b);
  return {
    granted: results.filter((r) => r.status === 201).length,
    refused,
    errors: errors.length,
    ...(errors.length ? { errorKinds: count(errors, (r) => `${r.status} ${r.code}`) } : {}),
    wallMs: round(wallMs),
    throughputPerSec: wallMs ? round((answered.length / wallMs) * 1000) : 0,
    p50Ms: round(percentile(latencies, 0.5)),
    p95Ms: round(percentile(latencies, 0.95)),
    p99Ms: round(percentile(latencies, 0.99)),
    maxMs: round(latencies.at(-1) ?? null),
    // When the first answer came, and how long the winners waited: together they show whether attempts
    // are served in turn or all crawl forward together and finish at the end (a queue convoy).
    firstAnswerMs: answered.length ? round(answered.reduce((m, r) => Math.min(m, r.end), Infinity) - first) : null,
    grantedP50Ms: round(percentile(winners, 0.5)),
  };
}

const clockTicks = Number(capture('getconf', ['CLK_TCK'])) || 100;

function processTicks() {
  const found = [];
  for (const name of fs.readdirSync('/proc')) {
    if (!/^\d+$/.test(name)) continue;
    try {
      const stat = fs.readFileSync(`/proc/${name}/stat`, 'utf8');
      const comm = stat.slice(stat.indexOf('(') + 1, stat.lastIndexOf(')'));
      const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
      found.push({ pid: Number(name), comm, pgrp: Number(fields[2]), ticks: Number(fields[11]) + Number(fields[12]) });
    } catch {
      /* the process ended while we looked */
    }
  }
  return found;
}

function machineTicks() {
  const [, ...values] = fs.readFileSync('/proc/stat', 'utf8').split('\n')[0].trim().split(/\s+/).map(Number);
  const idle = values[3] + values[4];
  return { total: values.reduce((a, b) => a + b, 0), idle };
}

/**
 * CPU used between start() and stop(), per family: `groups` maps a name to a test on { pid, comm, pgrp }.
 * Families are in % of ONE core (the app is one Node.js process: 100 % means its event loop is saturated);
 * `machineBusyPct` is in % of all cores together.
 */
export function cpuMeter(groups) {
  const take = () => {
    const per = Object.fromEntries(Object.keys(groups).map((k) => [k, 0]));
    for (const p of processTicks()) for (const [k, test] of Object.entries(groups)) if (test(p)) per[k] += p.ticks;
    return { at: now(), machine: machineTicks(), per };
  };
  let before;
  return {
    start: () => (before = take()),
    stop() {
      const after = take();
      const seconds = (after.at - before.at) / 1000;
      const total = after.machine.total - before.machine.total;
      const report = { machineBusyPct: round(100 * (1 - (after.machine.idle - before.machine.idle) / total), 0) };
      for (const k of Object.keys(groups)) report[`${k}CorePct`] = round((100 * (after.per[k] - before.per[k])) / clockTicks / seconds, 0);
      return report;
    },
  };
}

/**
 * Polls pg_stat_activity (every `everyMs`) for the sessions named `applicationName` (the app's pool is
 * 'demold'): how many run a statement, how many sit idle inside a transaction (waiting on their client),
 * how many wait on a lock. Idle ones while attempts queue mean the client side, not PostgreSQL, is slow.
 */
export async function activitySampler(pg, url, applicationName, everyMs = 50) {
  const client = new pg.Client({ connectionString: url, application_name: 'demold-bench-sampler' });
  await client.connect();
  const samples = [];
  let busy = false;
  const timer = setInterval(async () => {
    if (busy) return;
    busy = true;
    try {
      const { rows } = await client.query(
        `SELECT count(*) FILTER (WHERE state = 'active')::int AS active,
                count(*) FILTER (WHERE state LIKE 'idle in transaction%')::int AS "idleInTx",
                count(*) FILTER (WHERE state = 'idle')::int AS idle,
                count(*) FILTER (WHERE wait_event_type = 'Lock')::int AS "lockWait",
                count(*) FILTER (WHERE wait_event IN ('WALWrite', 'WALSync', 'WALInsert') OR wait_event_type = 'IO')::int AS "walOrIo"
           FROM pg_stat_activity
          WHERE datname = current_database() AND application_name = $1`,
        [applicationName],
      );
      samples.push(rows[0]);
    } catch {
      /* a missed sample is no loss */
    } finally {
      busy = false;
    }
  }, everyMs);
  return {
    async stop() {
      clearInterval(timer);
      await client.end().catch(() => {});
      const mean = (k) => round(samples.reduce((s, x) => s + x[k], 0) / Math.max(1, samples.length), 2);
      return { samples: samples.length, active: mean('active'), idleInTx: mean('idleInTx'), idle: mean('idle'), lockWait: mean('lockWait'), walOrIo: mean('walOrIo') };
    },
  };
}
