'use strict';

const { taxRateBasisPoints, padMm, packingG, zones } = require('./support/demo-shipping.cjs');

/** The demo studio's tax rate, its parcels and its shipping zones. */
module.exports = {
  async up(queryInterface) {
    const q = (sql, replacements, transaction) =>
      queryInterface.sequelize.query(sql, { replacements, transaction, type: queryInterface.sequelize.QueryTypes.SELECT });
    await queryInterface.sequelize.transaction(async (transaction) => {
      const [studio] = await q(`SELECT id FROM studios WHERE slug = 'marrowgate'`, {}, transaction);
      await q(`UPDATE studios SET tax_label = 'VAT', tax_rate_bp = :rate, volumetric_divisor = 5000 WHERE id = :id RETURNING id`, { rate: taxRateBasisPoints, id: studio.id }, transaction);
      await q(
        `UPDATE designs SET parcel_length_mm = height_mm + 2 * :pad, parcel_width_mm = width_mm + 2 * :pad,
                parcel_height_mm = depth_mm + 2 * :pad, parcel_weight_g = weight_g + :packing
          WHERE studio_id = :id AND height_mm IS NOT NULL RETURNING id`,
        { pad: padMm, packing: packingG, id: studio.id },
        transaction,
      );
      for (const [position, zone] of zones.entries()) {
        const [row] = await q(
          `INSERT INTO shipping_zones (studio_id, name, countries, position) VALUES (:studio, :name, ARRAY[:countries]::char(2)[], :position) RETURNING id`,
          { studio: studio.id, name: zone.name, countries: zone.countries, position },
          transaction,
        );
        for (const rate of zone.rates) {
          await q(
            `INSERT INTO shipping_rates (zone_id, label, up_to_grams, amount_minor, min_days, max_days)
             VALUES (:zone, :label, :up_to_grams, :amount_minor, :min_days, :max_days) RETURNING id`,
            { zone: row.id, ...rate },
            transaction,
          );
        }
      }
    });
  },

  async down(queryInterface) {
    await queryInterface.sequelize.query(`DELETE FROM shipping_zones WHERE studio_id IN (SELECT id FROM studios WHERE slug = 'marrowgate')`);
  },
};
