import type { MigrationContext } from '../db/umzug';

// Outage mail: the transactional outbox, maintenance windows, each person's mail preferences,
// and what the outage and digest rules remember between runs.
export async function up({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    CREATE TABLE outbox (
      id bigserial PRIMARY KEY,
      kind text NOT NULL CHECK (kind IN ('node-offline', 'node-reminder', 'node-online', 'upstream-notice',
                                         'self-check', 'invitation', 'password-reset')),
      recipient_user_id integer REFERENCES users (id) ON DELETE SET NULL,
      recipient_address text NOT NULL CHECK (recipient_address !~ '[\\r\\n]' AND length(recipient_address) <= 254),
      recipient_name text CHECK (recipient_name !~ '[\\r\\n]'),
      subject text NOT NULL CHECK (subject !~ '[\\r\\n]' AND length(subject) <= 300),
      text_body text NOT NULL,
      html_body text NOT NULL,
      unsubscribe_url text CHECK (unsubscribe_url !~ '[\\r\\n]'),
      node_id integer REFERENCES nodes (id) ON DELETE SET NULL,
      outage_id integer REFERENCES outages (id) ON DELETE SET NULL,
      dedupe_key text NOT NULL UNIQUE CHECK (length(dedupe_key) <= 200),
      status text NOT NULL DEFAULT 'pending' CHECK (status IN ('pending', 'sent', 'failed')),
      attempts integer NOT NULL DEFAULT 0 CHECK (attempts >= 0),
      next_attempt_at timestamptz NOT NULL,
      last_error text,
      created_at timestamptz NOT NULL,
      sent_at timestamptz,
      updated_at timestamptz NOT NULL DEFAULT now(),
      CHECK (status <> 'sent' OR sent_at IS NOT NULL)
    );
    CREATE INDEX outbox_due_idx ON outbox (next_attempt_at) WHERE status = 'pending';
    CREATE INDEX outbox_node_recipient_idx ON outbox (node_id, recipient_user_id, created_at);
    CREATE INDEX outbox_created_idx ON outbox (created_at);

    CREATE TABLE maintenance_windows (
      id serial PRIMARY KEY,
      node_id integer NOT NULL REFERENCES nodes (id) ON DELETE CASCADE,
      starts_at timestamptz NOT NULL,
      ends_at timestamptz NOT NULL,
      reason text CHECK (length(reason) <= 500),
      created_by integer REFERENCES users (id) ON DELETE SET NULL,
      cancelled_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CHECK (ends_at > starts_at)
    );
    CREATE INDEX maintenance_windows_node_idx ON maintenance_windows (node_id, ends_at) WHERE cancelled_at IS NULL;

    -- One row per person once they change anything; absent means the defaults below.
    CREATE TABLE alert_preferences (
      user_id integer PRIMARY KEY REFERENCES users (id) ON DELETE CASCADE,
      operator_mode text NOT NULL DEFAULT 'immediate' CHECK (operator_mode IN ('immediate', 'hourly', 'off')),
      host_mail boolean NOT NULL DEFAULT true,
      quiet_start time,
      quiet_end time,
      admin_node_mail boolean NOT NULL DEFAULT false,
      admin_self_check boolean NOT NULL DEFAULT true,
      upstream_notices boolean NOT NULL DEFAULT false,
      degraded_digest boolean NOT NULL DEFAULT true,
      unsubscribed_at timestamptz,
      updated_at timestamptz NOT NULL DEFAULT now(),
      CHECK ((quiet_start IS NULL) = (quiet_end IS NULL)),
      CHECK (quiet_start IS NULL OR quiet_start <> quiet_end)
    );

    ALTER TABLE outages
      ADD COLUMN offline_notified_at timestamptz,
      ADD COLUMN last_reminder_at timestamptz,
      ADD COLUMN reminders_sent integer NOT NULL DEFAULT 0;
    CREATE INDEX outages_unnotified_idx ON outages (started_at) WHERE ended_at IS NULL;

    -- The mail rules' own clock marks (last hourly digest, last daily digest), beside job_state.
    ALTER TABLE job_state ADD COLUMN marked_at timestamptz;
  `);
}

export async function down({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    ALTER TABLE job_state DROP COLUMN IF EXISTS marked_at;
    DROP INDEX IF EXISTS outages_unnotified_idx;
    ALTER TABLE outages DROP COLUMN IF EXISTS offline_notified_at, DROP COLUMN IF EXISTS last_reminder_at,
      DROP COLUMN IF EXISTS reminders_sent;
    DROP TABLE IF EXISTS alert_preferences, maintenance_windows, outbox;
  `);
}
