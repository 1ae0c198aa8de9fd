// What every benchmark script shares: its flags, the /proc memory reading, the way it stops what it started,
// and how its one JSON line reaches stdout while everything else goes to stderr.
import { spawn } from 'node:child_process';
import fs from 'node:fs';
import { stopIfStartedHere } from './postgres.mjs';
import { stopService } from './bench-app.mjs';

/** `--name N` or `--name=N` as a whole number of at least `min`, else `fallback`. */
export function wholeOption(argv, name, fallback, min = 1) {
  const i = argv.findIndex((a) => a === `--${name}` || a.startsWith(`--${name}=`));
  if (i === -1) return fallback;
  const raw = argv[i].includes('=') ? argv[i].split('=')[1] : argv[i + 1];
  const value = Number(raw);
  if (!Number.isInteger(value) || value < min) throw new Error(`--${name} wants a whole number of at least ${min}, not "${raw}"`);
  return value;
}

/** Refuses flags the script does not know, pointing at its header for the ones it does. */
export function refuseUnknown(argv, known, script) {
  const unknown = argv.filter((a) => !known.test(a) && !/^\d+$/.test(a));
  if (unknown.length) throw new Error(`Unknown argument(s): ${unknown.join(' ')} (see the top of scripts/${script})`);
}

/** Resident memory of a process group in MiB, from /proc (a service and everything it spawned). */
export function rssOfGroup(pgrp) {
  let kib = 0;
  for (const entry of fs.readdirSync('/proc')) {
    if (!/^\d+$/.test(entry)) continue;
    try {
      // Field 5 of /proc/<pid>/stat is the process group; the command name (field 2) may hold spaces.
      const stat = fs.readFileSync(`/proc/${entry}/stat`, 'utf8');
      if (Number(stat.slice(stat.lastIndexOf(')') + 2).split(' ')[2]) !== pgrp) continue;
      const match = /VmRSS:\s+(\d+) kB/.exec(fs.readFileSync(`/proc/${entry}/status`, 'utf8'));
      if (match) kib += Number(match[1]);
    } catch {
      // the process ended while we looked
    }
  }
  return Math.round((kib / 1024) * 10) / 10;
}

/**
 * The services a run started and PostgreSQL if it started it: stopped on Ctrl-C, on failure and at the end.
 * `fail(error)` reports why the benchmark could not run and exits 1.
 */
export function benchLifecycle() {
  const run = { services: [], postgres: null, stopping: false };
  run.shutdown = async (code) => {
    if (run.stopping) return;
    run.stopping = true;
    await Promise.all(run.services.map(stopService));
    stopIfStartedHere(run.postgres);
    process.exit(code);
  };
  run.fail = async (error) => {
    if (run.stopping) return; // interrupted: what it ran died with the signal, nothing to report
    console.error(`\n\x1b[31mThe benchmark could not run:\x1b[0m ${error instanceof Error ? error.message : error}`);
    await run.shutdown(1);
  };
  for (const signal of ['SIGINT', 'SIGTERM']) {
    process.on(signal, () => {
      // The signal comes twice (from the terminal and from the parent): say it once.
      if (!run.stopping) console.error('\nInterrupted: stopping what the benchmark started…');
      run.shutdown(130);
    });
  }
  return run;
}

/** The result as one JSON line on the parent's stdout (fd 3, see runAsBenchChild), or on ours when run alone. */
export function writeResult(result) {
  const line = `${JSON.stringify(result)}\n`;
  try {
    fs.writeSync(3, line);
  } catch {
    process.stdout.write(line);
  }
}

/**
 * Everything a benchmark reuses prints to stdout (step(), pg_ctl, sequelize-cli, next build), yet stdout must
 * carry the JSON line alone. So the work runs in a child whose stdout is our stderr, and the child hands the
 * JSON back on its fd 3, which is our stdout. Ctrl-C reaches both; the child cleans up, we wait.
 */
export async function runAsBenchChild(scriptUrl, argv, main) {
  if (process.env.DEMOLD_BENCH_CHILD === '1') return main();
  const child = spawn(process.execPath, [new URL(scriptUrl).pathname, ...argv], {
    stdio: ['inherit', 2, 'inherit', 1],
    env: { ...process.env, DEMOLD_BENCH_CHILD: '1' },
  });
  for (const signal of ['SIGINT', 'SIGTERM']) process.on(signal, () => child.kill(signal));
  child.on('exit', (code, signal) => process.exit(code ?? (signal ? 130 : 1)));
}
