'use strict';

/**
 * Counters for rate-limiter-flexible's PostgreSQL store, shared by every app instance. The columns are
 * the ones that library reads and writes; it is told the table exists, so it never creates one itself.
 */
module.exports = {
  async up(queryInterface, Sequelize) {
    await queryInterface.createTable('rate_limits', {
      key: { type: Sequelize.STRING(255), primaryKey: true },
      points: { type: Sequelize.INTEGER, allowNull: false, defaultValue: 0 },
      expire: { type: Sequelize.BIGINT, allowNull: true },
    });
  },

  async down(queryInterface) {
    await queryInterface.dropTable('rate_limits');
  },
};
