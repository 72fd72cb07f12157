import type { MigrationFn } from 'umzug'
import type { QueryInterface } from 'sequelize'

// A working draft made by the graduate step records that it was graduated and how: the source version's number, the
// engine's graduation spec (method, order, smoothing, weights, precision, engine version), the reasons, who and when.
// NULL for every other version.
export const up: MigrationFn<QueryInterface> = async ({ context: q }) => {
  await q.sequelize.query('ALTER TABLE table_versions ADD COLUMN graduation jsonb')
}

export const down: MigrationFn<QueryInterface> = async ({ context: q }) => {
  await q.sequelize.query('ALTER TABLE table_versions DROP COLUMN graduation')
}
