import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { diffEntry } from '@/lib/audit/diff';
import { auditPageSchema, listAudit, systemActorLabel, type AuditRow } from '@/lib/audit/log';
import { requirePageRole } from '@/lib/auth/authorize';
import { listDesignsForHomeCached } from '@/lib/catalogue/cached';

export const metadata: Metadata = { title: 'Audit log' };

type Props = { searchParams: Promise<Record<string, string | string[] | undefined>> };

const pageSize = 50;

/** With the year: the log reaches back further than a drop's week. */
function when(at: string, timeZone: string): string {
  return new Intl.DateTimeFormat('en-GB', {
    timeZone,
    day: 'numeric',
    month: 'short',
    year: 'numeric',
    hour: '2-digit',
    minute: '2-digit',
    timeZoneName: 'short',
  }).format(new Date(at));
}

function Who({ entry }: { entry: AuditRow }) {
  const gone = entry.actorUserId === null && entry.actorLabel !== systemActorLabel;
  return (
    <span>
      {entry.actorLabel}
      {gone ? <span className="text-ink-faint"> (account since deleted)</span> : null}
    </span>
  );
}

function BeforeAfter({ entry }: { entry: AuditRow }) {
  const rows = diffEntry(entry.before, entry.after);
  if (rows.length === 0) return null;
  return (
    <details className="mt-2 text-sm">
      <summary className="cursor-pointer text-ink-soft hover:text-ink">Before and after</summary>
      <table className="mt-2 w-full max-w-xl text-left">
        <thead className="text-ink-soft">
          <tr>
            <th scope="col" className="py-1 pr-3 font-semibold">What</th>
            <th scope="col" className="py-1 pr-3 font-semibold">Before</th>
            <th scope="col" className="py-1 font-semibold">After</th>
          </tr>
        </thead>
        <tbody>
          {rows.map((row) => (
            <tr key={row.key} className={row.changed ? 'font-semibold' : 'text-ink-soft'}>
              <th scope="row" className="py-1 pr-3 font-normal">
                {row.label}
                {row.changed ? <span className="sr-only"> (changed)</span> : null}
              </th>
              <td className="figures py-1 pr-3">{row.before}</td>
              <td className="figures py-1">{row.after}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </details>
  );
}

export default async function AuditPage({ searchParams }: Props) {
  await requirePageRole('staff', '/workshop/audit');
  const query = auditPageSchema.safeParse(await searchParams);
  if (!query.success) notFound();
  const before = query.data.before;
  const [{ entries, olderBefore }, { studio }] = await Promise.all([
    listAudit({ limit: pageSize, before }),
    listDesignsForHomeCached(),
  ]);
  const zone = studio?.timeZone ?? 'UTC';
  return (
    <>
      <h1 className="text-3xl font-medium">Audit log</h1>
      <p className="mt-1 text-ink-soft">
        Every change to money, stock, people and the catalogue, newest first, with who made it. Entries are only
        ever added: nobody can edit or remove one. Times are the studio&rsquo;s ({zone}).
      </p>
      {entries.length === 0 ? (
        <p className="mt-6 rounded-sm border border-paper-edge bg-paper px-4 py-6 text-ink-soft">
          {before ? (
            <>
              There are no older entries.{' '}
              <Link href="/workshop/audit" className="underline underline-offset-4">
                Back to the newest
              </Link>
            </>
          ) : (
            'Nothing logged yet. Refunds, price changes, batches, molds and changes to people appear here as they are made.'
          )}
        </p>
      ) : (
        <ol className="mt-6 divide-y divide-paper-edge rounded-sm border border-paper-edge bg-paper">
          {entries.map((entry) => (
            <li key={entry.id} className="px-4 py-3">
              <p className="text-sm text-ink-soft">
                <time dateTime={entry.createdAt} className="figures">
                  {when(entry.createdAt, zone)}
                </time>{' '}
                · <Who entry={entry} />
              </p>
              <p className="mt-0.5">{entry.summary}</p>
              <BeforeAfter entry={entry} />
            </li>
          ))}
        </ol>
      )}
      {before || olderBefore ? (
        <nav aria-label="Pages of the log" className="mt-4 flex gap-4 text-sm">
        {before ? (
          <Link href="/workshop/audit" className="underline underline-offset-4">
            Newest entries
          </Link>
        ) : null}
        {olderBefore ? (
          <Link href={`/workshop/audit?before=${olderBefore}`} className="underline underline-offset-4">
            Older entries
          </Link>
        ) : null}
        </nav>
      ) : null}
    </>
  );
}
