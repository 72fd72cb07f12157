import type { MigrationFn } from 'umzug'
import type { QueryInterface } from 'sequelize'

// Imports being read, checked or created right now, one row each, so a person's concurrent imports can be limited across
// every app node sharing this database (server/services/import-slots.ts). A row outlives a crashed node only until
// expires_at.
export const up: MigrationFn<QueryInterface> = async ({ context: q }) => {
  await q.sequelize.query(`
    CREATE TABLE import_slots (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      user_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      work text NOT NULL CHECK (work IN ('upload', 'preview', 'commit')),
      started_at timestamptz NOT NULL DEFAULT now(),
      expires_at timestamptz NOT NULL
    );
    CREATE INDEX import_slots_user ON import_slots (user_id, expires_at);
  `)
}

export const down: MigrationFn<QueryInterface> = async ({ context: q }) => {
  await q.sequelize.query('DROP TABLE import_slots;')
}
