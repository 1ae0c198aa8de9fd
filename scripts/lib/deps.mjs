// Installs the npm dependencies when any pinned one is missing or at another version.
import fs from 'node:fs';
import path from 'node:path';
import { root, run, step } from './run.mjs';

function installedVersion(name) {
  try {
    return JSON.parse(fs.readFileSync(path.join(root, 'node_modules', name, 'package.json'), 'utf8')).version;
  } catch {
    return null;
  }
}

export function ensureDependencies() {
  const pkg = JSON.parse(fs.readFileSync(path.join(root, 'package.json'), 'utf8'));
  const wanted = { ...pkg.dependencies, ...pkg.devDependencies };
  const stale = Object.entries(wanted).filter(([name, version]) => installedVersion(name) !== version);
  if (stale.length === 0) return;
  step(`Installing npm dependencies (npm ci): ${stale.length} missing or out of date`);
  run('npm', ['ci', '--no-audit', '--no-fund']);
}
