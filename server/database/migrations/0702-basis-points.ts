import type { MigrationFn } from 'umzug'
import type { QueryInterface } from 'sequelize'

// Spot-rate curves may be kept in basis points (stored per unit as always: 25 bp is 0.0025).
export const up: MigrationFn<QueryInterface> = async ({ context: q }) => {
  await q.sequelize.query(`
    ALTER TABLE rate_tables DROP CONSTRAINT rate_tables_value_unit_check;
    ALTER TABLE rate_tables ADD CONSTRAINT rate_tables_value_unit_check
      CHECK (value_unit IN ('per-unit', 'percent', 'per-mille', 'basis-points') AND (value_unit <> 'basis-points' OR kind = 'spot-rate'));
  `)
}

export const down: MigrationFn<QueryInterface> = async ({ context: q }) => {
  await q.sequelize.query(`
    ALTER TABLE rate_tables DROP CONSTRAINT rate_tables_value_unit_check;
    ALTER TABLE rate_tables ADD CONSTRAINT rate_tables_value_unit_check CHECK (value_unit IN ('per-unit', 'percent', 'per-mille'));
  `)
}
