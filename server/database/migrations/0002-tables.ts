import type { MigrationFn } from 'umzug'
import type { QueryInterface } from 'sequelize'

// Rate tables and their versions. Values are NUMERIC, never floats.
export const up: MigrationFn<QueryInterface> = async ({ context: q }) => {
  await q.sequelize.query(`
    CREATE TABLE rate_tables (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      org_id uuid NOT NULL REFERENCES organisations(id) ON DELETE CASCADE,
      name text NOT NULL CHECK (length(name) BETWEEN 1 AND 160),
      kind text NOT NULL CHECK (kind IN ('mortality', 'lapse', 'salary', 'spot-rate', 'discount-factor', 'other')),
      axis text NOT NULL CHECK (axis IN ('age', 'policy-year', 'term')),
      axis_unit text NOT NULL DEFAULT 'years' CHECK (axis_unit IN ('years', 'months')),
      value_unit text NOT NULL DEFAULT 'per-unit' CHECK (value_unit IN ('per-unit', 'percent', 'per-mille')),
      description text NOT NULL DEFAULT '',
      tags text[] NOT NULL DEFAULT '{}',
      created_by uuid REFERENCES users(id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (org_id, name)
    );
    CREATE TABLE table_versions (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      org_id uuid NOT NULL REFERENCES organisations(id) ON DELETE CASCADE,
      table_id uuid NOT NULL REFERENCES rate_tables(id) ON DELETE CASCADE,
      number integer NOT NULL CHECK (number >= 1),
      status text NOT NULL DEFAULT 'draft' CHECK (status IN ('draft', 'in-review', 'approved', 'retired')),
      author_id uuid REFERENCES users(id) ON DELETE SET NULL,
      notes text NOT NULL DEFAULT '',
      content_hash text NOT NULL,
      lock_version integer NOT NULL DEFAULT 0,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (table_id, number)
    );
    CREATE INDEX table_versions_org ON table_versions (org_id, table_id);
    CREATE TABLE version_points (
      version_id uuid NOT NULL REFERENCES table_versions(id) ON DELETE CASCADE,
      x numeric NOT NULL,
      y numeric NOT NULL,
      PRIMARY KEY (version_id, x)
    );
  `)
}

export const down: MigrationFn<QueryInterface> = async ({ context: q }) => {
  await q.sequelize.query('DROP TABLE version_points; DROP TABLE table_versions; DROP TABLE rate_tables;')
}
