'use strict';

/**
 * Shipping and notes on orders. When an order ships, its carrier's name, the tracking number and the
 * tracking link are kept with it as they were at that moment, so a later change of the carrier's link
 * template does not break the links buyers already have. Notes the studio keeps on an order are rows,
 * each with its author and time, since several people add them over the life of an order. `buyer_note` is
 * what the buyer wrote for the studio, if anything.
 *
 * Orders shipped before this migration carry no carrier or tracking number, so on a database that has
 * such orders the "shipped has carrier and tracking" rule is added without checking the old rows (NOT
 * VALID): it holds for every order shipped from now on.
 */
module.exports = {
  async up(queryInterface) {
    await queryInterface.sequelize.transaction(async (transaction) => {
      await queryInterface.sequelize.query(
        `
        ALTER TABLE orders
          ADD COLUMN carrier_name text,
          ADD COLUMN tracking_number text,
          ADD COLUMN tracking_url text,
          ADD COLUMN shipped_at timestamptz,
          ADD COLUMN buyer_note text,
          ADD CONSTRAINT orders_tracking_number_printable CHECK (tracking_number IS NULL OR tracking_number ~ '^[A-Za-z0-9][A-Za-z0-9 -]{0,39}$'),
          ADD CONSTRAINT orders_tracking_url_https CHECK (tracking_url IS NULL OR (tracking_url ~ '^https://' AND length(tracking_url) <= 600)),
          ADD CONSTRAINT orders_carrier_named CHECK (carrier_name IS NULL OR length(btrim(carrier_name)) BETWEEN 1 AND 60),
          ADD CONSTRAINT orders_buyer_note_short CHECK (buyer_note IS NULL OR length(buyer_note) <= 1000);

        CREATE TABLE order_notes (
          id bigserial PRIMARY KEY,
          order_id uuid NOT NULL REFERENCES orders (id) ON DELETE CASCADE,
          author_user_id uuid REFERENCES users (id) ON DELETE SET NULL,
          author_label text NOT NULL,
          body text NOT NULL,
          created_at timestamptz NOT NULL DEFAULT now(),
          CONSTRAINT order_notes_body_sensible CHECK (length(btrim(body)) BETWEEN 1 AND 2000),
          CONSTRAINT order_notes_author_labelled CHECK (length(author_label) BETWEEN 1 AND 200)
        );
        CREATE INDEX order_notes_by_order ON order_notes (order_id, id);
        `,
        { transaction },
      );
      const [[legacy]] = await queryInterface.sequelize.query(
        `SELECT count(*)::int AS n FROM orders WHERE state = 'shipped' AND (carrier_name IS NULL OR tracking_number IS NULL OR shipped_at IS NULL)`,
        { transaction },
      );
      await queryInterface.sequelize.query(
        `ALTER TABLE orders ADD CONSTRAINT orders_shipped_has_tracking
           CHECK (state <> 'shipped' OR (carrier_name IS NOT NULL AND tracking_number IS NOT NULL AND shipped_at IS NOT NULL))
           ${legacy.n > 0 ? 'NOT VALID' : ''}`,
        { transaction },
      );
    });
  },

  async down(queryInterface) {
    await queryInterface.sequelize.query(`
      DROP TABLE order_notes;
      ALTER TABLE orders
        DROP CONSTRAINT orders_shipped_has_tracking,
        DROP COLUMN buyer_note, DROP COLUMN shipped_at, DROP COLUMN tracking_url, DROP COLUMN tracking_number, DROP COLUMN carrier_name;
    `);
  },
};
