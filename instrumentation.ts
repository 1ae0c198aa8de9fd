// Next.js calls register() once when a server instance starts: a bad configuration stops the start-up
// here, with every problem listed, instead of failing later inside a request.
export async function register() {
  if (process.env.NEXT_RUNTIME === 'nodejs') {
    const { getEnv } = await import('@/lib/env');
    getEnv();
  }
}
