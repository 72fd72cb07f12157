import type { MigrationFn } from 'umzug'
import type { QueryInterface } from 'sequelize'

// Invitations and password resets (tokens stored only as SHA-256 hashes), the organisation's
// billing account (mirror of its Stripe customer and subscription), its invoices, and the ids
// of processed Stripe events (a repeat is ignored).
export const up: MigrationFn<QueryInterface> = async ({ context: q }) => {
  await q.sequelize.query(`
    CREATE TABLE invitations (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      org_id uuid NOT NULL REFERENCES organisations(id) ON DELETE CASCADE,
      email text NOT NULL CHECK (email = lower(email)),
      role text NOT NULL CHECK (role IN ('admin', 'actuary', 'analyst', 'auditor')),
      token_hash text NOT NULL UNIQUE,
      invited_by uuid REFERENCES users(id) ON DELETE SET NULL,
      expires_at timestamptz NOT NULL,
      sent_at timestamptz NOT NULL DEFAULT now(),
      accepted_at timestamptz,
      accepted_by uuid REFERENCES users(id) ON DELETE SET NULL,
      cancelled_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    -- at most one open invitation per address and organisation
    CREATE UNIQUE INDEX invitations_open ON invitations (org_id, email) WHERE accepted_at IS NULL AND cancelled_at IS NULL;
    CREATE TABLE password_resets (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      user_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      token_hash text NOT NULL UNIQUE,
      expires_at timestamptz NOT NULL,
      used_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX password_resets_user ON password_resets (user_id);
    CREATE TABLE billing_accounts (
      org_id uuid PRIMARY KEY REFERENCES organisations(id) ON DELETE CASCADE,
      stripe_customer_id text UNIQUE,
      stripe_subscription_id text UNIQUE,
      seats integer NOT NULL CHECK (seats >= 1),
      status text NOT NULL DEFAULT 'not_started',
      current_period_end timestamptz,
      card_brand text,
      card_last4 text,
      -- demo organisations get Stripe's test card on file when first provisioned (test keys only)
      demo_card boolean NOT NULL DEFAULT false,
      synced_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE TABLE invoices (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      org_id uuid NOT NULL REFERENCES organisations(id) ON DELETE CASCADE,
      stripe_invoice_id text NOT NULL UNIQUE,
      number text,
      status text NOT NULL,
      billing_reason text,
      amount_due bigint NOT NULL,
      amount_paid bigint NOT NULL,
      currency text NOT NULL,
      period_start timestamptz,
      period_end timestamptz,
      hosted_invoice_url text,
      created timestamptz NOT NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX invoices_org ON invoices (org_id, created DESC);
    CREATE TABLE stripe_events (
      id text PRIMARY KEY,
      type text NOT NULL,
      org_id uuid REFERENCES organisations(id) ON DELETE SET NULL,
      received_at timestamptz NOT NULL DEFAULT now()
    );
  `)
}

export const down: MigrationFn<QueryInterface> = async ({ context: q }) => {
  await q.sequelize.query('DROP TABLE stripe_events; DROP TABLE invoices; DROP TABLE billing_accounts; DROP TABLE password_resets; DROP TABLE invitations;')
}
