import { z } from 'zod';
import { isIsoDate } from '@/lib/planner/calendar';

// The molds forms' inputs. Server actions read form data with Object.fromEntries, so every value arrives
// as text; numbers are parsed here, blank counts as missing (or as none, for pulls so far).

function count(what: string, { min, max, blank }: { min: number; max: number; blank?: number }) {
  return z.preprocess(
    (value) => {
      if (typeof value !== 'string') return value;
      const text = value.trim();
      return text === '' ? blank : Number(text);
    },
    z
      .number({ error: (issue) => (issue.input === undefined ? `Enter ${what}.` : `Enter ${what} as a number.`) })
      .int(`Enter ${what} as a whole number.`)
      .min(min, `Enter at least ${min} for ${what}.`)
      .max(max, `Enter at most ${max} for ${what}.`),
  );
}

const moldId = z.uuid({ error: 'That mold is not known. Reload the page.' });

export const addMoldSchema = z.object({
  designId: z.uuid({ error: 'Choose the design the mold is for.' }),
  label: z
    .string({ error: 'Give the mold a name.' })
    .trim()
    .min(1, 'Give the mold a name, for example “Ibex C”.')
    .max(60, 'Keep the name to 60 characters.'),
  madeOn: z.string({ error: 'Enter the day the mold was made.' }).refine(isIsoDate, 'Enter a real date, written YYYY-MM-DD.'),
  pullsSoFar: count('the pulls so far', { min: 0, max: 10_000, blank: 0 }),
  expectedLifePulls: count('the expected life in pulls', { min: 1, max: 10_000 }),
  notes: z.string().trim().max(2000, 'Keep the notes to 2,000 characters.').optional().default(''),
});

export const recordPullsSchema = z.object({
  moldId,
  pulls: count('the pulls to add', { min: 1, max: 500 }),
});

export const retireMoldSchema = z.object({ moldId });

export type AddMoldInput = z.infer<typeof addMoldSchema>;
export type RecordPullsInput = z.infer<typeof recordPullsSchema>;
export type RetireMoldInput = z.infer<typeof retireMoldSchema>;
