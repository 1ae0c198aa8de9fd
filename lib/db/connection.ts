import pg from 'pg';
import { Sequelize } from 'sequelize';
import { initModels, type Models } from '@/models';
import { getEnv } from '@/lib/env';

export type ConnectionOptions = {
  url: string;
  poolMax: number;
  statementTimeoutMs: number;
  /** How long to wait for a free connection (and for a new one to open) before giving up. */
  acquireTimeoutMs?: number;
};

/** A Sequelize instance with Demold's settings; most code wants `getDb()` instead. */
export function createSequelize(options: ConnectionOptions): Sequelize {
  return new Sequelize(options.url, {
    dialect: 'postgres',
    // Passed explicitly so the bundler-free server build never has to resolve the dialect by name.
    dialectModule: pg,
    logging: false,
    define: { underscored: true },
    pool: { max: options.poolMax, min: 0, idle: 10_000, acquire: options.acquireTimeoutMs ?? 10_000 },
    dialectOptions: {
      application_name: 'demold',
      statement_timeout: options.statementTimeoutMs,
      connectionTimeoutMillis: options.acquireTimeoutMs ?? 5_000,
    },
  });
}

type Db = { sequelize: Sequelize; models: Models };

// One pool per process: Next.js may evaluate this module more than once (and reloads it in dev).
const globalForDb = globalThis as typeof globalThis & { __demoldDb?: Db };

export function getDb(): Db {
  if (!globalForDb.__demoldDb) {
    const env = getEnv();
    const sequelize = createSequelize({
      url: env.DATABASE_URL,
      poolMax: env.DATABASE_POOL_MAX,
      statementTimeoutMs: env.DATABASE_STATEMENT_TIMEOUT_MS,
    });
    globalForDb.__demoldDb = { sequelize, models: initModels(sequelize) };
  }
  return globalForDb.__demoldDb;
}

/** Closes the process's pool (scripts and tests); the next `getDb()` opens a new one. */
export async function closeDb(): Promise<void> {
  const db = globalForDb.__demoldDb;
  globalForDb.__demoldDb = undefined;
  await db?.sequelize.close();
}
