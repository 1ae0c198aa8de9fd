/** The time a server render uses; one place to read it, so a page and its parts agree. */
export function requestTime(): number {
  return Date.now();
}
