'use strict';

/**
 * Sign-in links. `token` is the SHA-256 hash next-auth makes of the link's secret, never the secret itself.
 * A used link keeps its row with `used_at`, so that a second click can be told apart from a forged link.
 */
module.exports = {
  async up(queryInterface, Sequelize) {
    await queryInterface.createTable('verification_tokens', {
      identifier: { type: Sequelize.TEXT, allowNull: false, primaryKey: true },
      token: { type: Sequelize.TEXT, allowNull: false, primaryKey: true },
      expires: { type: Sequelize.DATE, allowNull: false },
      used_at: { type: Sequelize.DATE, allowNull: true },
      created_at: { type: Sequelize.DATE, allowNull: false, defaultValue: Sequelize.fn('now') },
    });
    await queryInterface.sequelize.query(`
      ALTER TABLE verification_tokens
        ADD CONSTRAINT verification_tokens_hashed CHECK (token ~ '^[0-9a-f]{64}$')
    `);
    await queryInterface.addIndex('verification_tokens', ['expires'], { name: 'verification_tokens_expires' });
  },

  async down(queryInterface) {
    await queryInterface.dropTable('verification_tokens');
  },
};
