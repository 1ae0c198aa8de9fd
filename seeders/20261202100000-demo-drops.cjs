'use strict';

const { drops, eyeOpenings, at, DAY } = require('./support/demo-drops.cjs');

/** The demo's drops: one open now, one opening a few minutes after the demo starts, one sold out. */
module.exports = {
  async up(queryInterface) {
    const q = (sql, replacements, transaction) =>
      queryInterface.sequelize.query(sql, { replacements, transaction, type: queryInterface.sequelize.QueryTypes.SELECT });

    await queryInterface.sequelize.transaction(async (transaction) => {
      for (const [slug, eye] of Object.entries(eyeOpenings)) {
        await queryInterface.sequelize.query(
          'UPDATE designs SET eye_opening_width_mm = :width, eye_spacing_mm = :spacing WHERE slug = :slug',
          { replacements: { ...eye, slug }, transaction },
        );
      }
      for (const drop of drops) {
        const [design] = await q('SELECT id FROM designs WHERE slug = :slug', { slug: drop.design }, transaction);
        const shipBy = at(drop.shipByDays * DAY).toISOString().slice(0, 10);
        const [batch] = await q(
          `INSERT INTO batches (design_id, name, status, per_buyer_limit, hold_minutes, early_access_at, opens_at, closes_at, ship_by)
           VALUES (:design, :name, 'scheduled', :limit, :minutes, :early, :opens, :closes, :shipBy) RETURNING id`,
          {
            design: design.id,
            name: drop.name,
            limit: drop.perBuyerLimit,
            minutes: drop.holdMinutes,
            early: drop.earlyAccess === null ? null : at(drop.earlyAccess),
            opens: at(drop.opens),
            closes: at(drop.closes),
            shipBy,
          },
          transaction,
        );
        for (const [finish, quantity] of Object.entries(drop.stock)) {
          await q(
            `INSERT INTO batch_stock (batch_id, finish_id, quantity, sold)
             SELECT :batch, f.id, :quantity, :sold FROM finishes f WHERE f.design_id = :design AND f.slug = :finish
             RETURNING id`,
            { batch: batch.id, quantity, sold: drop.soldOut ? quantity : 0, design: design.id, finish },
            transaction,
          );
        }
        for (const email of drop.earlyAccessFor ?? []) {
          await q(
            `INSERT INTO early_access_grants (batch_id, user_id) SELECT :batch, id FROM users WHERE email = :email RETURNING user_id`,
            { batch: batch.id, email },
            transaction,
          );
        }
      }
    });
  },

  async down(queryInterface) {
    await queryInterface.bulkDelete('batches', { name: drops.map((d) => d.name) });
  },
};
