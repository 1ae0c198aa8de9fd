'use strict';

/**
 * What checkout needs from the studio: the tax its prices include, the courier's volumetric divisor,
 * the parcel each design ships in, and shipping zones with their rates by chargeable weight.
 */
module.exports = {
  async up(queryInterface) {
    await queryInterface.sequelize.query(`
      ALTER TABLE studios
        ADD COLUMN tax_label text NOT NULL DEFAULT 'VAT',
        ADD COLUMN tax_rate_bp integer NOT NULL DEFAULT 0,
        ADD COLUMN volumetric_divisor integer NOT NULL DEFAULT 5000,
        ADD CONSTRAINT studios_tax_rate_sensible CHECK (tax_rate_bp BETWEEN 0 AND 10000),
        ADD CONSTRAINT studios_divisor_sensible CHECK (volumetric_divisor BETWEEN 1000 and 10000);

      ALTER TABLE designs
        ADD COLUMN parcel_length_mm integer,
        ADD COLUMN parcel_width_mm integer,
        ADD COLUMN parcel_height_mm integer,
        ADD COLUMN parcel_weight_g integer,
        ADD CONSTRAINT designs_parcel_sensible CHECK (
          (parcel_length_mm IS NULL OR parcel_length_mm BETWEEN 10 AND 3000) AND
          (parcel_width_mm IS NULL OR parcel_width_mm BETWEEN 10 AND 3000) AND
          (parcel_height_mm IS NULL OR parcel_height_mm BETWEEN 10 AND 3000) AND
          (parcel_weight_g IS NULL OR parcel_weight_g BETWEEN 1 AND 70000));

      CREATE TABLE shipping_zones (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        studio_id uuid NOT NULL REFERENCES studios (id) ON DELETE CASCADE,
        name text NOT NULL,
        countries char(2)[] NOT NULL,
        position integer NOT NULL DEFAULT 0,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        CONSTRAINT shipping_zones_named CHECK (length(btrim(name)) > 0),
        CONSTRAINT shipping_zones_have_countries CHECK (cardinality(countries) > 0)
      );
      CREATE INDEX shipping_zones_by_studio ON shipping_zones (studio_id, position);

      CREATE TABLE shipping_rates (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        zone_id uuid NOT NULL REFERENCES shipping_zones (id) ON DELETE CASCADE,
        label text NOT NULL,
        up_to_grams integer NOT NULL,
        amount_minor integer NOT NULL,
        min_days integer NOT NULL,
        max_days integer NOT NULL,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        CONSTRAINT shipping_rates_labelled CHECK (length(btrim(label)) > 0),
        CONSTRAINT shipping_rates_weight_sensible CHECK (up_to_grams BETWEEN 1 AND 70000),
        CONSTRAINT shipping_rates_amount_sensible CHECK (amount_minor >= 0),
        CONSTRAINT shipping_rates_days_in_order CHECK (min_days >= 0 AND max_days >= min_days)
      );
      CREATE INDEX shipping_rates_by_zone ON shipping_rates (zone_id);
    `);
  },

  async down(queryInterface) {
    await queryInterface.sequelize.query(`
      DROP TABLE shipping_rates; DROP TABLE shipping_zones;
      ALTER TABLE designs DROP COLUMN parcel_length_mm, DROP COLUMN parcel_width_mm, DROP COLUMN parcel_height_mm, DROP COLUMN parcel_weight_g;
      ALTER TABLE studios DROP COLUMN tax_label, DROP COLUMN tax_rate_bp, DROP COLUMN volumetric_divisor;
    `);
  },
};
