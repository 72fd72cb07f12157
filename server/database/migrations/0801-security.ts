import type { MigrationFn } from 'umzug'
import type { QueryInterface } from 'sequelize'

// Web security (issue 14).
// auth_throttles: one row per throttle key holding the times of its recent attempts; an attempt is added by one
// INSERT ... ON CONFLICT DO UPDATE that refuses when the window is full, so concurrent requests on any number of app
// nodes share one count (server/utils/throttle.ts). Replaces login_failures, which was read and written in two steps.
// signup_requests: a sign-up starts with an e-mailed link (the answer is the same whether or not the address is
// registered); the token is stored as its SHA-256 hash only.
export const up: MigrationFn<QueryInterface> = async ({ context: q }) => {
  await q.sequelize.query(`
    CREATE TABLE auth_throttles (
      key text PRIMARY KEY,
      attempts timestamptz[] NOT NULL DEFAULT '{}',
      last_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX auth_throttles_last_at ON auth_throttles (last_at);
    DROP TABLE login_failures;
    CREATE TABLE signup_requests (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      email text NOT NULL CHECK (email = lower(email)),
      token_hash text NOT NULL UNIQUE,
      expires_at timestamptz NOT NULL,
      used_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX signup_requests_expires ON signup_requests (expires_at);
  `)
}

export const down: MigrationFn<QueryInterface> = async ({ context: q }) => {
  await q.sequelize.query(`
    DROP TABLE signup_requests;
    DROP TABLE auth_throttles;
    CREATE TABLE login_failures (id bigserial PRIMARY KEY, key text NOT NULL, failed_at timestamptz NOT NULL DEFAULT now());
    CREATE INDEX login_failures_key ON login_failures (key, failed_at);
  `)
}
