import type { MigrationFn } from 'umzug'
import type { QueryInterface } from 'sequelize'

// Curve tables state how their spot rates compound (annual, continuous, semi-annual); the engine reads and reports the
// rates under it and fills on ln P(t). Every table has the column (annual unless stated); it means something only for
// curve kinds (spot-rate, discount-factor), and like kind and units it is fixed once a version left draft.
export const up: MigrationFn<QueryInterface> = async ({ context: q }) => {
  await q.sequelize.query(`ALTER TABLE rate_tables ADD COLUMN compounding text NOT NULL DEFAULT 'annual'
    CHECK (compounding IN ('annual', 'continuous', 'semi-annual'))`)
}

export const down: MigrationFn<QueryInterface> = async ({ context: q }) => {
  await q.sequelize.query('ALTER TABLE rate_tables DROP COLUMN compounding')
}
