'use strict';

/** Eye openings, for the fit table: how wide each opening is and how far apart their centres are. */
module.exports = {
  async up(queryInterface, Sequelize) {
    await queryInterface.addColumn('designs', 'eye_opening_width_mm', { type: Sequelize.INTEGER, allowNull: true });
    await queryInterface.addColumn('designs', 'eye_spacing_mm', { type: Sequelize.INTEGER, allowNull: true });
    await queryInterface.sequelize.query(`
      ALTER TABLE designs ADD CONSTRAINT designs_eye_measures_positive
        CHECK (coalesce(eye_opening_width_mm, 1) > 0 AND coalesce(eye_spacing_mm, 1) > 0)
    `);
  },

  async down(queryInterface) {
    await queryInterface.removeConstraint('designs', 'designs_eye_measures_positive');
    await queryInterface.removeColumn('designs', 'eye_spacing_mm');
    await queryInterface.removeColumn('designs', 'eye_opening_width_mm');
  },
};
