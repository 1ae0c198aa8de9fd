// One OS process of the hold race: fires one hold attempt per session token given, all at once, and
// prints what came back as one JSON line. Run by tests/e2e/race.spec.ts, two of these side by side.
const [baseURL, batchId, finishId, tokensJson] = process.argv.slice(2);
const tokens = JSON.parse(tokensJson);

const results = await Promise.all(
  tokens.map(async (token, i) => {
    const started = performance.now();
    try {
      const response = await fetch(`${baseURL}/api/holds`, {
        method: 'POST',
        headers: {
          'Content-Type': 'application/json',
          Cookie: `next-auth.session-token=${token}`,
          // Each buyer from a network of their own, as at a real opening (documentation range, RFC 5737).
          'X-Real-IP': `198.51.${100 + (i >> 8)}.${i & 255}`,
        },
        body: JSON.stringify({ batchId, finishId, quantity: 1 }),
      });
      const body = await response.json().catch(() => null);
      return { status: response.status, code: body?.error?.code ?? null, ms: performance.now() - started };
    } catch (error) {
      return { status: 0, code: String(error), ms: performance.now() - started };
    }
  }),
);
process.stdout.write(`${JSON.stringify(results)}\n`);
