// Client requests: what a client asks for after handoff (one more font, a colour change, a fault),
// kept per build with its status and the workshop's reply. `version` moves on every change by the
// workshop, so two people answering at once cannot overwrite each other (a stale change is a 409).
// Frozen in time: never import app code here.
import { sql, type Kysely } from "kysely";

export async function up(db: Kysely<any>): Promise<void> {
  await sql`CREATE TABLE client_requests (
    id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
    build_id uuid NOT NULL REFERENCES builds(id) ON DELETE CASCADE,
    workshop_id uuid NOT NULL,
    kind text NOT NULL CHECK (kind IN ('font', 'colour', 'fault', 'other')),
    message text NOT NULL CHECK (length(message) BETWEEN 1 AND 2000),
    status text NOT NULL DEFAULT 'open' CHECK (status IN ('open', 'in-hand', 'done', 'declined')),
    reply text NOT NULL DEFAULT '' CHECK (length(reply) <= 2000),
    asked_by uuid REFERENCES users(id) ON DELETE SET NULL,
    asked_at timestamptz NOT NULL DEFAULT now(),
    handled_by uuid REFERENCES users(id) ON DELETE SET NULL,
    updated_at timestamptz NOT NULL DEFAULT now(),
    version integer NOT NULL DEFAULT 1 CHECK (version >= 1)
  )`.execute(db);
  await sql`CREATE INDEX client_requests_build_idx ON client_requests (build_id, asked_at DESC)`.execute(db);
  await sql`CREATE INDEX client_requests_open_idx ON client_requests (workshop_id, asked_at DESC) WHERE status IN ('open', 'in-hand')`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`DROP TABLE IF EXISTS client_requests`.execute(db);
}
