'use strict';

const { people } = require('./support/demo-people.json');

/** The demo studio's makers, its studio hand and two buyers (invented people, reserved e-mail domains). */
module.exports = {
  async up(queryInterface) {
    const now = new Date();
    await queryInterface.bulkInsert(
      'users',
      people.map(({ email, name, role }) => ({ email, name, role, email_verified: now, created_at: now, updated_at: now })),
    );
  },

  async down(queryInterface) {
    await queryInterface.bulkDelete('users', { email: people.map((person) => person.email) });
  },
};
