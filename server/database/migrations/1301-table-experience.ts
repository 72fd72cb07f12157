import type { MigrationFn } from 'umzug'
import type { QueryInterface } from 'sequelize'

// The experience behind a table of crude rates, when the import maps it: the exposure (and, if given, the actual deaths
// or decrements) at each axis value. The graduate step weights each age by its exposure and, with deaths too, tests the
// fit against expected deaths (Whittaker-Henderson weights and the chi-square test; London 1985). Kept beside the
// table, not in a version's content: it is evidence for the crude rates, never a filled value, and never changes
// after the import (the app role may only add rows with a new table).
export const up: MigrationFn<QueryInterface> = async ({ context: q }) => {
  await q.sequelize.query(`
    CREATE TABLE table_experience (
      table_id uuid NOT NULL REFERENCES rate_tables(id) ON DELETE CASCADE,
      x numeric NOT NULL,
      exposure numeric NOT NULL CHECK (exposure > 0),
      deaths numeric CHECK (deaths >= 0),
      PRIMARY KEY (table_id, x)
    );
    CREATE FUNCTION kw_experience_fixed() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      RAISE EXCEPTION 'the experience behind a table is fixed once imported' USING ERRCODE = 'check_violation';
    END $$;
    CREATE TRIGGER table_experience_fixed BEFORE UPDATE ON table_experience FOR EACH ROW EXECUTE FUNCTION kw_experience_fixed();
  `)
}

export const down: MigrationFn<QueryInterface> = async ({ context: q }) => {
  await q.sequelize.query('DROP TABLE table_experience; DROP FUNCTION kw_experience_fixed()')
}
