'use strict';

// Run by `npm run demo` at every start: the demo's coming drop opens a few minutes after the demo does,
// so a person can watch it open. Only a drop nobody has held or bought from yet is moved.
const { Client } = require('pg');
const { drops, at } = require('./demo-drops.cjs');

async function retimeDemoDrops(databaseUrl) {
  const client = new Client({ connectionString: databaseUrl });
  await client.connect();
  try {
    const moved = [];
    for (const drop of drops.filter((d) => d.retimeOnDemoStart)) {
      const { rows } = await client.query(
        `UPDATE batches b SET early_access_at = $2, opens_at = $3, closes_at = $4, updated_at = now()
          WHERE b.name = $1 AND NOT EXISTS (SELECT 1 FROM holds h WHERE h.batch_id = b.id)
            AND NOT EXISTS (SELECT 1 FROM batch_stock s WHERE s.batch_id = b.id AND s.sold > 0)
          RETURNING b.opens_at`,
        [drop.name, drop.earlyAccess === null ? null : at(drop.earlyAccess), at(drop.opens), at(drop.closes)],
      );
      if (rows[0]) moved.push({ name: drop.name, opensAt: rows[0].opens_at });
    }
    // The drop that is open now stays open for the demo's lifetime.
    await client.query(`UPDATE batches SET closes_at = greatest(closes_at, now() + interval '2 days')
                         WHERE name = 'Winter batch' AND opens_at < now()`);
    return moved;
  } finally {
    await client.end();
  }
}

module.exports = { retimeDemoDrops };

if (require.main === module) {
  retimeDemoDrops(process.env.DATABASE_URL).then(
    (moved) => {
      for (const m of moved) console.log(`demo drop "${m.name}" opens at ${m.opensAt.toISOString()}`);
    },
    (error) => {
      console.error(error.message);
      process.exit(1);
    },
  );
}
