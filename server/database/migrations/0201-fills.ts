import type { MigrationFn } from 'umzug'
import type { QueryInterface } from 'sequelize'

// The chosen fill of a version: the engine's fully resolved spec, the reasons, and the
// filled values (NUMERIC, exactly the engine's decimal strings).
export const up: MigrationFn<QueryInterface> = async ({ context: q }) => {
  await q.sequelize.query(`
    ALTER TABLE table_versions
      ADD COLUMN fill_spec jsonb,
      ADD COLUMN fill_rationale text,
      ADD COLUMN fill_diagnostics jsonb,
      ADD COLUMN fill_money jsonb,
      ADD COLUMN filled_by uuid REFERENCES users(id) ON DELETE SET NULL,
      ADD COLUMN filled_at timestamptz;
    CREATE TABLE version_fill_points (
      version_id uuid NOT NULL REFERENCES table_versions(id) ON DELETE CASCADE,
      x numeric NOT NULL,
      y numeric NOT NULL,
      PRIMARY KEY (version_id, x)
    );
  `)
}

export const down: MigrationFn<QueryInterface> = async ({ context: q }) => {
  await q.sequelize.query(`
    DROP TABLE version_fill_points;
    ALTER TABLE table_versions DROP COLUMN fill_spec, DROP COLUMN fill_rationale, DROP COLUMN fill_diagnostics,
      DROP COLUMN fill_money, DROP COLUMN filled_by, DROP COLUMN filled_at;
  `)
}
