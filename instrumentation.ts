// Next.js calls register() once when a server instance starts: a bad configuration stops the start-up
// here, with every problem listed, instead of failing later inside a request. Then the job queue starts.
export async function register() {
  if (process.env.NEXT_RUNTIME === 'nodejs') {
    const { getEnv } = await import('@/lib/env');
    const env = getEnv();
    if (env.JOBS_ENABLED) {
      const { startJobs } = await import('@/lib/jobs/queue');
      // A queue that cannot start yet (database still coming up) must not stop the shop from serving.
      startJobs().catch((error) => console.error('The job queue did not start:', error instanceof Error ? error.message : error));
    }
  }
}
