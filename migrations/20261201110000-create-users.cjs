'use strict';

/**
 * People who sign in: buyers (`customer`), studio hands (`staff`) and makers (`owner`). E-mail addresses
 * are stored normalised (see lib/auth/email-address.ts), so one unique key finds a person however they
 * typed it.
 */
module.exports = {
  async up(queryInterface, Sequelize) {
    await queryInterface.createTable('users', {
      id: { type: Sequelize.UUID, primaryKey: true, defaultValue: Sequelize.literal('gen_random_uuid()') },
      name: { type: Sequelize.TEXT, allowNull: true },
      email: { type: Sequelize.TEXT, allowNull: false, unique: true },
      email_verified: { type: Sequelize.DATE, allowNull: true },
      image: { type: Sequelize.TEXT, allowNull: true },
      role: { type: Sequelize.TEXT, allowNull: false, defaultValue: 'customer' },
      created_at: { type: Sequelize.DATE, allowNull: false, defaultValue: Sequelize.fn('now') },
      updated_at: { type: Sequelize.DATE, allowNull: false, defaultValue: Sequelize.fn('now') },
    });
    await queryInterface.sequelize.query(`
      ALTER TABLE users
        ADD CONSTRAINT users_role_known CHECK (role IN ('owner', 'staff', 'customer')),
        ADD CONSTRAINT users_email_normalised CHECK (email = lower(btrim(email)) AND email LIKE '%_@_%'),
        ADD CONSTRAINT users_name_length CHECK (name IS NULL OR length(name) BETWEEN 1 AND 120)
    `);
    await queryInterface.addIndex('users', ['role'], { name: 'users_role', where: { role: ['owner', 'staff'] } });
  },

  async down(queryInterface) {
    await queryInterface.dropTable('users');
  },
};
