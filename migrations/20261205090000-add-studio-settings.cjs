'use strict';

/**
 * The studio's settings beyond checkout and the planner: the contact details its e-mails carry, the
 * carriers it ships with (each with the link that tracks a parcel), the boxes it packs in, and what a
 * customs declaration needs for parcels leaving its customs area. The HS code is the studio's own choice:
 * none is assumed here.
 */
module.exports = {
  async up(queryInterface) {
    await queryInterface.sequelize.query(`
      ALTER TABLE studios
        ADD COLUMN contact_email text,
        ADD COLUMN postal_address text NOT NULL DEFAULT '',
        ADD COLUMN customs_area char(2)[] NOT NULL DEFAULT '{}',
        ADD COLUMN customs_hs_code text,
        ADD COLUMN customs_description text NOT NULL DEFAULT '',
        ADD COLUMN customs_origin_country char(2),
        ADD CONSTRAINT studios_contact_email_shape CHECK (contact_email IS NULL OR contact_email ~ '^[^@\\s]+@[^@\\s]+$'),
        ADD CONSTRAINT studios_postal_address_short CHECK (length(postal_address) <= 500),
        ADD CONSTRAINT studios_customs_area_codes CHECK (array_position(customs_area, NULL) IS NULL),
        ADD CONSTRAINT studios_hs_code_digits CHECK (customs_hs_code IS NULL OR customs_hs_code ~ '^[0-9]{6}([0-9]{2}){0,2}$'),
        ADD CONSTRAINT studios_customs_description_short CHECK (length(customs_description) <= 200),
        ADD CONSTRAINT studios_customs_origin_format CHECK (customs_origin_country IS NULL OR customs_origin_country ~ '^[A-Z]{2}$');

      CREATE TABLE carriers (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        studio_id uuid NOT NULL REFERENCES studios (id) ON DELETE CASCADE,
        name text NOT NULL,
        tracking_url_template text NOT NULL,
        position integer NOT NULL DEFAULT 0,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        CONSTRAINT carriers_studio_name_unique UNIQUE (studio_id, name),
        CONSTRAINT carriers_named CHECK (length(btrim(name)) BETWEEN 1 AND 60),
        CONSTRAINT carriers_template_https CHECK (tracking_url_template ~ '^https://' AND position('{tracking}' IN tracking_url_template) > 0),
        CONSTRAINT carriers_template_short CHECK (length(tracking_url_template) <= 500)
      );
      CREATE INDEX carriers_by_studio ON carriers (studio_id, position);

      CREATE TABLE parcel_sizes (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        studio_id uuid NOT NULL REFERENCES studios (id) ON DELETE CASCADE,
        name text NOT NULL,
        length_mm integer NOT NULL,
        width_mm integer NOT NULL,
        height_mm integer NOT NULL,
        empty_weight_g integer NOT NULL,
        position integer NOT NULL DEFAULT 0,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        CONSTRAINT parcel_sizes_studio_name_unique UNIQUE (studio_id, name),
        CONSTRAINT parcel_sizes_named CHECK (length(btrim(name)) BETWEEN 1 AND 60),
        CONSTRAINT parcel_sizes_sensible CHECK (length_mm BETWEEN 10 AND 3000 AND width_mm BETWEEN 10 AND 3000
          AND height_mm BETWEEN 10 AND 3000 AND empty_weight_g BETWEEN 0 AND 70000)
      );
      CREATE INDEX parcel_sizes_by_studio ON parcel_sizes (studio_id, position);

      CREATE INDEX orders_by_created ON orders (created_at DESC, id DESC);
    `);
  },

  async down(queryInterface) {
    await queryInterface.sequelize.query(`
      DROP INDEX orders_by_created;
      DROP TABLE parcel_sizes;
      DROP TABLE carriers;
      ALTER TABLE studios
        DROP COLUMN customs_origin_country, DROP COLUMN customs_description, DROP COLUMN customs_hs_code,
        DROP COLUMN customs_area, DROP COLUMN postal_address, DROP COLUMN contact_email;
    `);
  },
};
