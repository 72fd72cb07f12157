import type { MigrationFn } from 'umzug'
import type { QueryInterface } from 'sequelize'

// A read token may be limited to some of the organisation's tables (least privilege for a system that needs, say, only
// the discount curve). NULL keeps the earlier meaning: every table with a signed-off version.
export const up: MigrationFn<QueryInterface> = async ({ context: q }) => {
  await q.sequelize.query(`
    ALTER TABLE read_tokens ADD COLUMN table_ids uuid[] CHECK (table_ids IS NULL OR cardinality(table_ids) BETWEEN 1 AND 200);
  `)
}

export const down: MigrationFn<QueryInterface> = async ({ context: q }) => {
  await q.sequelize.query('ALTER TABLE read_tokens DROP COLUMN table_ids;')
}
