import { z } from 'zod';

const wholeNumber = (label: string, min: number, max: number) =>
  z.coerce
    .number({ error: `${label} must be a whole number.` })
    .refine((n) => Number.isInteger(n), `${label} must be a whole number.`)
    .refine((n) => n >= min, `${label} must be at least ${min}.`)
    .refine((n) => n <= max, `${label} can be at most ${max}.`);

const localTime = z
  .string({ error: 'Enter a date and time.' })
  .trim()
  .regex(/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}$/, 'Enter the date and time as YYYY-MM-DD HH:MM.');

const isoDate = z
  .string({ error: 'Enter a date.' })
  .trim()
  .regex(/^\d{4}-\d{2}-\d{2}$/, 'Enter the date as YYYY-MM-DD.')
  .refine((value) => !Number.isNaN(Date.parse(`${value}T00:00:00Z`)) && new Date(`${value}T00:00:00Z`).toISOString().startsWith(value), 'That date does not exist.');

/**
 * The batch form. Quantities arrive as one field per finish, `qty.<finishId>`; times as the wall-clock
 * values of the studio's zone (the server turns them into instants and refuses DST gaps and repeats).
 */
export const batchFormSchema = z
  .looseObject({
    batchId: z.uuid().optional().or(z.literal('').transform(() => undefined)),
    designId: z.uuid({ error: 'Choose the design this batch casts.' }),
    name: z.string({ error: 'Give the batch a name.' }).trim().min(1, 'Give the batch a name, e.g. "Spring batch".').max(80, 'Keep the name under 80 characters.'),
    announcement: z.string().trim().max(4000, 'Keep the announcement under 4,000 characters.').default(''),
    perBuyerLimit: wholeNumber('The per-buyer limit', 1, 10),
    holdMinutes: wholeNumber('The hold time', 1, 60),
    earlyAccessAt: localTime.optional().or(z.literal('').transform(() => undefined)),
    opensAt: localTime,
    closesAt: localTime,
    shipBy: isoDate,
    plannedShipBy: isoDate.optional().or(z.literal('').transform(() => undefined)),
    intent: z.enum(['draft', 'schedule'], { error: 'Choose to save a draft or to schedule the batch.' }),
  })
  .transform((form, ctx) => {
    const quantities: Record<string, number> = {};
    for (const [key, value] of Object.entries(form)) {
      if (!key.startsWith('qty.')) continue;
      const finishId = key.slice(4);
      const raw = String(value ?? '').trim();
      if (raw === '') continue;
      const n = Number(raw);
      if (!z.uuid().safeParse(finishId).success) {
        ctx.addIssue({ code: 'custom', path: [key], message: 'That finish is not part of this design.' });
      } else if (!Number.isInteger(n) || n < 0) {
        ctx.addIssue({ code: 'custom', path: [key], message: 'Enter a whole number of masks, 0 or more.' });
      } else if (n > 10_000) {
        ctx.addIssue({ code: 'custom', path: [key], message: 'No batch is larger than 10,000 masks.' });
      } else {
        quantities[finishId] = n;
      }
    }
    if (!Object.values(quantities).some((n) => n > 0)) {
      ctx.addIssue({ code: 'custom', path: ['quantities'], message: 'Put at least one mask in the batch.' });
    }
    return {
      batchId: form.batchId,
      designId: form.designId,
      name: form.name,
      announcement: form.announcement,
      perBuyerLimit: form.perBuyerLimit,
      holdMinutes: form.holdMinutes,
      earlyAccessAt: form.earlyAccessAt,
      opensAt: form.opensAt,
      closesAt: form.closesAt,
      shipBy: form.shipBy,
      plannedShipBy: form.plannedShipBy,
      intent: form.intent,
      quantities,
    };
  });
export type BatchForm = z.infer<typeof batchFormSchema>;

export const cancelBatchSchema = z.object({ batchId: z.uuid({ error: 'That is not a batch.' }) });
