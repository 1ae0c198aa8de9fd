import { z } from 'zod';

export const createHoldSchema = z.object({
  batchId: z.uuid({ error: 'batchId must be the id of a batch.' }),
  finishId: z.uuid({ error: 'finishId must be the id of a finish.' }),
  quantity: z
    .number({ error: 'quantity must be a whole number.' })
    .int('quantity must be a whole number.')
    .min(1, 'Hold at least one mask.')
    .max(10, 'No batch lets one buyer hold more than 10.')
    .default(1),
});
export type CreateHoldInput = z.infer<typeof createHoldSchema>;

export const holdIdSchema = z.uuid({ error: 'That is not a hold id.' });
export const batchIdSchema = z.uuid({ error: 'That is not a batch id.' });
