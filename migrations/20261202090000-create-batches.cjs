'use strict';

/**
 * A batch: a planned run of one design, sold in one drop. The drop's phase (upcoming, early access, open,
 * sold out, closed) is never stored: it follows from these times, the database's clock and the stock.
 */
module.exports = {
  async up(queryInterface, Sequelize) {
    await queryInterface.createTable('batches', {
      id: { type: Sequelize.UUID, primaryKey: true, defaultValue: Sequelize.literal('gen_random_uuid()') },
      design_id: { type: Sequelize.UUID, allowNull: false, references: { model: 'designs', key: 'id' }, onDelete: 'RESTRICT' },
      name: { type: Sequelize.TEXT, allowNull: false },
      status: { type: Sequelize.TEXT, allowNull: false, defaultValue: 'draft' },
      per_buyer_limit: { type: Sequelize.INTEGER, allowNull: false, defaultValue: 1 },
      hold_minutes: { type: Sequelize.INTEGER, allowNull: false, defaultValue: 10 },
      early_access_at: { type: Sequelize.DATE, allowNull: true },
      opens_at: { type: Sequelize.DATE, allowNull: false },
      closes_at: { type: Sequelize.DATE, allowNull: false },
      ship_by: { type: Sequelize.DATEONLY, allowNull: false },
      created_at: { type: Sequelize.DATE, allowNull: false, defaultValue: Sequelize.fn('now') },
      updated_at: { type: Sequelize.DATE, allowNull: false, defaultValue: Sequelize.fn('now') },
    });
    await queryInterface.sequelize.query(`
      ALTER TABLE batches
        ADD CONSTRAINT batches_status_known CHECK (status IN ('draft', 'scheduled', 'cancelled')),
        ADD CONSTRAINT batches_limit_sensible CHECK (per_buyer_limit BETWEEN 1 AND 10),
        ADD CONSTRAINT batches_hold_minutes_sensible CHECK (hold_minutes BETWEEN 1 AND 60),
        ADD CONSTRAINT batches_times_in_order CHECK (
          (early_access_at IS NULL OR early_access_at < opens_at) AND opens_at < closes_at),
        ADD CONSTRAINT batches_name_present CHECK (length(btrim(name)) > 0)
    `);
    await queryInterface.addIndex('batches', ['design_id', 'opens_at'], { name: 'batches_design_opens' });
    await queryInterface.addIndex('batches', ['status', 'opens_at'], { name: 'batches_status_opens' });
  },

  async down(queryInterface) {
    await queryInterface.dropTable('batches');
  },
};
