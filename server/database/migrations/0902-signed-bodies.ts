import type { MigrationFn } from 'umzug'
import type { QueryInterface } from 'sequelize'

// The read API serves each signed-off version's signed answer from here: produced once per version, signing key and
// stamp (a hash of the version's state, its table's details and the people named in it, the parts of the content that can
// still change), then served as stored bytes. Token use is counted per token, version and day instead of an audit event
// per read (the count is written in the request, before the answer, so no read goes unrecorded).
export const up: MigrationFn<QueryInterface> = async ({ context: q }) => {
  await q.sequelize.query(`
    CREATE TABLE signed_bodies (
      version_id uuid NOT NULL REFERENCES table_versions(id) ON DELETE CASCADE,
      key_id text NOT NULL,
      stamp text NOT NULL,
      tag text NOT NULL,
      body text NOT NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      PRIMARY KEY (version_id, key_id, stamp)
    );
    -- stored out of line but not compressed: every read sends it whole, so it is not decompressed on every read
    ALTER TABLE signed_bodies ALTER COLUMN body SET STORAGE EXTERNAL;
    CREATE TABLE read_token_usage (
      token_id uuid NOT NULL REFERENCES read_tokens(id) ON DELETE CASCADE,
      version_id uuid NOT NULL REFERENCES table_versions(id) ON DELETE CASCADE,
      day date NOT NULL,
      reads bigint NOT NULL DEFAULT 0,
      not_modified bigint NOT NULL DEFAULT 0,
      first_at timestamptz NOT NULL DEFAULT now(),
      last_at timestamptz NOT NULL DEFAULT now(),
      PRIMARY KEY (token_id, version_id, day)
    );
  `)
}

export const down: MigrationFn<QueryInterface> = async ({ context: q }) => {
  await q.sequelize.query('DROP TABLE read_token_usage; DROP TABLE signed_bodies;')
}
