import 'server-only';
import PgBoss from 'pg-boss';
import { getEnv } from '@/lib/env';
import { expireHolds } from '@/lib/drops/holds';
import { drainOutbox, kickMail, sendingStopped, stopSending } from '@/lib/mail/outbox';
import { sweepPayments } from '@/lib/orders/sweeps';
import { fanOutAnnouncement, queueDueReminders, unfinishedAnnouncements } from '@/lib/waitlist/announce';

// Jobs live in PostgreSQL (pg-boss keeps its own schema, `pgboss`), so any number of app instances can
// run the same schedule: pg-boss hands each job to one worker, and a cron fires once per minute overall.
export const jobNames = {
  expireHolds: 'expire-holds',
  sweepPayments: 'sweep-payments',
  deliverMail: 'deliver-mail',
  waitlistFanOut: 'waitlist-fan-out',
  waitlistSweep: 'waitlist-sweep',
} as const;

const globalForJobs = globalThis as typeof globalThis & { __demoldBoss?: Promise<PgBoss> };

export function startJobs(): Promise<PgBoss> {
  globalForJobs.__demoldBoss ??= (async () => {
    const env = getEnv();
    const boss = new PgBoss({ connectionString: env.DATABASE_URL, max: 2, application_name: 'demold-jobs' });
    boss.on('error', (error) => console.error('Job queue error', error.message));
    await boss.start();
    await boss.createQueue(jobNames.expireHolds);
    // Reads and hold attempts already treat an expired hold as released; the sweep only tidies the rows.
    await boss.schedule(jobNames.expireHolds, '* * * * *');
    await boss.work(jobNames.expireHolds, async () => {
      const swept = await expireHolds({ limit: 5000 });
      if (swept > 0) console.log(`expired ${swept} hold(s)`);
    });
    await boss.createQueue(jobNames.sweepPayments);
    await boss.schedule(jobNames.sweepPayments, '* * * * *');
    await boss.work(jobNames.sweepPayments, async () => {
      await expireHolds({ limit: 5000 });
      await sweepPayments();
    });
    // The outbox is sent right after each change that queues mail (see kickMail) and swept each minute; the
    // sweep keeps sending (within the studio's rate) for most of its minute when there is much to send.
    await boss.createQueue(jobNames.deliverMail);
    await boss.schedule(jobNames.deliverMail, '* * * * *');
    await boss.work(jobNames.deliverMail, async () => {
      await drainOutbox({ maxMs: 50_000, limit: 50, shouldStop: sendingStopped });
    });
    // A fan-out is safe to run twice or to resume: every message has its own dedupe key and the cursor is saved
    // with each page. A worker that dies mid-way leaves the announcement unfinished, and the sweep starts it again.
    await boss.createQueue(jobNames.waitlistFanOut);
    await boss.work<{ announcementId: string }>(jobNames.waitlistFanOut, async ([job]) => {
      if (!job) return;
      const { queued } = await fanOutAnnouncement(job.data.announcementId);
      if (queued > 0) console.log(`queued ${queued} waitlist message(s) for announcement ${job.data.announcementId}`);
    });
    await boss.createQueue(jobNames.waitlistSweep);
    await boss.schedule(jobNames.waitlistSweep, '* * * * *');
    await boss.work(jobNames.waitlistSweep, async () => {
      await queueDueReminders();
      for (const id of await unfinishedAnnouncements(60)) await boss.send(jobNames.waitlistFanOut, { announcementId: id });
    });
    return boss;
  })();
  return globalForJobs.__demoldBoss;
}

/**
 * On a worker's start: fan-outs another worker left unfinished are queued again at once (not a minute later),
 * and the outbox starts sending.
 */
export async function resumeWork(): Promise<void> {
  const boss = await startJobs();
  for (const id of await unfinishedAnnouncements(0)) await boss.send(jobNames.waitlistFanOut, { announcementId: id });
  kickMail();
}

/**
 * Queues a job from any process. Where this process runs the jobs it uses that queue; elsewhere (a web instance
 * with jobs off, a script, a test) a short-lived send-only connection that runs no workers, schedules or
 * maintenance and is closed again at once, so nothing is left holding the database. Jobs are queued rarely
 * (one per announcement), so the connection's start-up cost does not matter.
 */
export async function sendJob(name: string, data: object): Promise<string | null> {
  const options = { retryLimit: 5, retryDelay: 10, retryBackoff: true, expireInSeconds: 15 * 60 };
  const running = await globalForJobs.__demoldBoss;
  if (running) {
    await running.createQueue(name);
    return running.send(name, data, options);
  }
  const sender = new PgBoss({ connectionString: getEnv().DATABASE_URL, max: 1, supervise: false, schedule: false, application_name: 'demold-jobs-send' });
  sender.on('error', (error) => console.error('Job queue error', error.message));
  await sender.start();
  try {
    await sender.createQueue(name);
    return await sender.send(name, data, options);
  } finally {
    await sender.stop({ graceful: false, wait: true, close: true });
  }
}

/** Stops the queue: running jobs finish first (up to `timeoutMs`), then this process's sending stops. */
export async function stopJobs({ timeoutMs = 20_000 }: { timeoutMs?: number } = {}): Promise<void> {
  const boss = globalForJobs.__demoldBoss;
  globalForJobs.__demoldBoss = undefined;
  const stopping = stopSending();
  const started = await boss?.catch(() => null);
  await started?.stop({ graceful: true, wait: true, timeout: timeoutMs });
  await stopping;
}
