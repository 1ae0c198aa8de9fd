import 'server-only';
import type { z } from 'zod';
import { getDb } from '@/lib/db/connection';
import type { updateNameSchema } from './schemas';
import type { CurrentUser } from './session';

/** Changes the signed-in person's own name; the WHERE names them, so no one else's row can change. */
export async function updateAccountName(user: CurrentUser, input: z.infer<typeof updateNameSchema>): Promise<void> {
  await getDb().models.User.update({ name: input.name }, { where: { id: user.id } });
}
