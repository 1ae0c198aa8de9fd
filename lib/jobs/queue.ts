import 'server-only';
import PgBoss from 'pg-boss';
import { getEnv } from '@/lib/env';
import { expireHolds } from '@/lib/drops/holds';
import { deliverOutbox } from '@/lib/mail/outbox';
import { sweepPayments } from '@/lib/orders/sweeps';

// Jobs live in PostgreSQL (pg-boss keeps its own schema, `pgboss`), so any number of app instances can
// run the same schedule: pg-boss hands each job to one worker, and a cron fires once per minute overall.
export const jobNames = { expireHolds: 'expire-holds', sweepPayments: 'sweep-payments', deliverMail: 'deliver-mail' } as const;

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
    // The outbox is sent right after each change that queues mail (see kickMail) and swept each minute.
    await boss.createQueue(jobNames.deliverMail);
    await boss.schedule(jobNames.deliverMail, '* * * * *');
    await boss.work(jobNames.deliverMail, async () => {
      await deliverOutbox({ limit: 200 });
    });
    return boss;
  })();
  return globalForJobs.__demoldBoss;
}
