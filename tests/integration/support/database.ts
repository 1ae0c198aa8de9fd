import { spawnSync } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import path from 'node:path';
import pg from 'pg';

const root = path.resolve(__dirname, '../../..');

/** The server the test command prepared; any database on it may be created by the tests' role. */
export function adminUrl(): string {
  const url = process.env.TEST_DATABASE_URL;
  if (!url) {
    throw new Error(
      'TEST_DATABASE_URL is not set. Run the tests through `npm test`, which starts PostgreSQL and sets it.',
    );
  }
  return url;
}

function withDatabase(url: string, database: string): string {
  const parsed = new URL(url);
  parsed.pathname = `/${database}`;
  return parsed.toString();
}

export type ScratchDatabase = { name: string; url: string; drop: () => Promise<void> };

/** A new, empty database of its own for one test file, dropped afterwards. */
export async function createScratchDatabase(label: string): Promise<ScratchDatabase> {
  const name = `demold_it_${label}_${randomBytes(4).toString('hex')}`;
  const admin = new pg.Client({ connectionString: adminUrl() });
  await admin.connect();
  try {
    await admin.query(`CREATE DATABASE ${name}`);
  } finally {
    await admin.end();
  }
  return {
    name,
    url: withDatabase(adminUrl(), name),
    async drop() {
      const client = new pg.Client({ connectionString: adminUrl() });
      await client.connect();
      try {
        await client.query(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`);
      } finally {
        await client.end();
      }
    },
  };
}

/** Runs sequelize-cli exactly as `npm run db:migrate` does; throws with its output when it fails. */
export function sequelizeCli(url: string, args: string[]): string {
  const result = spawnSync(process.execPath, [path.join(root, 'node_modules/sequelize-cli/lib/sequelize'), ...args], {
    cwd: root,
    encoding: 'utf8',
    env: { ...process.env, DATABASE_URL: url },
  });
  if (result.status !== 0) {
    throw new Error(`sequelize-cli ${args.join(' ')} failed:\n${result.stdout}\n${result.stderr}`);
  }
  return result.stdout;
}

/** A short-lived plain client for looking at the database directly, outside the app's models. */
export async function query<T extends pg.QueryResultRow>(url: string, sql: string, params: unknown[] = []) {
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    return (await client.query<T>(sql, params)).rows;
  } finally {
    await client.end();
  }
}
