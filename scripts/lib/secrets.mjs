// The demo's and tests' AUTH_SECRET: made once per checkout and kept in .data/, so sessions survive a restart.
import { randomBytes } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { root } from './run.mjs';

export function ensureAuthSecret() {
  if (process.env.AUTH_SECRET) return process.env.AUTH_SECRET;
  const file = path.join(root, '.data/auth-secret');
  if (fs.existsSync(file)) return fs.readFileSync(file, 'utf8').trim();
  fs.mkdirSync(path.dirname(file), { recursive: true });
  const secret = randomBytes(32).toString('base64url');
  fs.writeFileSync(file, `${secret}\n`, { mode: 0o600 });
  return secret;
}
