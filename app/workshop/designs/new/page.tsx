import type { Metadata } from 'next';
import Link from 'next/link';
import { connection } from 'next/server';
import { requirePageRole } from '@/lib/auth/authorize';
import { getEditingStudio, measureFields } from '@/lib/catalogue/editing';
import { DesignForm } from '../_components/design-form';
import { ReadOnlyNotice } from '../_components/read-only';

export const metadata: Metadata = { title: 'New design' };

export default async function NewDesignPage() {
  const user = await requirePageRole('staff', '/workshop/designs/new');
  await connection();
  const studio = await getEditingStudio();
  return (
    <>
      <p className="text-sm">
        <Link href="/workshop/designs" className="underline underline-offset-4">
          Designs
        </Link>{' '}
        <span aria-hidden="true">/</span> New
      </p>
      <h1 className="mt-2 text-3xl font-medium">New design</h1>
      <p className="mt-1 text-ink-soft">
        It starts as a draft that buyers do not see. Then add its finishes and photos, and publish it.
      </p>
      <div className="mt-6">
        {user.role !== 'owner' ? (
          <ReadOnlyNotice what="designs or add new ones" />
        ) : !studio ? (
          <p className="text-ink-soft">The shop has no studio yet, so there is nothing to add a design to.</p>
        ) : (
          <DesignForm
            mode="create"
            currency={studio.currency}
            values={{
              name: '',
              slug: '',
              summary: '',
              story: '',
              basePrice: '',
              materials: '',
              care: '',
              measures: Object.fromEntries(measureFields.map((field) => [field, null])) as Record<(typeof measureFields)[number], null>,
            }}
          />
        )}
      </div>
    </>
  );
}
