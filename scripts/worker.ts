// The worker's body (see worker.mjs): starts the job queue, resumes what a previous worker left, logs one line a
// minute of what it sent, and on SIGTERM/SIGINT lets running jobs and the send in flight finish before it exits.
import { closeDb } from '@/lib/db/connection';
import { resumeWork, startJobs, stopJobs } from '@/lib/jobs/queue';
import { outboxCounters } from '@/lib/mail/outbox';

export async function main(): Promise<void> {
  const logEveryMs = Number(process.env.WORKER_LOG_SECONDS ?? 60) * 1000;
  await startJobs();
  await resumeWork();
  console.log(`worker ${process.pid} started`);

  let last = { ...outboxCounters };
  const report = setInterval(() => {
    const now = { ...outboxCounters };
    console.log(
      `worker ${process.pid}: sent ${now.sent - last.sent}, retrying ${now.retried - last.retried}, failed ${now.failed - last.failed}, ` +
        `skipped as suppressed ${now.suppressed - last.suppressed} in the last ${logEveryMs / 1000} s`,
    );
    last = now;
  }, logEveryMs);

  await new Promise<void>((resolve) => {
    process.once('SIGTERM', resolve);
    process.once('SIGINT', resolve);
  });
  console.log(`worker ${process.pid} stopping: letting running jobs finish`);
  clearInterval(report);
  await stopJobs();
  await closeDb();
  console.log(`worker ${process.pid} stopped`);
}
