'use strict';

/** A design: one original sculpt, sold in batches. Prices are integer minor units of `currency`. */
module.exports = {
  async up(queryInterface, Sequelize) {
    await queryInterface.createTable('designs', {
      id: { type: Sequelize.UUID, primaryKey: true, defaultValue: Sequelize.literal('gen_random_uuid()') },
      studio_id: {
        type: Sequelize.UUID,
        allowNull: false,
        references: { model: 'studios', key: 'id' },
        onDelete: 'CASCADE',
      },
      slug: { type: Sequelize.TEXT, allowNull: false },
      name: { type: Sequelize.TEXT, allowNull: false },
      summary: { type: Sequelize.TEXT, allowNull: false, defaultValue: '' },
      story: { type: Sequelize.TEXT, allowNull: false, defaultValue: '' },
      base_price_minor: { type: Sequelize.INTEGER, allowNull: false },
      currency: { type: Sequelize.CHAR(3), allowNull: false },
      status: { type: Sequelize.TEXT, allowNull: false, defaultValue: 'draft' },
      width_mm: { type: Sequelize.INTEGER, allowNull: true },
      height_mm: { type: Sequelize.INTEGER, allowNull: true },
      depth_mm: { type: Sequelize.INTEGER, allowNull: true },
      weight_g: { type: Sequelize.INTEGER, allowNull: true },
      materials: { type: Sequelize.TEXT, allowNull: false, defaultValue: '' },
      care: { type: Sequelize.TEXT, allowNull: false, defaultValue: '' },
      position: { type: Sequelize.INTEGER, allowNull: false, defaultValue: 0 },
      published_at: { type: Sequelize.DATE, allowNull: true },
      created_at: { type: Sequelize.DATE, allowNull: false, defaultValue: Sequelize.fn('now') },
      updated_at: { type: Sequelize.DATE, allowNull: false, defaultValue: Sequelize.fn('now') },
    });
    await queryInterface.sequelize.query(`
      ALTER TABLE designs
        ADD CONSTRAINT designs_studio_slug_unique UNIQUE (studio_id, slug),
        ADD CONSTRAINT designs_slug_format CHECK (slug ~ '^[a-z0-9]+(-[a-z0-9]+)*$'),
        ADD CONSTRAINT designs_status_known CHECK (status IN ('draft', 'published', 'retired')),
        ADD CONSTRAINT designs_price_not_negative CHECK (base_price_minor >= 0),
        ADD CONSTRAINT designs_currency_format CHECK (currency ~ '^[A-Z]{3}$'),
        ADD CONSTRAINT designs_measures_positive CHECK (
          coalesce(width_mm, 1) > 0 AND coalesce(height_mm, 1) > 0 AND
          coalesce(depth_mm, 1) > 0 AND coalesce(weight_g, 1) > 0),
        ADD CONSTRAINT designs_published_has_date CHECK (status <> 'published' OR published_at IS NOT NULL)
    `);
    await queryInterface.addIndex('designs', ['studio_id', 'status', 'position'], {
      name: 'designs_studio_status_position',
    });
  },

  async down(queryInterface) {
    await queryInterface.dropTable('designs');
  },
};
