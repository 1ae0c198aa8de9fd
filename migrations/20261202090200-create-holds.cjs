'use strict';

/**
 * Holds: stock set aside for one buyer for a few minutes while they pay. `buyer_allowances` counts what
 * each buyer holds or has bought in a batch; its row is the per-buyer lock, and its CHECK is the limit's
 * last line of defence (the application's conditional upsert is the first).
 */
module.exports = {
  async up(queryInterface) {
    await queryInterface.sequelize.query(`
      CREATE TABLE holds (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        user_id uuid NOT NULL REFERENCES users (id) ON DELETE CASCADE,
        batch_id uuid NOT NULL REFERENCES batches (id) ON DELETE CASCADE,
        batch_stock_id uuid NOT NULL REFERENCES batch_stock (id) ON DELETE CASCADE,
        quantity integer NOT NULL,
        state text NOT NULL DEFAULT 'active',
        reason text,
        expires_at timestamptz NOT NULL,
        ended_at timestamptz,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        CONSTRAINT holds_quantity_sensible CHECK (quantity BETWEEN 1 AND 10),
        CONSTRAINT holds_state_known CHECK (state IN ('active', 'converted', 'released', 'expired')),
        CONSTRAINT holds_ended_when_not_active CHECK ((state = 'active') = (ended_at IS NULL))
      );
      CREATE INDEX holds_active_by_stock ON holds (batch_stock_id, expires_at) WHERE state = 'active';
      CREATE INDEX holds_active_by_user ON holds (user_id, expires_at) WHERE state = 'active';
      CREATE INDEX holds_active_by_expiry ON holds (expires_at) WHERE state = 'active';

      CREATE TABLE buyer_allowances (
        batch_id uuid NOT NULL REFERENCES batches (id) ON DELETE CASCADE,
        user_id uuid NOT NULL REFERENCES users (id) ON DELETE CASCADE,
        taken integer NOT NULL DEFAULT 0,
        per_buyer_limit integer NOT NULL,
        PRIMARY KEY (batch_id, user_id),
        CONSTRAINT buyer_allowances_within_limit CHECK (taken BETWEEN 0 AND per_buyer_limit)
      );

      CREATE TABLE early_access_grants (
        batch_id uuid NOT NULL REFERENCES batches (id) ON DELETE CASCADE,
        user_id uuid NOT NULL REFERENCES users (id) ON DELETE CASCADE,
        granted_at timestamptz NOT NULL DEFAULT now(),
        PRIMARY KEY (batch_id, user_id)
      );
    `);
  },

  async down(queryInterface) {
    await queryInterface.sequelize.query('DROP TABLE early_access_grants; DROP TABLE buyer_allowances; DROP TABLE holds;');
  },
};
