'use strict';

/**
 * The mail outbox: a message is rendered and recorded in the same transaction as the change it reports,
 * then sent by a job. `dedupe_key` makes each message once per cause (one confirmation per order).
 */
module.exports = {
  async up(queryInterface) {
    await queryInterface.sequelize.query(`
      CREATE TABLE mail_outbox (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        dedupe_key text NOT NULL UNIQUE,
        to_address text NOT NULL,
        subject text NOT NULL,
        html text NOT NULL,
        text text NOT NULL,
        headers jsonb NOT NULL DEFAULT '{}',
        status text NOT NULL DEFAULT 'pending',
        attempts integer NOT NULL DEFAULT 0,
        next_attempt_at timestamptz NOT NULL DEFAULT now(),
        last_error text,
        message_id text,
        sent_at timestamptz,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        CONSTRAINT mail_outbox_status_known CHECK (status IN ('pending', 'sent', 'failed')),
        CONSTRAINT mail_outbox_sent_has_time CHECK ((status = 'sent') = (sent_at IS NOT NULL))
      );
      CREATE INDEX mail_outbox_due ON mail_outbox (next_attempt_at) WHERE status = 'pending';
    `);
  },

  async down(queryInterface) {
    await queryInterface.dropTable('mail_outbox');
  },
};
