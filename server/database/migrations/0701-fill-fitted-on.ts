import type { MigrationFn } from 'umzug'
import type { QueryInterface } from 'sequelize'

// A fill is tied to the points it was fitted on. fill_points_hash is the version's content hash (server/lib/points-hash.ts)
// when the fill was chosen, fill_lock_version the draft's lock version right after. The database refuses, for every role,
// to send a version for a second check or sign it off when its fill was fitted on other points than the ones it holds:
// kw_points_hash recomputes the content hash from version_points in SQL (trim_scale gives the canonical decimal text),
// and the check runs at COMMIT (a deferred constraint trigger), so points changed later in the same transaction count.
// A version inserted directly in a reviewed state (the demo seed) may carry no fill, but a fill it carries must be current.
export const up: MigrationFn<QueryInterface> = async ({ context: q }) => {
  await q.sequelize.query(`
    ALTER TABLE table_versions ADD COLUMN fill_points_hash text, ADD COLUMN fill_lock_version integer;
    UPDATE table_versions SET fill_points_hash = fill_spec->'bench'->>'pointsHash'
      WHERE fill_spec IS NOT NULL AND status IN ('draft', 'in-review');

    CREATE FUNCTION kw_points_hash(v uuid) RETURNS text LANGUAGE sql STABLE AS $$
      SELECT encode(sha256(convert_to(coalesce(string_agg(trim_scale(x)::text || E'\\t' || trim_scale(y)::text || E'\\n', '' ORDER BY x), ''), 'UTF8')), 'hex')
      FROM version_points WHERE version_id = v
    $$;

    CREATE FUNCTION table_versions_fill_current() RETURNS trigger LANGUAGE plpgsql AS $$
    DECLARE
      r record;
      actual text;
    BEGIN
      SELECT id, number, status, fill_spec, fill_points_hash INTO r FROM table_versions WHERE id = NEW.id;
      IF NOT FOUND OR r.status NOT IN ('in-review', 'approved') THEN RETURN NULL; END IF;
      IF r.fill_spec IS NULL OR NOT EXISTS (SELECT 1 FROM version_fill_points WHERE version_id = r.id) THEN
        IF TG_ARGV[0] = 'fill optional' AND r.fill_spec IS NULL THEN RETURN NULL; END IF;
        RAISE EXCEPTION 'version % has no recorded fill, so it cannot go for a second check or be signed off', r.number
          USING ERRCODE = 'check_violation', CONSTRAINT = 'fill_missing';
      END IF;
      actual := kw_points_hash(r.id);
      IF r.fill_points_hash IS DISTINCT FROM actual THEN
        RAISE EXCEPTION 'the fill of version % was fitted on other points (fitted on %, the given points now hash to %)', r.number, coalesce(r.fill_points_hash, 'unrecorded points'), actual
          USING ERRCODE = 'check_violation', CONSTRAINT = 'fill_stale', HINT = 'Choose the fill again on the current points.';
      END IF;
      RETURN NULL;
    END $$;

    CREATE CONSTRAINT TRIGGER table_versions_fill_current AFTER UPDATE OF status ON table_versions
      DEFERRABLE INITIALLY DEFERRED FOR EACH ROW
      WHEN ((OLD.status = 'draft' AND NEW.status = 'in-review') OR (OLD.status = 'in-review' AND NEW.status = 'approved'))
      EXECUTE FUNCTION table_versions_fill_current('fill required');
    CREATE CONSTRAINT TRIGGER table_versions_fill_current_insert AFTER INSERT ON table_versions
      DEFERRABLE INITIALLY DEFERRED FOR EACH ROW
      WHEN (NEW.status IN ('in-review', 'approved'))
      EXECUTE FUNCTION table_versions_fill_current('fill optional');
  `)
}

export const down: MigrationFn<QueryInterface> = async ({ context: q }) => {
  await q.sequelize.query(`
    DROP TRIGGER table_versions_fill_current_insert ON table_versions;
    DROP TRIGGER table_versions_fill_current ON table_versions;
    DROP FUNCTION table_versions_fill_current(); DROP FUNCTION kw_points_hash(uuid);
    ALTER TABLE table_versions DROP COLUMN fill_lock_version, DROP COLUMN fill_points_hash;
  `)
}
