import fs from 'node:fs';
import path from 'node:path';

// Finds what the app exposes by walking app/, the way Next.js itself maps files to URLs, so that access
// rules can be checked for every page, route handler and server action that exists.
const root = path.resolve(__dirname, '../..');
const appDir = path.join(root, 'app');

function walk(dir: string): string[] {
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
    const full = path.join(dir, entry.name);
    if (entry.isDirectory()) return entry.name.startsWith('_') ? [] : walk(full);
    return [full];
  });
}

/** The URL pattern of a file's folder: route groups "(shop)" vanish, dynamic segments stay as written. */
function urlPattern(file: string): string {
  const segments = path
    .relative(appDir, path.dirname(file))
    .split(path.sep)
    .filter((segment) => segment && !(segment.startsWith('(') && segment.endsWith(')')));
  return `/${segments.join('/')}`;
}

export function findPages(): string[] {
  return walk(appDir)
    .filter((file) => /\/page\.tsx?$/.test(file))
    .map(urlPattern)
    .sort();
}

export function findRouteHandlers(): { pattern: string; methods: string[] }[] {
  return walk(appDir)
    .filter((file) => /\/route\.ts$/.test(file))
    .map((file) => {
      const source = fs.readFileSync(file, 'utf8');
      const methods = [...source.matchAll(/export (?:(?:async )?function|const) (GET|POST|PUT|PATCH|DELETE)\b/g)].map((m) => m[1]!);
      return { pattern: urlPattern(file), methods: methods.sort() };
    })
    .sort((a, b) => a.pattern.localeCompare(b.pattern));
}

/** Server actions: the exports of every file under app/ or lib/ that starts with 'use server'. */
export function findServerActions(): { file: string; name: string }[] {
  return [...walk(appDir), ...walk(path.join(root, 'lib'))]
    .filter((file) => /\.tsx?$/.test(file))
    .filter((file) => /^\s*['"]use server['"]/.test(fs.readFileSync(file, 'utf8')))
    .flatMap((file) => {
      const source = fs.readFileSync(file, 'utf8');
      const names = [...source.matchAll(/export (?:const|async function|function) (\w+)/g)].map((m) => m[1]!);
      return names.map((name) => ({ file: path.relative(root, file), name }));
    });
}
