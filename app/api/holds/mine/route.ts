import { apiHandler, noStore } from '@/lib/api/handler';
import { requireUser } from '@/lib/auth/authorize';
import { listMyActiveHolds } from '@/lib/drops/holds';

/** The signed-in buyer's running holds. */
export const GET = apiHandler(async () => {
  const user = await requireUser();
  return Response.json({ holds: await listMyActiveHolds(user) }, { headers: noStore });
});
