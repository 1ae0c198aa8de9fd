'use strict';

/**
 * A photo of a design, optionally of one finish. `src` is a path the app serves; width and height are
 * the largest rendition's, so pages can reserve the space before the image arrives.
 */
module.exports = {
  async up(queryInterface, Sequelize) {
    await queryInterface.createTable('photos', {
      id: { type: Sequelize.UUID, primaryKey: true, defaultValue: Sequelize.literal('gen_random_uuid()') },
      design_id: {
        type: Sequelize.UUID,
        allowNull: false,
        references: { model: 'designs', key: 'id' },
        onDelete: 'CASCADE',
      },
      finish_id: {
        type: Sequelize.UUID,
        allowNull: true,
        references: { model: 'finishes', key: 'id' },
        onDelete: 'CASCADE',
      },
      src: { type: Sequelize.TEXT, allowNull: false },
      alt: { type: Sequelize.TEXT, allowNull: false },
      width: { type: Sequelize.INTEGER, allowNull: false },
      height: { type: Sequelize.INTEGER, allowNull: false },
      position: { type: Sequelize.INTEGER, allowNull: false, defaultValue: 0 },
      created_at: { type: Sequelize.DATE, allowNull: false, defaultValue: Sequelize.fn('now') },
      updated_at: { type: Sequelize.DATE, allowNull: false, defaultValue: Sequelize.fn('now') },
    });
    await queryInterface.sequelize.query(`
      ALTER TABLE photos
        ADD CONSTRAINT photos_alt_present CHECK (length(trim(alt)) > 0),
        ADD CONSTRAINT photos_size_positive CHECK (width > 0 AND height > 0),
        ADD CONSTRAINT photos_src_local CHECK (src ~ '^/[A-Za-z0-9/_.-]+$')
    `);
    await queryInterface.addIndex('photos', ['design_id', 'position'], { name: 'photos_design_position' });
  },

  async down(queryInterface) {
    await queryInterface.dropTable('photos');
  },
};
