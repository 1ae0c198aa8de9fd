'use strict';

/**
 * Signed-in sessions, kept in the database rather than in a self-contained cookie, so that signing out,
 * or losing a role, takes effect on the next request everywhere.
 */
module.exports = {
  async up(queryInterface, Sequelize) {
    await queryInterface.createTable('sessions', {
      id: { type: Sequelize.UUID, primaryKey: true, defaultValue: Sequelize.literal('gen_random_uuid()') },
      session_token: { type: Sequelize.TEXT, allowNull: false, unique: true },
      user_id: { type: Sequelize.UUID, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
      expires: { type: Sequelize.DATE, allowNull: false },
      created_at: { type: Sequelize.DATE, allowNull: false, defaultValue: Sequelize.fn('now') },
      updated_at: { type: Sequelize.DATE, allowNull: false, defaultValue: Sequelize.fn('now') },
    });
    await queryInterface.addIndex('sessions', ['user_id'], { name: 'sessions_user' });
  },

  async down(queryInterface) {
    await queryInterface.dropTable('sessions');
  },
};
