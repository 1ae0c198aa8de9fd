import 'server-only';
import { QueryTypes, type Transaction } from 'sequelize';
import { getDb } from './connection';

/** Runs one SQL statement with bound parameters ($1, $2, …) and returns its rows. Values never reach the text. */
export async function sql<T extends object>(text: string, bind: unknown[] = [], transaction?: Transaction): Promise<T[]> {
  return getDb().sequelize.query<T>(text, { bind, type: QueryTypes.SELECT, transaction });
}

/** Runs `work` in one transaction; PostgreSQL's serialization and deadlock failures run it again. */
export async function inTransaction<T>(work: (transaction: Transaction) => Promise<T>, attempts = 3): Promise<T> {
  for (let attempt = 1; ; attempt += 1) {
    try {
      return await getDb().sequelize.transaction(work);
    } catch (error) {
      const code = (error as { original?: { code?: string }; parent?: { code?: string } }).original?.code;
      if (attempt >= attempts || (code !== '40P01' && code !== '40001')) throw error;
    }
  }
}
