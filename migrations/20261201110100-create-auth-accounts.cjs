'use strict';

/** Sign-in accounts linked to a user (kept for next-auth's providers that link one, such as OAuth). */
module.exports = {
  async up(queryInterface, Sequelize) {
    await queryInterface.createTable('accounts', {
      id: { type: Sequelize.UUID, primaryKey: true, defaultValue: Sequelize.literal('gen_random_uuid()') },
      user_id: { type: Sequelize.UUID, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
      type: { type: Sequelize.TEXT, allowNull: false },
      provider: { type: Sequelize.TEXT, allowNull: false },
      provider_account_id: { type: Sequelize.TEXT, allowNull: false },
      refresh_token: { type: Sequelize.TEXT, allowNull: true },
      access_token: { type: Sequelize.TEXT, allowNull: true },
      expires_at: { type: Sequelize.INTEGER, allowNull: true },
      token_type: { type: Sequelize.TEXT, allowNull: true },
      scope: { type: Sequelize.TEXT, allowNull: true },
      id_token: { type: Sequelize.TEXT, allowNull: true },
      session_state: { type: Sequelize.TEXT, allowNull: true },
      created_at: { type: Sequelize.DATE, allowNull: false, defaultValue: Sequelize.fn('now') },
      updated_at: { type: Sequelize.DATE, allowNull: false, defaultValue: Sequelize.fn('now') },
    });
    await queryInterface.addConstraint('accounts', {
      type: 'unique',
      fields: ['provider', 'provider_account_id'],
      name: 'accounts_provider_account_unique',
    });
    await queryInterface.addIndex('accounts', ['user_id'], { name: 'accounts_user' });
  },

  async down(queryInterface) {
    await queryInterface.dropTable('accounts');
  },
};
