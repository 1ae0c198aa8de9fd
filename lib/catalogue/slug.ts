// Pure, so the workshop's forms can show the slug the server will make (lib/catalogue/editing.ts is
// server-only).

/** A URL name made from a design's or finish's name: "Soot & Gilt" → "soot-and-gilt". */
export function slugify(name: string): string {
  return name
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase()
    .replace(/&/g, ' and ')
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 80)
    .replace(/-+$/, '');
}
