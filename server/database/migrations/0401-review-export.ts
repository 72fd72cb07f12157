import type { MigrationFn } from 'umzug'
import type { QueryInterface } from 'sequelize'

// Maker-checker review (who submitted, who signed off, who withdrew, what superseded it), the comment
// thread of a version, each organisation's Ed25519 signing keys (private key sealed, see
// server/lib/signing/keys.ts), and the database's own refusal to change a signed-off version.
//
// Frozen rule, enforced by triggers for every role (the owner too): once a version is 'approved' or
// 'retired' in a committed transaction, its row cannot be deleted or changed, except the single step
// approved -> retired (status and the retire/supersede columns, nothing else); its given points
// (version_points) and filled values (version_fill_points) cannot be inserted, changed or deleted.
// The transaction that makes a version approved may still write it (xmin = this transaction), so
// approval and its metadata land in one step; a later transaction cannot.
export const up: MigrationFn<QueryInterface> = async ({ context: q }) => {
  await q.sequelize.query(`
    ALTER TABLE table_versions
      ADD COLUMN submitted_by uuid REFERENCES users(id),
      ADD COLUMN submitted_at timestamptz,
      ADD COLUMN approved_by uuid REFERENCES users(id),
      ADD COLUMN approved_at timestamptz,
      ADD COLUMN retired_by uuid REFERENCES users(id),
      ADD COLUMN retired_at timestamptz,
      ADD COLUMN retire_reason text,
      ADD COLUMN superseded_by uuid REFERENCES table_versions(id);

    CREATE TABLE version_comments (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      org_id uuid NOT NULL REFERENCES organisations(id) ON DELETE CASCADE,
      version_id uuid NOT NULL REFERENCES table_versions(id) ON DELETE CASCADE,
      author_id uuid REFERENCES users(id) ON DELETE SET NULL,
      kind text NOT NULL CHECK (kind IN ('comment', 'submit', 'send-back', 'approve', 'retire')),
      body text NOT NULL CHECK (length(body) <= 4000),
      created_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX version_comments_version ON version_comments (version_id, created_at);

    CREATE TABLE org_signing_keys (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      org_id uuid NOT NULL REFERENCES organisations(id) ON DELETE CASCADE,
      kid text NOT NULL UNIQUE,
      public_x text NOT NULL,
      private_sealed text NOT NULL,
      status text NOT NULL DEFAULT 'active' CHECK (status IN ('active', 'retired')),
      created_at timestamptz NOT NULL DEFAULT now(),
      retired_at timestamptz
    );
    CREATE UNIQUE INDEX org_signing_keys_one_active ON org_signing_keys (org_id) WHERE status = 'active';

    CREATE FUNCTION kw_version_frozen(v uuid) RETURNS boolean LANGUAGE sql STABLE AS $$
      SELECT EXISTS (SELECT 1 FROM table_versions
                     WHERE id = v AND status IN ('approved', 'retired') AND xmin <> pg_current_xact_id()::xid)
    $$;

    CREATE FUNCTION table_versions_frozen() RETURNS trigger LANGUAGE plpgsql AS $$
    DECLARE
      allowed text[] := ARRAY['status', 'retired_by', 'retired_at', 'retire_reason', 'superseded_by', 'updated_at'];
    BEGIN
      IF OLD.status NOT IN ('approved', 'retired') OR NOT kw_version_frozen(OLD.id) THEN
        RETURN CASE WHEN TG_OP = 'DELETE' THEN OLD ELSE NEW END;
      END IF;
      IF TG_OP = 'UPDATE' AND OLD.status = 'approved' AND NEW.status = 'retired'
         AND (to_jsonb(NEW) - allowed) = (to_jsonb(OLD) - allowed) THEN
        RETURN NEW;
      END IF;
      RAISE EXCEPTION 'version % is signed off or withdrawn and cannot change (% refused)', OLD.number, TG_OP
        USING ERRCODE = 'integrity_constraint_violation', HINT = 'Start a new draft from it instead.';
    END $$;
    CREATE TRIGGER table_versions_no_change BEFORE UPDATE OR DELETE ON table_versions
      FOR EACH ROW EXECUTE FUNCTION table_versions_frozen();

    CREATE FUNCTION version_values_frozen() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      IF (TG_OP <> 'INSERT' AND kw_version_frozen(OLD.version_id)) OR (TG_OP <> 'DELETE' AND kw_version_frozen(NEW.version_id)) THEN
        RAISE EXCEPTION 'values of a signed-off or withdrawn version cannot change (% on % refused)', TG_OP, TG_TABLE_NAME
          USING ERRCODE = 'integrity_constraint_violation';
      END IF;
      RETURN CASE WHEN TG_OP = 'DELETE' THEN OLD ELSE NEW END;
    END $$;
    CREATE TRIGGER version_points_no_change BEFORE INSERT OR UPDATE OR DELETE ON version_points
      FOR EACH ROW EXECUTE FUNCTION version_values_frozen();
    CREATE TRIGGER version_fill_points_no_change BEFORE INSERT OR UPDATE OR DELETE ON version_fill_points
      FOR EACH ROW EXECUTE FUNCTION version_values_frozen();
  `)
}

export const down: MigrationFn<QueryInterface> = async ({ context: q }) => {
  await q.sequelize.query(`
    DROP TRIGGER version_fill_points_no_change ON version_fill_points;
    DROP TRIGGER version_points_no_change ON version_points;
    DROP TRIGGER table_versions_no_change ON table_versions;
    DROP FUNCTION version_values_frozen(); DROP FUNCTION table_versions_frozen(); DROP FUNCTION kw_version_frozen(uuid);
    DROP TABLE org_signing_keys; DROP TABLE version_comments;
    ALTER TABLE table_versions DROP COLUMN superseded_by, DROP COLUMN retire_reason, DROP COLUMN retired_at, DROP COLUMN retired_by,
      DROP COLUMN approved_at, DROP COLUMN approved_by, DROP COLUMN submitted_at, DROP COLUMN submitted_by;
  `)
}
