'use strict';

// The planner's rules of thumb, stored per studio so the maker can change them. Every value here is common
// practice or a figure recalled from memory (see lib/planner/defaults.ts, which keeps the same values and
// says where each comes from); tests/unit/planner-inputs.test.ts checks that the two agree.
// A frozen copy on purpose, not an import: a migration must not change when the app's code does.
const plannerDefaults = {
  pullsPerMoldPerDay: 3,
  failedPullsPercent: 10,
  trimMinutesPerPull: 20,
  painterHoursPerDay: 6,
  packingMinutesPerOrder: 20,
  handlingDays: 2,
  newMoldLifePulls: 40,
  siliconeCoats: 5,
  coatCureHours: 1,
  jacketHalves: 2,
  jacketLayersPerHalf: 3,
  jacketLayerHours: 1.5,
  wallThicknessMm: 3,
  resinDensityGPerCm3: 1.1,
  wastePercent: 15,
};

/**
 * Molds: each silicone mold with its jacket, one design's, its life counted in pulls. And the studio's
 * working calendar (ISO weekdays it works, hours a day, its holidays) with the planner's rules of thumb.
 */
module.exports = {
  plannerDefaults,

  async up(queryInterface) {
    await queryInterface.sequelize.query(`
      CREATE TABLE molds (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        design_id uuid NOT NULL REFERENCES designs (id) ON DELETE CASCADE,
        label text NOT NULL,
        made_on date NOT NULL,
        pulls_so_far integer NOT NULL DEFAULT 0,
        expected_life_pulls integer NOT NULL,
        retired_at timestamptz,
        notes text NOT NULL DEFAULT '',
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        CONSTRAINT molds_design_label_unique UNIQUE (design_id, label),
        CONSTRAINT molds_label_present CHECK (length(btrim(label)) BETWEEN 1 AND 60),
        CONSTRAINT molds_pulls_not_negative CHECK (pulls_so_far >= 0),
        CONSTRAINT molds_life_positive CHECK (expected_life_pulls > 0 AND expected_life_pulls <= 10000),
        CONSTRAINT molds_made_on_sensible CHECK (made_on >= DATE '2000-01-01'),
        CONSTRAINT molds_notes_short CHECK (length(notes) <= 2000)
      );
      CREATE INDEX molds_by_design ON molds (design_id, retired_at, made_on);

      ALTER TABLE studios
        ADD COLUMN working_days smallint[] NOT NULL DEFAULT '{1,2,3,4,5}',
        ADD COLUMN working_hours_per_day numeric(4, 2) NOT NULL DEFAULT 7,
        ADD COLUMN holidays date[] NOT NULL DEFAULT '{}',
        ADD COLUMN planner_defaults jsonb NOT NULL DEFAULT '${JSON.stringify(plannerDefaults)}'::jsonb,
        ADD CONSTRAINT studios_working_days_iso CHECK (
          cardinality(working_days) BETWEEN 1 AND 7 AND working_days <@ '{1,2,3,4,5,6,7}'::smallint[]),
        ADD CONSTRAINT studios_working_hours_sensible CHECK (working_hours_per_day > 0 AND working_hours_per_day <= 24),
        ADD CONSTRAINT studios_holidays_not_null CHECK (array_position(holidays, NULL) IS NULL),
        ADD CONSTRAINT studios_planner_defaults_object CHECK (jsonb_typeof(planner_defaults) = 'object');
    `);
  },

  async down(queryInterface) {
    await queryInterface.sequelize.query(`
      ALTER TABLE studios
        DROP CONSTRAINT studios_planner_defaults_object,
        DROP CONSTRAINT studios_holidays_not_null,
        DROP CONSTRAINT studios_working_hours_sensible,
        DROP CONSTRAINT studios_working_days_iso,
        DROP COLUMN planner_defaults,
        DROP COLUMN holidays,
        DROP COLUMN working_hours_per_day,
        DROP COLUMN working_days;
      DROP TABLE molds;
    `);
  },
};
