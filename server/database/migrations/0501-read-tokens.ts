import type { MigrationFn } from 'umzug'
import type { QueryInterface } from 'sequelize'

// Read tokens: how a production system reads an organisation's signed-off tables over HTTP
// (Authorization: Bearer ...). Only the SHA-256 of a token is stored; the token is shown once.
export const up: MigrationFn<QueryInterface> = async ({ context: q }) => {
  await q.sequelize.query(`
    CREATE TABLE read_tokens (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      org_id uuid NOT NULL REFERENCES organisations(id) ON DELETE CASCADE,
      name text NOT NULL CHECK (length(name) BETWEEN 1 AND 80),
      token_hash text NOT NULL UNIQUE,
      hint text NOT NULL,
      created_by uuid REFERENCES users(id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      last_used_at timestamptz,
      revoked_at timestamptz
    );
    CREATE INDEX read_tokens_org ON read_tokens (org_id);
  `)
}

export const down: MigrationFn<QueryInterface> = async ({ context: q }) => {
  await q.sequelize.query('DROP TABLE read_tokens;')
}
