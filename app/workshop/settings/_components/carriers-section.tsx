'use client';

import { useState } from 'react';
import { trackingPlaceholder, trackingUrl } from '@/lib/settings/shipping-rules';
import { TextField } from '../../designs/_components/fields';
import { deleteCarrierAction, saveCarrierAction } from '../actions';
import { DeleteButton } from './delete-button';
import { SaveRow, sectionBox } from './parts';
import { useSettingsForm } from './use-settings-form';

export type CarrierValues = { id: string; name: string; trackingUrlTemplate: string };

const fields = ['name', 'trackingUrlTemplate'];

export function CarriersSection({
  carriers,
  exampleNumber,
  readOnly,
}: {
  carriers: CarrierValues[];
  exampleNumber: string;
  readOnly: boolean;
}) {
  return (
    <div className="grid gap-4">
      {carriers.length === 0 ? (
        <p className="rounded-sm border border-paper-edge bg-paper px-4 py-4 text-ink-soft">
          No carriers yet: add the ones the studio ships with.
        </p>
      ) : (
        <ul className="grid gap-3">
          {carriers.map((carrier) => (
            <li key={carrier.id} className="rounded-sm border border-paper-edge bg-paper">
              <div className="grid gap-2 px-4 py-3 sm:grid-cols-[1fr_auto] sm:items-start">
                <div className="min-w-0">
                  <p className="font-semibold">{carrier.name}</p>
                  <p className="break-all text-sm text-ink-soft">{carrier.trackingUrlTemplate}</p>
                </div>
                {readOnly ? null : (
                  <DeleteButton
                    action={deleteCarrierAction}
                    field="carrierId"
                    value={carrier.id}
                    label="Delete carrier"
                    what={carrier.name}
                    question={`Delete ${carrier.name}? Parcels already sent keep the tracking link they were sent with.`}
                  />
                )}
              </div>
              {readOnly ? null : (
                <details className="border-t border-paper-edge">
                  <summary className="cursor-pointer px-4 py-2 text-sm font-semibold hover:bg-paper-deep/60">
                    Edit {carrier.name}
                  </summary>
                  <div className="px-4 pb-4">
                    <CarrierForm carrier={carrier} exampleNumber={exampleNumber} />
                  </div>
                </details>
              )}
            </li>
          ))}
        </ul>
      )}
      {readOnly ? null : (
        <div className="grid gap-2">
          <h3 className="font-sans text-base font-semibold">Add a carrier</h3>
          <CarrierForm exampleNumber={exampleNumber} />
        </div>
      )}
    </div>
  );
}

// The server checks the template fully (lib/settings/schemas.ts); this only says early what is missing.
function previewProblem(template: string): string | null {
  if (template === '') return null;
  if (!template.startsWith('https://')) return 'Starts with https:// once saved.';
  if (!template.includes(trackingPlaceholder)) return `Needs ${trackingPlaceholder} where the number goes.`;
  return null;
}

function CarrierForm({ carrier, exampleNumber }: { carrier?: CarrierValues; exampleNumber: string }) {
  const { error, formRef, onSubmit, pending, status } = useSettingsForm(saveCarrierAction, fields, {
    resetOnSuccess: !carrier,
  });
  const [template, setTemplate] = useState(carrier?.trackingUrlTemplate ?? '');
  const problem = previewProblem(template.trim());
  return (
    <form
      ref={formRef}
      onSubmit={onSubmit}
      onReset={() => setTemplate('')}
      noValidate
      className={`${sectionBox} sm:grid-cols-[minmax(0,1fr)_minmax(0,2fr)]`}
    >
      {carrier ? <input type="hidden" name="carrierId" value={carrier.id} /> : null}
      <TextField
        label="Name"
        name="name"
        defaultValue={carrier?.name ?? ''}
        maxLength={60}
        autoComplete="off"
        error={error('name')}
      />
      <TextField
        label="Tracking link"
        name="trackingUrlTemplate"
        type="url"
        value={template}
        onChange={(event) => setTemplate(event.target.value)}
        maxLength={500}
        autoComplete="off"
        spellCheck={false}
        error={error('trackingUrlTemplate')}
        hint={`The carrier’s tracking page, https:// only, with ${trackingPlaceholder} where the tracking number goes.`}
      />
      <div className="sm:col-span-2" aria-live="polite">
        <p className="text-sm font-semibold">Preview for the example number {exampleNumber}</p>
        {template.trim() === '' ? (
          <p className="text-sm text-ink-faint">Type the link to see where buyers will be sent.</p>
        ) : problem ? (
          <p className="text-sm text-ember-deep">
            <span aria-hidden="true">▲ </span>
            {problem}
          </p>
        ) : (
          <p className="figures break-all text-sm">{trackingUrl(template.trim(), exampleNumber)}</p>
        )}
      </div>
      <SaveRow
        label={carrier ? `Save ${carrier.name}` : 'Add carrier'}
        pending={pending}
        status={status}
        className="sm:col-span-2"
      />
    </form>
  );
}
