import { connection } from 'next/server';
import { AppError, errorResponse } from '@/lib/api/errors';
import { getDb } from '@/lib/db/connection';
import { checkDatabase } from '@/lib/db/health';

/** Liveness and the database's state, for the demo command, load balancers and people. */
export async function GET(): Promise<Response> {
  await connection();
  const database = await checkDatabase(getDb().sequelize);
  if (database.status === 'down') {
    return errorResponse(
      new AppError(
        'database_unavailable',
        'The shop cannot reach its database right now. Try again in a few seconds.',
        503,
        { database },
        5,
      ),
    );
  }
  return Response.json(
    { status: 'ok', checks: { database } },
    { headers: { 'Cache-Control': 'no-store' } },
  );
}
