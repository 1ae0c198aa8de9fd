'use strict';

/**
 * The waitlist. A person asks to hear about a design's next batch (optionally only some finishes); nothing is
 * sent but the confirmation message until its link is clicked (confirmed opt-in). Leaving is immediate and
 * final: a later join starts again as pending and needs a new confirmation; an import never confirms anyone.
 *
 * Announcements: one row per batch and kind of message (announced, early-access reminder, correction with its
 * revision), with the outbox rows it made linked back, so its progress is counted from the outbox itself.
 * Suppressions: addresses the mail server refused for good (a bounce) or that asked never to be written to.
 */
module.exports = {
  async up(queryInterface) {
    await queryInterface.sequelize.query(`
      CREATE TABLE waitlist_entries (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        design_id uuid NOT NULL REFERENCES designs (id) ON DELETE CASCADE,
        email text NOT NULL,
        user_id uuid REFERENCES users (id) ON DELETE SET NULL,
        finish_ids uuid[] NOT NULL DEFAULT '{}',
        state text NOT NULL DEFAULT 'pending',
        source text NOT NULL,
        time_zone text,
        confirm_token_hash text UNIQUE,
        confirm_sent_at timestamptz,
        confirm_expires_at timestamptz,
        confirmed_at timestamptz,
        left_at timestamptz,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        CONSTRAINT waitlist_entries_design_email_unique UNIQUE (design_id, email),
        CONSTRAINT waitlist_entries_email_normalised CHECK (email = lower(btrim(email)) AND email LIKE '%_@_%' AND length(email) <= 254),
        CONSTRAINT waitlist_entries_state_known CHECK (state IN ('pending', 'confirmed', 'left')),
        CONSTRAINT waitlist_entries_source_known CHECK (source IN ('design_page', 'drop_page', 'waitlist_page', 'account', 'import')),
        CONSTRAINT waitlist_entries_confirmed_has_time CHECK (state <> 'confirmed' OR (confirmed_at IS NOT NULL AND left_at IS NULL)),
        CONSTRAINT waitlist_entries_left_has_time CHECK ((state = 'left') = (left_at IS NOT NULL)),
        CONSTRAINT waitlist_entries_finishes_not_null CHECK (array_position(finish_ids, NULL) IS NULL)
      );
      CREATE INDEX waitlist_entries_confirmed_by_design ON waitlist_entries (design_id, id) WHERE state = 'confirmed';
      CREATE INDEX waitlist_entries_by_email ON waitlist_entries (email);
      CREATE INDEX waitlist_entries_by_user ON waitlist_entries (user_id) WHERE user_id IS NOT NULL;

      CREATE TABLE mail_suppressions (
        email text PRIMARY KEY,
        reason text NOT NULL,
        detail text,
        created_at timestamptz NOT NULL DEFAULT now(),
        CONSTRAINT mail_suppressions_email_normalised CHECK (email = lower(btrim(email))),
        CONSTRAINT mail_suppressions_reason_known CHECK (reason IN ('bounced', 'refused', 'complained'))
      );

      CREATE TABLE waitlist_announcements (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        batch_id uuid NOT NULL REFERENCES batches (id) ON DELETE CASCADE,
        kind text NOT NULL,
        revision integer NOT NULL DEFAULT 1,
        state text NOT NULL DEFAULT 'queued',
        recipients integer,
        detail jsonb NOT NULL DEFAULT '{}',
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        CONSTRAINT waitlist_announcements_once UNIQUE (batch_id, kind, revision),
        CONSTRAINT waitlist_announcements_kind_known CHECK (kind IN ('announced', 'early_access_reminder', 'correction')),
        CONSTRAINT waitlist_announcements_state_known CHECK (state IN ('queued', 'fanning_out', 'queued_all', 'cancelled')),
        CONSTRAINT waitlist_announcements_revision_positive CHECK (revision >= 1)
      );

      ALTER TABLE mail_outbox
        ADD COLUMN announcement_id uuid REFERENCES waitlist_announcements (id) ON DELETE SET NULL,
        ADD COLUMN waitlist_entry_id uuid REFERENCES waitlist_entries (id) ON DELETE SET NULL;
      CREATE INDEX mail_outbox_by_announcement ON mail_outbox (announcement_id, status) WHERE announcement_id IS NOT NULL;

      ALTER TABLE studios
        ADD COLUMN mail_per_minute integer NOT NULL DEFAULT 600,
        ADD CONSTRAINT studios_mail_rate_sensible CHECK (mail_per_minute BETWEEN 1 AND 100000);
    `);
  },

  async down(queryInterface) {
    await queryInterface.sequelize.query(`
      ALTER TABLE studios DROP CONSTRAINT studios_mail_rate_sensible, DROP COLUMN mail_per_minute;
      DROP INDEX mail_outbox_by_announcement;
      ALTER TABLE mail_outbox DROP COLUMN waitlist_entry_id, DROP COLUMN announcement_id;
      DROP TABLE waitlist_announcements;
      DROP TABLE mail_suppressions;
      DROP TABLE waitlist_entries;
    `);
  },
};
