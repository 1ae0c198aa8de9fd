'use client';

import { minorUnitDigits } from '@/lib/money';
import { formatDay } from '@/lib/planner/format';
import type { PlannerDesign, PlannerStudio } from '@/lib/planner/load';
import { Field, Group } from './fields';
import { fieldPaths, finishPath, type FieldKey, type FormState } from './plan-form';

const weekdayNames = ['Mon', 'Tue', 'Wed', 'Thu', 'Fri', 'Sat', 'Sun'];

type Props = {
  studio: PlannerStudio;
  design: PlannerDesign;
  state: FormState;
  errors: Record<string, string>;
  setField: (key: FieldKey, value: string) => void;
  setFinish: (finishId: string, field: 'quantity' | 'price' | 'paintHours', value: string) => void;
  onReset: () => void;
};

type Def = { key: FieldKey; label: string; unit?: string; hint?: string; ruleOfThumb?: boolean; whole?: boolean; date?: boolean };

// Hints say where a starting value comes from: the studio's settings, a rule of thumb (common practice, no
// source) or a figure recalled from memory.
const castingFields: Def[] = [
  { key: 'startOn', label: 'Start on', date: true, hint: 'The first working day on or after this date is day 1.' },
  { key: 'pullsPerMoldPerDay', label: 'Pulls per mold a day', whole: true, ruleOfThumb: true, hint: 'A slush-cast shell demolds in a few hours.' },
  { key: 'failedPullsPercent', label: 'Failed pulls', unit: '%', ruleOfThumb: true, hint: 'Voids, thin spots, tears. Below 100%.' },
  { key: 'trimMinutesPerPull', label: 'Trimming a kept pull', unit: 'minutes', whole: true, ruleOfThumb: true, hint: 'Failed pulls are set aside at demold.' },
  { key: 'packingMinutesPerOrder', label: 'Packing an order', unit: 'minutes', whole: true, ruleOfThumb: true, hint: 'One mask to an order and a box.' },
  { key: 'handlingDays', label: 'Handling before dispatch', unit: 'working days', whole: true, ruleOfThumb: true },
];

const hoursFields: Def[] = [
  { key: 'hoursPerDay', label: 'Working hours a day', unit: 'h', hint: 'The studio’s setting. Mold making, trimming and packing share these hours.' },
  { key: 'painterHoursPerDay', label: 'Painting hours a day', unit: 'h', ruleOfThumb: true, hint: 'Hours of painting a day, apart from the bench work.' },
];

const moldFields: Def[] = [
  { key: 'lifePulls', label: 'Life of a new mold', unit: 'pulls', whole: true, ruleOfThumb: true, hint: 'Brush-on silicone gives some tens of pulls.' },
  { key: 'siliconeCoats', label: 'Silicone coats', whole: true, ruleOfThumb: true },
  { key: 'coatCureHours', label: 'Cure before the next coat', unit: 'h', ruleOfThumb: true, hint: 'About an hour a coat.' },
  { key: 'jacketHalves', label: 'Jacket halves', whole: true, ruleOfThumb: true, hint: 'Each half cures overnight before the next.' },
  { key: 'jacketLayersPerHalf', label: 'Jacket layers a half', whole: true, ruleOfThumb: true },
  { key: 'jacketLayerHours', label: 'Hours a jacket layer', unit: 'h', ruleOfThumb: true, hint: 'One to two hours a layer.' },
];

