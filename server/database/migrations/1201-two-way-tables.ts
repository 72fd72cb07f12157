import type { MigrationFn } from 'umzug'
import type { QueryInterface } from 'sequelize'

// Two-way tables (issue 17): a table's shape is one-way (points x, y) or two-way (cells x, d, y: the row axis is the
// table's axis, the column axis is col_axis, e.g. duration since entry, with an optional ultimate column). A two-way
// version's given cells live in version_grid_points, its chosen fill's values in version_grid_fill_points; d IS NULL
// is the ultimate column (unique with NULLS NOT DISTINCT, PostgreSQL 15). Both take the freeze trigger of 0401.
// kw_points_hash (0701) now hashes a two-way version's cells "x<TAB>d<TAB>y\n" (d 'ult' for the ultimate column,
// ordered by x, then d with the ultimate last) exactly as server/lib/points-hash.ts gridContentHash does, so the
// deferred stale-fill trigger protects two-way versions as it protects one-way ones.
export const up: MigrationFn<QueryInterface> = async ({ context: q }) => {
  await q.sequelize.query(`
    ALTER TABLE rate_tables
      ADD COLUMN shape text NOT NULL DEFAULT 'one-way' CHECK (shape IN ('one-way', 'two-way')),
      ADD COLUMN col_axis text CHECK (col_axis IN ('duration', 'age', 'service')),
      ADD COLUMN col_axis_unit text CHECK (col_axis_unit IN ('years', 'months')),
      ADD COLUMN has_ultimate boolean NOT NULL DEFAULT false,
      ADD CONSTRAINT rate_tables_shape_axes CHECK (
        (shape = 'one-way' AND col_axis IS NULL AND col_axis_unit IS NULL AND NOT has_ultimate)
        OR (shape = 'two-way' AND col_axis IS NOT NULL AND col_axis_unit IS NOT NULL));

    CREATE TABLE version_grid_points (
      version_id uuid NOT NULL REFERENCES table_versions(id) ON DELETE CASCADE,
      x numeric NOT NULL,
      d numeric,
      y numeric NOT NULL,
      UNIQUE NULLS NOT DISTINCT (version_id, x, d)
    );
    CREATE TABLE version_grid_fill_points (
      version_id uuid NOT NULL REFERENCES table_versions(id) ON DELETE CASCADE,
      x numeric NOT NULL,
      d numeric,
      y numeric NOT NULL,
      UNIQUE NULLS NOT DISTINCT (version_id, x, d)
    );
    CREATE TRIGGER version_grid_points_no_change BEFORE INSERT OR UPDATE OR DELETE ON version_grid_points
      FOR EACH ROW EXECUTE FUNCTION version_values_frozen();
    CREATE TRIGGER version_grid_fill_points_no_change BEFORE INSERT OR UPDATE OR DELETE ON version_grid_fill_points
      FOR EACH ROW EXECUTE FUNCTION version_values_frozen();

    CREATE OR REPLACE FUNCTION kw_points_hash(v uuid) RETURNS text LANGUAGE sql STABLE AS $$
      SELECT CASE WHEN EXISTS (SELECT 1 FROM version_grid_points WHERE version_id = v) THEN
        (SELECT encode(sha256(convert_to(string_agg(trim_scale(x)::text || E'\\t' || coalesce(trim_scale(d)::text, 'ult') || E'\\t' || trim_scale(y)::text || E'\\n', '' ORDER BY x, d NULLS LAST), 'UTF8')), 'hex')
         FROM version_grid_points WHERE version_id = v)
      ELSE
        (SELECT encode(sha256(convert_to(coalesce(string_agg(trim_scale(x)::text || E'\\t' || trim_scale(y)::text || E'\\n', '' ORDER BY x), ''), 'UTF8')), 'hex')
         FROM version_points WHERE version_id = v)
      END
    $$;

    CREATE OR REPLACE FUNCTION table_versions_fill_current() RETURNS trigger LANGUAGE plpgsql AS $$
    DECLARE
      r record;
      actual text;
    BEGIN
      SELECT id, number, status, fill_spec, fill_points_hash INTO r FROM table_versions WHERE id = NEW.id;
      IF NOT FOUND OR r.status NOT IN ('in-review', 'approved') THEN RETURN NULL; END IF;
      IF r.fill_spec IS NULL OR NOT (EXISTS (SELECT 1 FROM version_fill_points WHERE version_id = r.id)
                                     OR EXISTS (SELECT 1 FROM version_grid_fill_points WHERE version_id = r.id)) THEN
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
  `)
}

export const down: MigrationFn<QueryInterface> = async ({ context: q }) => {
  await q.sequelize.query(`
    DROP TABLE version_grid_fill_points; DROP TABLE version_grid_points;
    ALTER TABLE rate_tables DROP CONSTRAINT rate_tables_shape_axes, DROP COLUMN has_ultimate, DROP COLUMN col_axis_unit,
      DROP COLUMN col_axis, DROP COLUMN shape;
  `)
}
