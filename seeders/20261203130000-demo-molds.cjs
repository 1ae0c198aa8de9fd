'use strict';

const { molds, calendar, plannerMoney, upcomingHolidays, DAY } = require('./support/demo-molds.cjs');

/** The demo's molds per published design, and Marrowgate's working calendar and planner money settings. */
module.exports = {
  async up(queryInterface) {
    const q = (sql, replacements, transaction) =>
      queryInterface.sequelize.query(sql, { replacements, transaction, type: queryInterface.sequelize.QueryTypes.SELECT });
    const now = Date.now();
    const day = (daysAgo) => new Date(now - daysAgo * DAY).toISOString().slice(0, 10);

    await queryInterface.sequelize.transaction(async (transaction) => {
      const [studio] = await q(`SELECT id FROM studios WHERE slug = 'marrowgate'`, {}, transaction);
      await q(
        `UPDATE studios SET working_days = ARRAY[:days]::smallint[], working_hours_per_day = :hours,
                holidays = :holidays::date[], planner_defaults = planner_defaults || :money::jsonb
          WHERE id = :id RETURNING id`,
        {
          id: studio.id,
          days: calendar.workingDays,
          hours: calendar.hoursPerDay,
          holidays: `{${upcomingHolidays(new Date(now)).join(',')}}`,
          money: JSON.stringify(plannerMoney),
        },
        transaction,
      );
      for (const [slug, list] of Object.entries(molds)) {
        const [design] = await q(`SELECT id FROM designs WHERE studio_id = :studio AND slug = :slug`, { studio: studio.id, slug }, transaction);
        for (const mold of list) {
          await q(
            `INSERT INTO molds (design_id, label, made_on, pulls_so_far, expected_life_pulls, retired_at, notes)
             VALUES (:design, :label, :madeOn, :pulls, :life, :retiredAt, :notes) RETURNING id`,
            {
              design: design.id,
              label: mold.label,
              madeOn: day(mold.madeDaysAgo),
              pulls: mold.pullsSoFar,
              life: mold.expectedLifePulls,
              retiredAt: mold.retiredDaysAgo === undefined ? null : new Date(now - mold.retiredDaysAgo * DAY),
              notes: mold.notes,
            },
            transaction,
          );
        }
      }
    });
  },

  async down(queryInterface) {
    await queryInterface.sequelize.query(`
      DELETE FROM molds WHERE design_id IN (
        SELECT d.id FROM designs d JOIN studios s ON s.id = d.studio_id WHERE s.slug = 'marrowgate');
      UPDATE studios SET working_days = '{1,2,3,4,5}', working_hours_per_day = 7, holidays = '{}',
             planner_defaults = planner_defaults - ARRAY[${Object.keys(plannerMoney).map((k) => `'${k}'`).join(', ')}]
       WHERE slug = 'marrowgate';
    `);
  },
};
