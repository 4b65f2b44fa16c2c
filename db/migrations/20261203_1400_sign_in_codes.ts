// E-mailed sign-in codes (decision 023). The code itself lives in the browser's `_totp` cookie
// (remix-auth-totp: an encrypted JWE); this table holds what the cookie cannot be trusted with:
// which address a code was sent to, how many wrong codes were typed, and whether it was used.
// Rows exist only for addresses that got a mail (known clients and invitations).
// Frozen in time: never import app code here.
import { sql, type Kysely } from "kysely";

export async function up(db: Kysely<any>): Promise<void> {
  await sql`CREATE TABLE sign_in_codes (
    id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
    email text NOT NULL CHECK (length(email) BETWEEN 3 AND 320),
    token_hash text NOT NULL UNIQUE CHECK (token_hash ~ '^[0-9a-f]{64}$'),
    link_hash text NOT NULL UNIQUE CHECK (link_hash ~ '^[0-9a-f]{64}$'),
    attempts integer NOT NULL DEFAULT 0 CHECK (attempts >= 0),
    created_at timestamptz NOT NULL DEFAULT now(),
    expires_at timestamptz NOT NULL,
    used_at timestamptz
  )`.execute(db);
  await sql`CREATE INDEX sign_in_codes_expires_idx ON sign_in_codes (expires_at)`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`DROP TABLE IF EXISTS sign_in_codes`.execute(db);
}
