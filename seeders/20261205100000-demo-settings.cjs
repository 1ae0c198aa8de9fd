'use strict';

const { contact, carriers, parcelSizes, customs } = require('./support/demo-settings.cjs');

/** The demo studio's contact details, carriers with their tracking links, boxes and customs defaults. */
module.exports = {
  async up(queryInterface) {
    const q = (sql, replacements, transaction) =>
      queryInterface.sequelize.query(sql, { replacements, transaction, type: queryInterface.sequelize.QueryTypes.SELECT });
    await queryInterface.sequelize.transaction(async (transaction) => {
      const [studio] = await q(`SELECT id FROM studios WHERE slug = 'marrowgate'`, {}, transaction);
      await q(
        `UPDATE studios SET contact_email = :contact_email, postal_address = :postal_address,
                customs_area = ARRAY[:customs_area]::char(2)[], customs_hs_code = :customs_hs_code,
                customs_description = :customs_description, customs_origin_country = :customs_origin_country
          WHERE id = :id RETURNING id`,
        { ...contact, ...customs, id: studio.id },
        transaction,
      );
      for (const [position, carrier] of carriers.entries()) {
        await q(
          `INSERT INTO carriers (studio_id, name, tracking_url_template, position) VALUES (:studio, :name, :tracking_url_template, :position) RETURNING id`,
          { studio: studio.id, ...carrier, position },
          transaction,
        );
      }
      for (const [position, box] of parcelSizes.entries()) {
        await q(
          `INSERT INTO parcel_sizes (studio_id, name, length_mm, width_mm, height_mm, empty_weight_g, position)
           VALUES (:studio, :name, :length_mm, :width_mm, :height_mm, :empty_weight_g, :position) RETURNING id`,
          { studio: studio.id, ...box, position },
          transaction,
        );
      }
    });
  },

  async down(queryInterface) {
    await queryInterface.sequelize.query(`
      DELETE FROM carriers WHERE studio_id IN (SELECT id FROM studios WHERE slug = 'marrowgate');
      DELETE FROM parcel_sizes WHERE studio_id IN (SELECT id FROM studios WHERE slug = 'marrowgate');
    `);
  },
};
