'use client';

import { TextField } from '../../designs/_components/fields';
import { updateCalendarAction } from '../actions';
import { FieldError, ListPicker, SaveRow, sectionBox } from './parts';
import { useSettingsForm } from './use-settings-form';

const weekdays = [
  { day: 1, name: 'Monday', short: 'Mon' },
  { day: 2, name: 'Tuesday', short: 'Tue' },
  { day: 3, name: 'Wednesday', short: 'Wed' },
  { day: 4, name: 'Thursday', short: 'Thu' },
  { day: 5, name: 'Friday', short: 'Fri' },
  { day: 6, name: 'Saturday', short: 'Sat' },
  { day: 7, name: 'Sunday', short: 'Sun' },
];

const shown = ['workingDays', 'hoursPerDay', 'holidays'];

export function CalendarSection({
  values,
  readOnly,
}: {
  values: { workingDays: number[]; hoursPerDay: number; holidays: string[] };
  readOnly: boolean;
}) {
  const { error, formRef, onSubmit, pending, status } = useSettingsForm(updateCalendarAction, shown);
  const daysError = error('workingDays');
  return (
    <form ref={formRef} onSubmit={onSubmit} noValidate>
      <fieldset disabled={readOnly} className={`${sectionBox} sm:grid-cols-2`}>
        <legend className="sr-only">Working calendar</legend>
        <fieldset className="grid gap-1 sm:col-span-2" aria-describedby="working-days-error">
          <legend className="text-sm font-semibold">Working days</legend>
          <div className="flex flex-wrap gap-2">
            {weekdays.map(({ day, name, short }) => (
              <label
                key={day}
                className="inline-flex items-center gap-2 rounded-sm border border-paper-edge bg-white px-3 py-2 has-[:checked]:border-ink"
              >
                <input
                  type="checkbox"
                  name={`day${day}`}
                  defaultChecked={values.workingDays.includes(day)}
                  aria-invalid={daysError ? true : undefined}
                  className="h-4 w-4"
                />
                <span aria-hidden="true">{short}</span>
                <span className="sr-only">{name}</span>
              </label>
            ))}
          </div>
          <FieldError id="working-days-error" error={daysError} />
        </fieldset>
        <TextField
          label="Working hours a day"
          name="hoursPerDay"
          defaultValue={String(values.hoursPerDay)}
          inputMode="decimal"
          autoComplete="off"
          suffix="h"
          error={error('hoursPerDay')}
          hint="Hours at the bench on a working day, such as 7 or 7.5."
        />
        <div className="sm:col-span-2">
          <ListPicker
            name="holidays"
            label="Holidays"
            input="date"
            initial={values.holidays}
            addLabel="Add holiday"
            emptyText="No holidays: the planner counts every working day."
            error={error('holidays')}
            hint="Days the studio is closed. The planner leaves them out when it promises a ship date."
            disabled={readOnly}
          />
        </div>
        {readOnly ? null : (
          <SaveRow label="Save the calendar" pending={pending} status={status} className="sm:col-span-2" />
        )}
      </fieldset>
    </form>
  );
}