export function InputsForm({ studio, design, state, errors, setField, setFinish, onReset }: Props) {
  const currencyUnit = design.currency;
  const moneyMode = minorUnitDigits(design.currency) > 0 ? 'decimal' : 'numeric';
  const field = (def: Def) => (
    <Field
      key={def.key}
      id={`plan-${def.key}`}
      label={def.label}
      unit={def.unit}
      hint={def.hint}
      ruleOfThumb={def.ruleOfThumb}
      type={def.date ? 'date' : 'text'}
      inputMode={def.whole ? 'numeric' : 'decimal'}
      value={state.fields[def.key]}
      onChange={(value) => setField(def.key, value)}
      error={errors[fieldPaths[def.key]]}
    />
  );
  const working = studio.calendar.workingDays.map((d) => weekdayNames[d - 1]).join(', ');
  const shell = design.shell;
  const m = design.measures;

  return (
    <form className="grid content-start gap-4" aria-label="Plan inputs" onSubmit={(event) => event.preventDefault()}>
      <a href="#plan-results" className="justify-self-start text-sm underline underline-offset-4 lg:hidden">
        Skip to the plan
      </a>
      <Group
        title="Masks by finish"
        note={
          errors.finishes ? (
            <p className="font-semibold text-ember-deep" id="plan-finishes-error">
              <span aria-hidden="true">▲ </span>
              {errors.finishes}
            </p>
          ) : (
            'How many masks of each finish, each finish’s price and its paint hours for one mask.'
          )
        }
      >
        {design.finishes.map((finish, index) => {
          const values = state.finishes[finish.finishId]!;
          return (
            <div key={finish.finishId} className="grid gap-x-3 border-b border-paper-edge/60 pb-2 last:border-0 grid-cols-3 sm:col-span-2">
              <p className="col-span-3 pt-1 font-semibold">{finish.name}</p>
              <Field
                id={`plan-qty-${finish.slug}`}
                label="Masks"
                srLabel={`of ${finish.name}`}
                inputMode="numeric"
                value={values.quantity}
                onChange={(v) => setFinish(finish.finishId, 'quantity', v)}
                error={errors[finishPath(index, 'quantity')]}
              />
              <Field
                id={`plan-price-${finish.slug}`}
                label="Price"
                srLabel={`of ${finish.name}`}
                unit={currencyUnit}
                inputMode={moneyMode}
                value={values.price}
                onChange={(v) => setFinish(finish.finishId, 'price', v)}
                error={errors[finishPath(index, 'priceMinor')]}
              />
              <Field
                id={`plan-paint-${finish.slug}`}
                label="Paint hours"
                srLabel={`of ${finish.name}`}
                unit="h"
                value={values.paintHours}
                onChange={(v) => setFinish(finish.finishId, 'paintHours', v)}
                error={errors[finishPath(index, 'paintHoursPerMask')]}
              />
            </div>
          );
        })}
      </Group>

      <Group
        title="Calendar and hours"
        note={
          <>
            The studio works {working}.{' '}
            {studio.calendar.holidays.length > 0
              ? `Holidays ahead: ${studio.calendar.holidays.slice(0, 6).map(formatDay).join('; ')}${studio.calendar.holidays.length > 6 ? ' …' : ''}.`
              : 'No holidays are set.'}
          </>
        }
      >
        {castingFields.slice(0, 1).map(field)}
        {hoursFields.map(field)}
      </Group>

      <Group title="Casting, trimming, packing">{castingFields.slice(1).map(field)}</Group>

      <Group
        title="A new mold, if one is needed"
        note="Counted only when the molds in use do not have the pulls left. Brush-on silicone coats, then a fibreglass-and-resin jacket in halves (common practice, no source)."
      >
        {moldFields.map(field)}
      </Group>

      <Group title="Resin">
        {field({
          key: 'shellAreaCm2',
          label: 'Shell area',
          unit: 'cm²',
          ruleOfThumb: true,
          hint:
            shell.ruleOfThumb === 'half-ellipsoid'
              ? `Front half of an ellipsoid ${m.widthMm} × ${m.heightMm} × ${m.depthMm} mm (the design’s measures) ≈ ${shell.areaCm2.toLocaleString('en-IE')} cm²; horns and ears not counted.`
              : 'The design has no measures: a typical face mask’s shell.',
        })}
        {field({ key: 'wallThicknessMm', label: 'Wall thickness', unit: 'mm', ruleOfThumb: true, hint: 'A slush-cast shell is a few millimetres thick.' })}
        {field({
          key: 'resinDensityGPerCm3',
          label: 'Resin density',
          unit: 'g/cm³',
          ruleOfThumb: true,
          hint: 'Recalled from memory: unfilled polyurethane casting resins are typically about 1.0–1.2 g/cm³. Use your resin’s datasheet.',
        })}
        {field({ key: 'wastePercent', label: 'Waste allowance', unit: '%', ruleOfThumb: true, hint: 'Resin left in cups and poured out after each coat.' })}
      </Group>

      <Group title="Costs" note={`The studio’s own figures, in ${design.currency}. Prices include tax at ${studio.taxRateBasisPoints / 100}% (the studio’s setting).`}>
        {field({ key: 'resinPricePerKg', label: 'Resin price', unit: `${currencyUnit} a kg` })}
        {field({ key: 'paintCostPerMask', label: 'Paint and varnish', unit: `${currencyUnit} a mask` })}
        {field({ key: 'packagingPerMask', label: 'Packaging', unit: `${currencyUnit} a mask` })}
        {field({ key: 'cardFeePercent', label: 'Card fee', unit: '% of the price' })}
        {field({ key: 'cardFeeFixed', label: 'Card fee, fixed', unit: `${currencyUnit} a payment` })}
      </Group>

      <button type="button" onClick={onReset} className="justify-self-start rounded-full border border-paper-edge px-4 py-1.5 text-sm hover:border-ink">
        Back to the studio’s defaults
      </button>
    </form>
  );
}
