import type { Metadata } from 'next';
import { requirePageRole } from '@/lib/auth/authorize';
import { listStudioPeople } from '@/lib/auth/people';
import { roleLabels } from '@/lib/auth/roles';
import { InviteForm } from './_components/invite-form';
import { PersonActions } from './_components/person-actions';

export const metadata: Metadata = { title: 'People' };

export default async function PeoplePage() {
  const user = await requirePageRole('staff', '/workshop/people');
  const people = await listStudioPeople();
  const isOwner = user.role === 'owner';
  return (
    <>
      <h1 className="text-3xl font-medium">People</h1>
      <p className="mt-1 text-ink-soft">
        Makers (owners) can change prices, refund and manage people. Studio hands move orders through production and
        shipping.
      </p>
      {isOwner ? (
        <section aria-labelledby="invite-title" className="mt-6">
          <h2 id="invite-title" className="mb-2 font-sans text-base font-semibold">Invite someone</h2>
          <InviteForm />
        </section>
      ) : null}
      <ul className="mt-8 divide-y divide-paper-edge rounded-sm border border-paper-edge bg-paper">
        {people.map((person) => {
          const label = person.name ?? person.email;
          return (
            <li key={person.id} className="grid gap-2 px-4 py-3 sm:grid-cols-[1fr_auto] sm:items-center">
              <div>
                <p className="font-semibold">
                  {label}
                  {person.id === user.id ? <span className="ml-2 text-sm font-normal text-ink-faint">(you)</span> : null}
                </p>
                <p className="text-sm text-ink-soft">
                  {person.email} · {roleLabels[person.role]}
                </p>
              </div>
              {isOwner ? <PersonActions userId={person.id} role={person.role} label={label} /> : null}
            </li>
          );
        })}
      </ul>
    </>
  );
}
