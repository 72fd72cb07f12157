import type { MigrationFn } from 'umzug'
import type { QueryInterface } from 'sequelize'

// Organisations, people, one role per person per organisation, revocable sessions,
// login throttling, and the append-only audit trail.
export const up: MigrationFn<QueryInterface> = async ({ context: q }) => {
  await q.sequelize.query(`
    CREATE TABLE organisations (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      name text NOT NULL CHECK (length(name) BETWEEN 1 AND 120),
      slug text NOT NULL UNIQUE CHECK (slug ~ '^[a-z0-9][a-z0-9-]{1,62}$'),
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE TABLE users (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      email text NOT NULL UNIQUE CHECK (email = lower(email)),
      name text NOT NULL,
      password_hash text NOT NULL,
      password_changed_at timestamptz NOT NULL DEFAULT now(),
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE TABLE memberships (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      org_id uuid NOT NULL REFERENCES organisations(id) ON DELETE CASCADE,
      user_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      role text NOT NULL CHECK (role IN ('admin', 'actuary', 'analyst', 'auditor')),
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (org_id, user_id)
    );
    CREATE INDEX memberships_user ON memberships (user_id);
    CREATE TABLE sessions (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      user_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      expires_at timestamptz NOT NULL,
      last_seen_at timestamptz NOT NULL DEFAULT now(),
      revoked_at timestamptz,
      revoked_reason text,
      ip text,
      user_agent text,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX sessions_user ON sessions (user_id) WHERE revoked_at IS NULL;
    CREATE TABLE login_failures (
      id bigserial PRIMARY KEY,
      key text NOT NULL,
      failed_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX login_failures_key ON login_failures (key, failed_at);
    CREATE TABLE audit_events (
      id bigserial PRIMARY KEY,
      org_id uuid,
      actor_id uuid,
      actor_email text,
      action text NOT NULL,
      object_type text,
      object_id text,
      outcome text NOT NULL CHECK (outcome IN ('ok', 'denied', 'failed')),
      request_id text,
      ip text,
      detail jsonb NOT NULL DEFAULT '{}',
      at timestamptz NOT NULL DEFAULT now(),
      prev_hash text,
      hash text NOT NULL
    );
    CREATE INDEX audit_events_org ON audit_events (org_id, id);
    CREATE FUNCTION audit_events_append_only() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      RAISE EXCEPTION 'audit events are append-only (% refused)', TG_OP USING ERRCODE = 'insufficient_privilege';
    END $$;
    CREATE TRIGGER audit_events_no_change BEFORE UPDATE OR DELETE ON audit_events
      FOR EACH ROW EXECUTE FUNCTION audit_events_append_only();
  `)
}

export const down: MigrationFn<QueryInterface> = async ({ context: q }) => {
  await q.sequelize.query(`
    DROP TABLE audit_events; DROP FUNCTION audit_events_append_only();
    DROP TABLE login_failures; DROP TABLE sessions; DROP TABLE memberships;
    DROP TABLE users; DROP TABLE organisations;
  `)
}
