'use strict';

/**
 * Orders and what happens to them. An order is made, awaiting payment, when a buyer starts checkout from
 * a hold; it is paid only when the payment provider says so. Each line is one mask, so each can be
 * oversold, refunded or (later) moved through production on its own. Every change of state is an event.
 * Payment events are recorded by their id once, so a repeated delivery changes nothing twice.
 */
module.exports = {
  async up(queryInterface) {
    await queryInterface.sequelize.query(`
      CREATE SEQUENCE order_number_seq START 1001;

      CREATE TABLE orders (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        number text NOT NULL UNIQUE DEFAULT ('DM-' || nextval('order_number_seq')),
        studio_id uuid NOT NULL REFERENCES studios (id) ON DELETE RESTRICT,
        batch_id uuid NOT NULL REFERENCES batches (id) ON DELETE RESTRICT,
        user_id uuid REFERENCES users (id) ON DELETE SET NULL,
        hold_id uuid UNIQUE REFERENCES holds (id) ON DELETE SET NULL,
        state text NOT NULL DEFAULT 'awaiting_payment',
        email text NOT NULL,
        buyer_name text,
        currency char(3) NOT NULL,
        lines_minor integer NOT NULL,
        shipping_minor integer NOT NULL,
        total_minor integer NOT NULL,
        tax_label text NOT NULL,
        tax_rate_bp integer NOT NULL,
        tax_included_minor integer NOT NULL,
        shipping_country char(2) NOT NULL,
        shipping_rate_id uuid,
        shipping_label text NOT NULL,
        shipping_min_days integer NOT NULL,
        shipping_max_days integer NOT NULL,
        chargeable_weight_g integer NOT NULL,
        ship_to jsonb,
        checkout_round integer NOT NULL DEFAULT 1,
        round_started_at timestamptz NOT NULL DEFAULT now(),
        payment_intent_id text UNIQUE,
        paid_minor integer NOT NULL DEFAULT 0,
        refunded_minor integer NOT NULL DEFAULT 0,
        paid_at timestamptz,
        cancelled_at timestamptz,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        CONSTRAINT orders_state_known CHECK (state IN
          ('awaiting_payment', 'paid', 'in_production', 'shipped', 'partly_refunded', 'refunded', 'cancelled')),
        CONSTRAINT orders_amounts_sensible CHECK (lines_minor >= 0 AND shipping_minor >= 0
          AND total_minor = lines_minor + shipping_minor AND tax_included_minor BETWEEN 0 AND total_minor),
        CONSTRAINT orders_refund_within_payment CHECK (paid_minor >= 0 AND refunded_minor BETWEEN 0 AND paid_minor),
        CONSTRAINT orders_paid_has_time CHECK ((paid_at IS NULL) = (state IN ('awaiting_payment', 'cancelled') AND paid_minor = 0))
      );
      CREATE INDEX orders_by_user ON orders (user_id, created_at DESC);
      CREATE INDEX orders_by_batch ON orders (batch_id, state);
      CREATE INDEX orders_awaiting ON orders (created_at) WHERE state = 'awaiting_payment';

      CREATE TABLE order_lines (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        order_id uuid NOT NULL REFERENCES orders (id) ON DELETE CASCADE,
        position integer NOT NULL,
        batch_stock_id uuid NOT NULL REFERENCES batch_stock (id) ON DELETE RESTRICT,
        design_name text NOT NULL,
        finish_name text NOT NULL,
        unit_price_minor integer NOT NULL,
        counted_in_stock boolean NOT NULL DEFAULT false,
        oversold boolean NOT NULL DEFAULT false,
        oversold_reason text,
        oversold_resolution text,
        refunded boolean NOT NULL DEFAULT false,
        restocked boolean NOT NULL DEFAULT false,
        stage text NOT NULL DEFAULT 'to_cast',
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        UNIQUE (order_id, position),
        CONSTRAINT order_lines_price_sensible CHECK (unit_price_minor >= 0),
        CONSTRAINT order_lines_oversold_reason CHECK (
          (oversold AND oversold_reason IS NOT NULL AND oversold_reason IN ('stock_gone', 'over_buyer_limit')) OR (NOT oversold AND oversold_reason IS NULL)),
        CONSTRAINT order_lines_resolution_known CHECK (oversold_resolution IS NULL OR
          (oversold AND oversold_resolution IN ('refunded', 'extra_cast'))),
        CONSTRAINT order_lines_oversold_not_in_stock CHECK (NOT (oversold AND oversold_resolution IS DISTINCT FROM 'extra_cast' AND counted_in_stock)),
        CONSTRAINT order_lines_stage_known CHECK (stage IN
          ('to_cast', 'cast', 'trimmed', 'painted', 'packed', 'shipped', 'failed_casting', 'failed_paint'))
      );
      CREATE INDEX order_lines_oversold_open ON order_lines (created_at) WHERE oversold AND oversold_resolution IS NULL;

      CREATE TABLE order_events (
        id bigserial PRIMARY KEY,
        order_id uuid NOT NULL REFERENCES orders (id) ON DELETE CASCADE,
        type text NOT NULL,
        from_state text,
        to_state text,
        actor_user_id uuid REFERENCES users (id) ON DELETE SET NULL,
        data jsonb NOT NULL DEFAULT '{}',
        created_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE INDEX order_events_by_order ON order_events (order_id, id);

      CREATE TABLE checkout_sessions (
        id text PRIMARY KEY,
        order_id uuid NOT NULL REFERENCES orders (id) ON DELETE CASCADE,
        round integer NOT NULL,
        status text NOT NULL DEFAULT 'open',
        url text,
        expires_at timestamptz NOT NULL,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        UNIQUE (order_id, round),
        CONSTRAINT checkout_sessions_status_known CHECK (status IN ('open', 'complete', 'expired'))
      );
      CREATE INDEX checkout_sessions_open ON checkout_sessions (order_id) WHERE status = 'open';

      CREATE TABLE payment_events (
        id text PRIMARY KEY,
        type text NOT NULL,
        object_id text,
        outcome text NOT NULL,
        note text,
        stripe_created_at timestamptz NOT NULL,
        received_at timestamptz NOT NULL DEFAULT now()
      );

      CREATE TABLE refunds (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        order_id uuid REFERENCES orders (id) ON DELETE RESTRICT,
        payment_intent_id text NOT NULL,
        stripe_refund_id text UNIQUE,
        amount_minor integer NOT NULL,
        currency char(3) NOT NULL,
        reason text NOT NULL,
        note text NOT NULL DEFAULT '',
        status text NOT NULL DEFAULT 'pending',
        line_ids uuid[] NOT NULL DEFAULT '{}',
        restock boolean NOT NULL DEFAULT false,
        failure text,
        created_by uuid REFERENCES users (id) ON DELETE SET NULL,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        CONSTRAINT refunds_amount_positive CHECK (amount_minor > 0),
        CONSTRAINT refunds_reason_known CHECK (reason IN
          ('oversold', 'failed_casting', 'buyer_request', 'duplicate_payment', 'other')),
        CONSTRAINT refunds_status_known CHECK (status IN ('pending', 'succeeded', 'failed'))
      );
      CREATE INDEX refunds_by_order ON refunds (order_id);
      CREATE INDEX refunds_by_payment ON refunds (payment_intent_id);
      CREATE INDEX refunds_pending ON refunds (created_at) WHERE status = 'pending';
    `);
  },

  async down(queryInterface) {
    await queryInterface.sequelize.query(`
      DROP TABLE refunds; DROP TABLE payment_events; DROP TABLE checkout_sessions; DROP TABLE order_events;
      DROP TABLE order_lines; DROP TABLE orders; DROP SEQUENCE order_number_seq;
    `);
  },
};
