'use strict';

/**
 * The workshop's audit log: who changed money, stock, people or settings, when, and what it was before and
 * after. Rows are only ever added: triggers refuse UPDATE, DELETE and TRUNCATE, save one update: when a
 * person's account is deleted, the foreign key sets their id to NULL and the entry keeps their name.
 */
module.exports = {
  async up(queryInterface) {
    await queryInterface.sequelize.query(`
      CREATE TABLE audit_log (
        id bigserial PRIMARY KEY,
        actor_user_id uuid REFERENCES users (id) ON DELETE SET NULL,
        actor_label text NOT NULL,
        action text NOT NULL,
        subject_type text NOT NULL,
        subject_id text NOT NULL,
        summary text NOT NULL,
        before jsonb,
        after jsonb,
        created_at timestamptz NOT NULL DEFAULT now(),
        CONSTRAINT audit_log_action_format CHECK (action ~ '^[a-z][a-z_]*\\.[a-z][a-z_]*$'),
        CONSTRAINT audit_log_actor_label_sensible CHECK (length(actor_label) BETWEEN 1 AND 200),
        CONSTRAINT audit_log_summary_sensible CHECK (length(summary) BETWEEN 1 AND 500)
      );
      -- The log is read newest first by id (the primary key); these serve one subject's history and the
      -- foreign key's SET NULL when an account is deleted.
      CREATE INDEX audit_log_subject ON audit_log (subject_type, subject_id, id);
      CREATE INDEX audit_log_actor ON audit_log (actor_user_id) WHERE actor_user_id IS NOT NULL;

      CREATE FUNCTION audit_log_append_only() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        -- Only the foreign key's own SET NULL passes: the id goes, the person is gone, nothing else changes.
        IF TG_OP = 'UPDATE' THEN
          IF NEW.actor_user_id IS NULL AND OLD.actor_user_id IS NOT NULL
             AND (to_jsonb(NEW) - 'actor_user_id') = (to_jsonb(OLD) - 'actor_user_id')
             AND NOT EXISTS (SELECT 1 FROM users WHERE id = OLD.actor_user_id) THEN
            RETURN NEW;
          END IF;
        END IF;
        RAISE EXCEPTION 'the audit log is append-only: its entries cannot be changed or removed'
          USING ERRCODE = 'insufficient_privilege';
      END $$;
      CREATE TRIGGER audit_log_append_only BEFORE UPDATE OR DELETE ON audit_log
        FOR EACH ROW EXECUTE FUNCTION audit_log_append_only();
      CREATE TRIGGER audit_log_no_truncate BEFORE TRUNCATE ON audit_log
        FOR EACH STATEMENT EXECUTE FUNCTION audit_log_append_only();
    `);
  },

  async down(queryInterface) {
    await queryInterface.sequelize.query(`
      DROP TABLE audit_log;
      DROP FUNCTION audit_log_append_only();
    `);
  },
};
