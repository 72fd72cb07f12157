import type { MigrationFn } from 'umzug'
import type { QueryInterface } from 'sequelize'

// A per-token request count per clock minute, so a production system stuck in a loop cannot flood the server: counted in
// the same UPDATE that checks the token (no extra table, no extra query).
export const up: MigrationFn<QueryInterface> = async ({ context: q }) => {
  await q.sequelize.query(`
    ALTER TABLE read_tokens ADD COLUMN window_start timestamptz, ADD COLUMN window_count integer NOT NULL DEFAULT 0;
  `)
}

export const down: MigrationFn<QueryInterface> = async ({ context: q }) => {
  await q.sequelize.query('ALTER TABLE read_tokens DROP COLUMN window_start, DROP COLUMN window_count;')
}
