import { QueryTypes, type Sequelize } from 'sequelize';

export type DatabaseHealth =
  | { status: 'up'; latencyMs: number; serverVersion: string }
  | { status: 'down'; latencyMs: number; reason: string };

/** Asks PostgreSQL one cheap question; never throws, so callers can report the answer. */
export async function checkDatabase(sequelize: Sequelize, timeoutMs = 2_000): Promise<DatabaseHealth> {
  const started = performance.now();
  const elapsed = () => Math.round(performance.now() - started);
  let timer: NodeJS.Timeout | undefined;
  try {
    const timeout = new Promise<never>((_, reject) => {
      timer = setTimeout(() => reject(new Error(`no answer within ${timeoutMs} ms`)), timeoutMs);
    });
    const query = sequelize.query<{ version: string }>("SELECT current_setting('server_version') AS version", {
      type: QueryTypes.SELECT,
      plain: true,
    });
    const row = await Promise.race([query, timeout]);
    return { status: 'up', latencyMs: elapsed(), serverVersion: row?.version ?? 'unknown' };
  } catch (error) {
    return { status: 'down', latencyMs: elapsed(), reason: describeDatabaseError(error) };
  } finally {
    clearTimeout(timer);
  }
}

function describeDatabaseError(error: unknown): string {
  const name = error instanceof Error ? error.name : '';
  if (name === 'SequelizeConnectionRefusedError') return 'connection refused';
  if (name === 'SequelizeConnectionAcquireTimeoutError') return 'no free connection in time';
  if (name === 'SequelizeAccessDeniedError') return 'access denied';
  if (name === 'SequelizeHostNotFoundError') return 'host not found';
  if (error instanceof Error && error.message.startsWith('no answer')) return error.message;
  return 'not reachable';
}
