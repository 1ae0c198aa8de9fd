'use strict';

/**
 * Stock of one finish in one batch. PostgreSQL keeps `quantity = available + held + sold` itself:
 * `available` is generated from the other three, and no counter can go below zero.
 */
module.exports = {
  async up(queryInterface) {
    await queryInterface.sequelize.query(`
      CREATE TABLE batch_stock (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        batch_id uuid NOT NULL REFERENCES batches (id) ON DELETE CASCADE,
        finish_id uuid NOT NULL REFERENCES finishes (id) ON DELETE RESTRICT,
        quantity integer NOT NULL,
        held integer NOT NULL DEFAULT 0,
        sold integer NOT NULL DEFAULT 0,
        available integer GENERATED ALWAYS AS (quantity - held - sold) STORED,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        CONSTRAINT batch_stock_one_row_per_finish UNIQUE (batch_id, finish_id),
        CONSTRAINT batch_stock_quantity_sensible CHECK (quantity BETWEEN 0 AND 10000),
        CONSTRAINT batch_stock_held_not_negative CHECK (held >= 0),
        CONSTRAINT batch_stock_sold_not_negative CHECK (sold >= 0),
        CONSTRAINT batch_stock_available_not_negative CHECK (quantity - held - sold >= 0)
      )
    `);
  },

  async down(queryInterface) {
    await queryInterface.dropTable('batch_stock');
  },
};
