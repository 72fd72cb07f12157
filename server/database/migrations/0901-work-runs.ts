import type { MigrationFn } from 'umzug'
import type { QueryInterface } from 'sequelize'

// Long and heavy work (comparisons, reading uploads, signed exports) as runs kept in PostgreSQL, so any app node can answer how far a run
// is and what it found, and a run whose node died is taken over by another (server/services/work/). The queue itself is
// pg-boss's (schema pgboss, installed by scripts/migrate.ts); this table is the truth about each run.
export const up: MigrationFn<QueryInterface> = async ({ context: q }) => {
  await q.sequelize.query(`
    CREATE TABLE work_runs (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      org_id uuid NOT NULL REFERENCES organisations(id) ON DELETE CASCADE,
      user_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      run_key text NOT NULL CHECK (length(run_key) BETWEEN 8 AND 64),
      kind text NOT NULL CHECK (kind IN ('compare', 'import-read', 'export')),
      -- heavy runs go through the queue and count against the organisation's limit; light ones run where they arrive
      heavy boolean NOT NULL,
      status text NOT NULL CHECK (status IN ('queued', 'running', 'done', 'failed', 'cancelled')),
      input jsonb NOT NULL,
      input_bytes bytea,
      done integer NOT NULL DEFAULT 0,
      total integer NOT NULL DEFAULT 0,
      -- the answer: JSON text, and for a file (a signed workbook) its bytes, with {"file": {"name", "type"}} in result
      result text,
      result_bytes bytea,
      error jsonb,
      attempts integer NOT NULL DEFAULT 0,
      node text,
      heartbeat_at timestamptz,
      cancel_requested boolean NOT NULL DEFAULT false,
      created_at timestamptz NOT NULL DEFAULT now(),
      started_at timestamptz,
      finished_at timestamptz,
      UNIQUE (user_id, run_key)
    );
    CREATE INDEX work_runs_live ON work_runs (heartbeat_at) WHERE status = 'running';
    CREATE INDEX work_runs_org_heavy ON work_runs (org_id) WHERE status = 'running' AND heavy;
    CREATE INDEX work_runs_finished ON work_runs (finished_at) WHERE finished_at IS NOT NULL;

    -- uploads in progress are short-lived; the wizard's sheet summary is now stored beside the cells
    DELETE FROM imports;
    ALTER TABLE imports ADD COLUMN sheet_summary jsonb NOT NULL;
  `)
}

export const down: MigrationFn<QueryInterface> = async ({ context: q }) => {
  await q.sequelize.query('DROP TABLE work_runs; ALTER TABLE imports DROP COLUMN sheet_summary;')
}
