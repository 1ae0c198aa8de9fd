'use strict';

/** A finish: a paint treatment offered for one design, with its own price difference and paint hours. */
module.exports = {
  async up(queryInterface, Sequelize) {
    await queryInterface.createTable('finishes', {
      id: { type: Sequelize.UUID, primaryKey: true, defaultValue: Sequelize.literal('gen_random_uuid()') },
      design_id: {
        type: Sequelize.UUID,
        allowNull: false,
        references: { model: 'designs', key: 'id' },
        onDelete: 'CASCADE',
      },
      slug: { type: Sequelize.TEXT, allowNull: false },
      name: { type: Sequelize.TEXT, allowNull: false },
      description: { type: Sequelize.TEXT, allowNull: false, defaultValue: '' },
      price_difference_minor: { type: Sequelize.INTEGER, allowNull: false, defaultValue: 0 },
      paint_hours: { type: Sequelize.DECIMAL(5, 2), allowNull: false, defaultValue: 0 },
      status: { type: Sequelize.TEXT, allowNull: false, defaultValue: 'draft' },
      position: { type: Sequelize.INTEGER, allowNull: false, defaultValue: 0 },
      created_at: { type: Sequelize.DATE, allowNull: false, defaultValue: Sequelize.fn('now') },
      updated_at: { type: Sequelize.DATE, allowNull: false, defaultValue: Sequelize.fn('now') },
    });
    await queryInterface.sequelize.query(`
      ALTER TABLE finishes
        ADD CONSTRAINT finishes_design_slug_unique UNIQUE (design_id, slug),
        ADD CONSTRAINT finishes_slug_format CHECK (slug ~ '^[a-z0-9]+(-[a-z0-9]+)*$'),
        ADD CONSTRAINT finishes_status_known CHECK (status IN ('draft', 'published', 'retired')),
        ADD CONSTRAINT finishes_paint_hours_not_negative CHECK (paint_hours >= 0)
    `);
  },

  async down(queryInterface) {
    await queryInterface.dropTable('finishes');
  },
};
