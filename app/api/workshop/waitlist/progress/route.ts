import { apiHandler, noStore } from '@/lib/api/handler';
import { requireRole } from '@/lib/auth/authorize';
import { listAnnouncementProgress } from '@/lib/waitlist/workshop-view';

/** How each recent announcement is sending, counted from the outbox; the waitlist page polls it while any is unfinished. */
export const GET = apiHandler(async () => {
  await requireRole('staff');
  const announcements = await listAnnouncementProgress();
  return Response.json({ announcements, unfinished: announcements.some((a) => a.unfinished) }, { headers: noStore });
});
