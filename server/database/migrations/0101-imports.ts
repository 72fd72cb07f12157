import type { MigrationFn } from 'umzug'
import type { QueryInterface } from 'sequelize'

// Uploads in progress: the parsed cells of each sheet (JSONB), so every wizard step and the
// final create are validated on the server against the same stored cells. Rows expire.
export const up: MigrationFn<QueryInterface> = async ({ context: q }) => {
  await q.sequelize.query(`
    CREATE TABLE imports (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      org_id uuid NOT NULL REFERENCES organisations(id) ON DELETE CASCADE,
      owner_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      file_name text NOT NULL CHECK (length(file_name) BETWEEN 1 AND 255),
      file_kind text NOT NULL CHECK (file_kind IN ('xlsx', 'csv')),
      size_bytes integer NOT NULL CHECK (size_bytes >= 0),
      sheets jsonb NOT NULL,
      expires_at timestamptz NOT NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX imports_owner ON imports (org_id, owner_id);
    CREATE INDEX imports_expiry ON imports (expires_at);
  `)
}

export const down: MigrationFn<QueryInterface> = async ({ context: q }) => {
  await q.sequelize.query('DROP TABLE imports;')
}
