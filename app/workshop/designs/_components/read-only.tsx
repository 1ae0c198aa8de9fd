import type { ReactNode } from 'react';
import { formatMoney } from '@/lib/money';
import type { DesignEditView, MeasureField } from '@/lib/catalogue/editing';
import { StatusBadge } from './status';

/** For studio hands: what they see instead of the forms. */
export function ReadOnlyNotice({ what = 'designs' }: { what?: string }) {
  return (
    <p className="flex gap-2 rounded-sm border border-paper-edge bg-paper px-4 py-3 text-ink-soft">
      <span aria-hidden="true">◇</span>
      <span>Only the maker (owner) can change {what}. You can look at everything here, but not edit it.</span>
    </p>
  );
}

const measureLabels: Record<MeasureField, string> = {
  widthMm: 'Width',
  heightMm: 'Height',
  depthMm: 'Depth',
  weightG: 'Weight',
  eyeOpeningWidthMm: 'Eye opening width',
  eyeSpacingMm: 'Eye spacing',
  parcelLengthMm: 'Parcel length',
  parcelWidthMm: 'Parcel width',
  parcelHeightMm: 'Parcel height',
  parcelWeightG: 'Packed weight',
};

function Fact({ term, children }: { term: string; children: ReactNode }) {
  return (
    <div className="grid gap-0.5 sm:grid-cols-[12rem_1fr] sm:gap-4">
      <dt className="text-sm font-semibold text-ink-soft">{term}</dt>
      <dd className="whitespace-pre-line">{children}</dd>
    </div>
  );
}

const notSet = <span className="text-ink-faint">Not set</span>;

/** The design's fields as text, for people who may look but not change them. */
export function DesignFacts({ design }: { design: DesignEditView }) {
  const money = (amountMinor: number) => formatMoney({ amountMinor, currency: design.currency });
  return (
    <div className="grid gap-6">
      <dl className="grid gap-3 rounded-sm border border-paper-edge bg-paper p-4 sm:p-5">
        <Fact term="Slug">/designs/{design.slug}</Fact>
        <Fact term="Summary">{design.summary || notSet}</Fact>
        <Fact term="Base price">
          <span className="figures">{money(design.basePriceMinor)}</span>
        </Fact>
        <Fact term="Story">{design.story || notSet}</Fact>
        <Fact term="Materials">{design.materials || notSet}</Fact>
        <Fact term="Care">{design.care || notSet}</Fact>
        {(Object.keys(measureLabels) as MeasureField[]).map((field) => (
          <Fact key={field} term={measureLabels[field]}>
            {design.measures[field] === null ? (
              notSet
            ) : (
              <span className="figures">
                {design.measures[field]} {field.endsWith('G') ? 'g' : 'mm'}
              </span>
            )}
          </Fact>
        ))}
      </dl>
      <section aria-labelledby="finishes-title" className="grid gap-3">
        <h2 id="finishes-title" className="text-2xl font-medium">
          Finishes
        </h2>
        {design.finishes.length === 0 ? (
          <p className="text-ink-soft">No finishes yet.</p>
        ) : (
          <ul className="grid gap-2">
            {design.finishes.map((finish) => (
              <li key={finish.id} className="rounded-sm border border-paper-edge bg-paper px-4 py-3">
                <p className="flex flex-wrap items-center gap-2">
                  <span className="font-semibold">{finish.name}</span>
                  <StatusBadge status={finish.status} />
                </p>
                <p className="figures text-sm text-ink-soft">
                  {money(design.basePriceMinor + finish.priceDifferenceMinor)} (base + {money(finish.priceDifferenceMinor)}) ·{' '}
                  {Number(finish.paintHours)} h painting
                </p>
                {finish.description ? <p className="mt-1 text-sm">{finish.description}</p> : null}
              </li>
            ))}
          </ul>
        )}
      </section>
    </div>
  );
}

/** The usual cautions for the materials the finishes and castings are made with. */
export function MaterialsCaution() {
  return (
    <aside aria-labelledby="materials-caution-title" className="rounded-sm border border-paper-edge bg-paper px-4 py-3 text-sm text-ink-soft">
      <h2 id="materials-caution-title" className="mb-1 font-sans text-sm font-semibold text-ink">
        Working with the materials
      </h2>
      <p>
        Resins, solvents, paints and fibreglass dust: work with good ventilation, wear a suitable respirator, gloves and eye
        protection, and follow each product’s safety data sheet. Local codes and licensed practice come first.
      </p>
    </aside>
  );
}
