import type { MigrationFn } from 'umzug'
import type { QueryInterface } from 'sequelize'

// 1. Gapless numbering per trail: seq counts each organisation's own events 1, 2, 3, ... (and the system trail's, the
//    org-less sign-ins). The global id interleaves organisations, so an organisation saw gaps. seq is a position in the
//    chain, not part of what the hash covers, so numbering the existing events changes no hash; verification checks
//    that the numbers run without gaps (a removed event in the middle shows as missing numbers).
// 2. Signed checkpoints: the chain head (number, event id, hash) signed with the organisation's Ed25519 key, written at
//    least daily and on every sign-off. A hash chain alone cannot show that its newest events were removed (the shorter
//    chain still links up); a signed head it no longer reaches can. One daily checkpoint per organisation and UTC day
//    (a unique index: several app nodes may try at once). Append-only like the events, for every role.
export const up: MigrationFn<QueryInterface> = async ({ context: q }) => {
  await q.sequelize.query(`
    ALTER TABLE audit_events ADD COLUMN seq bigint;
    ALTER TABLE audit_events DISABLE TRIGGER audit_events_no_change;
    UPDATE audit_events e SET seq = n.rn FROM (SELECT id, row_number() OVER (PARTITION BY org_id ORDER BY id) AS rn FROM audit_events) n WHERE n.id = e.id;
    ALTER TABLE audit_events ENABLE TRIGGER audit_events_no_change;
    ALTER TABLE audit_events ALTER COLUMN seq SET NOT NULL;
    CREATE UNIQUE INDEX audit_events_org_seq ON audit_events (org_id, seq) WHERE org_id IS NOT NULL;
    CREATE UNIQUE INDEX audit_events_system_seq ON audit_events (seq) WHERE org_id IS NULL;

    CREATE TABLE audit_checkpoints (
      id bigserial PRIMARY KEY,
      org_id uuid NOT NULL REFERENCES organisations(id) ON DELETE CASCADE,
      reason text NOT NULL CHECK (reason IN ('daily', 'sign-off')),
      day date NOT NULL,
      head_seq bigint,
      head_event_id bigint,
      head_hash text,
      head_at timestamptz,
      statement text NOT NULL,
      signature text NOT NULL,
      key_id text NOT NULL,
      created_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE UNIQUE INDEX audit_checkpoints_daily ON audit_checkpoints (org_id, day) WHERE reason = 'daily';
    CREATE INDEX audit_checkpoints_org ON audit_checkpoints (org_id, head_seq);
    CREATE FUNCTION audit_checkpoints_append_only() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      RAISE EXCEPTION 'audit checkpoints are append-only (% refused)', TG_OP USING ERRCODE = 'insufficient_privilege';
    END $$;
    CREATE TRIGGER audit_checkpoints_no_change BEFORE UPDATE OR DELETE ON audit_checkpoints
      FOR EACH ROW EXECUTE FUNCTION audit_checkpoints_append_only();
  `)
}

export const down: MigrationFn<QueryInterface> = async ({ context: q }) => {
  await q.sequelize.query(`
    DROP TABLE audit_checkpoints; DROP FUNCTION audit_checkpoints_append_only();
    DROP INDEX audit_events_system_seq; DROP INDEX audit_events_org_seq;
    ALTER TABLE audit_events DROP COLUMN seq;
  `)
}
