'use strict';

/** A studio: the maker's business, with the zone its drop times are planned in and its currency. */
module.exports = {
  async up(queryInterface, Sequelize) {
    await queryInterface.createTable('studios', {
      id: { type: Sequelize.UUID, primaryKey: true, defaultValue: Sequelize.literal('gen_random_uuid()') },
      slug: { type: Sequelize.TEXT, allowNull: false, unique: true },
      name: { type: Sequelize.TEXT, allowNull: false },
      time_zone: { type: Sequelize.TEXT, allowNull: false },
      currency: { type: Sequelize.CHAR(3), allowNull: false },
      country: { type: Sequelize.CHAR(2), allowNull: false },
      created_at: { type: Sequelize.DATE, allowNull: false, defaultValue: Sequelize.fn('now') },
      updated_at: { type: Sequelize.DATE, allowNull: false, defaultValue: Sequelize.fn('now') },
    });
    await queryInterface.sequelize.query(`
      ALTER TABLE studios
        ADD CONSTRAINT studios_slug_format CHECK (slug ~ '^[a-z0-9]+(-[a-z0-9]+)*$'),
        ADD CONSTRAINT studios_currency_format CHECK (currency ~ '^[A-Z]{3}$'),
        ADD CONSTRAINT studios_country_format CHECK (country ~ '^[A-Z]{2}$'),
        ADD CONSTRAINT studios_name_present CHECK (length(trim(name)) > 0)
    `);
  },

  async down(queryInterface) {
    await queryInterface.dropTable('studios');
  },
};
