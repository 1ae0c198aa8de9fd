'use strict';

/** A batch's own words for its drop page and announcement, and the ship-by date its plan computed. */
module.exports = {
  async up(queryInterface) {
    await queryInterface.sequelize.query(`
      ALTER TABLE batches
        ADD COLUMN announcement text NOT NULL DEFAULT '',
        ADD COLUMN planned_ship_by date,
        ADD COLUMN cancelled_at timestamptz,
        ADD CONSTRAINT batches_announcement_sensible CHECK (length(announcement) <= 4000),
        ADD CONSTRAINT batches_cancelled_has_time CHECK ((status = 'cancelled') = (cancelled_at IS NOT NULL));
      ALTER TABLE photos ADD COLUMN batch_id uuid REFERENCES batches (id) ON DELETE CASCADE;
      CREATE INDEX photos_batch ON photos (batch_id, position) WHERE batch_id IS NOT NULL;
    `);
  },

  async down(queryInterface) {
    await queryInterface.sequelize.query(`
      ALTER TABLE photos DROP COLUMN batch_id;
      ALTER TABLE batches DROP CONSTRAINT batches_cancelled_has_time, DROP CONSTRAINT batches_announcement_sensible,
        DROP COLUMN announcement, DROP COLUMN planned_ship_by, DROP COLUMN cancelled_at;
    `);
  },
};
