import { z } from 'zod';
import { boardStages, failedStages, lineStages } from './stages';

export const maxLinesPerMove = 60;

const stage = z.enum(lineStages, { error: 'That is not a production stage.' });
const lineId = z.uuid({ error: 'That is not a mask of an order.' });
const lineIdArray = z
  .array(lineId)
  .min(1, 'Choose at least one mask to move.')
  .max(maxLinesPerMove, `Move at most ${maxLinesPerMove} masks at a time.`);

/** What `moveLines` takes: the masks, the stage the person saw them at (when known), and where they go. */
export const moveLinesSchema = z.object({ lineIds: lineIdArray, from: stage.optional(), to: stage });
export type MoveLinesInput = z.infer<typeof moveLinesSchema>;

// Forms arrive through Object.fromEntries, so several chosen masks come as one comma-separated field.
const lineIdList = z
  .string({ error: 'Choose at least one mask to move.' })
  .transform((value) =>
    value
      .split(',')
      .map((id) => id.trim())
      .filter(Boolean),
  )
  .pipe(lineIdArray);

export const moveLinesFormSchema = z.object({
  lineIds: lineIdList,
  from: stage,
  to: z.enum(boardStages, { error: 'Choose a stage on the board to move the masks to.' }),
});

export const failLineFormSchema = z.object({
  lineId,
  from: z.enum(['to_cast', 'cast', 'trimmed', 'painted'], { error: 'Only a mask that is not packed yet can be marked failed.' }),
});

export const recastLineFormSchema = z.object({
  lineId,
  from: z.enum(failedStages, { error: 'Only a failed mask goes back for a spare pull.' }),
});

/** The board's query string: an unknown or malformed batch simply shows every batch. */
export const boardSearchSchema = z.object({ batch: z.uuid().optional().catch(undefined) });
