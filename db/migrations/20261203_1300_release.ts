// The bench check and the release.
// - `bench_check_ticks`: one row per ticked item of a revision's bench check. The checklist itself
//   is not stored: it is generated from the revision (app/lib/release/), so only ticks are facts.
//   Unticking deletes the row. A tick belongs to one revision; a new revision starts unticked.
// - `releases`: one immutable row per release of a build, numbered 1, 2, … per build: the
//   revision handed over, the template (and its version) and name rules its bundle was made with, and the bundle's
//   size and SHA-256 (the zip is byte-identical for the same inputs, so the checksum names it).
//   A trigger refuses UPDATE and DELETE, with the same two database-made exits as revisions: the
//   build's cascade, and `released_by` set to NULL when an account goes.
// Frozen in time: never import app code here.
import { sql, type Kysely } from "kysely";

export async function up(db: Kysely<any>): Promise<void> {
  await sql`CREATE TABLE bench_check_ticks (
    build_id uuid NOT NULL,
    revision integer NOT NULL,
    item_key text NOT NULL CHECK (length(item_key) BETWEEN 1 AND 200),
    ticked_by uuid REFERENCES users(id) ON DELETE SET NULL,
    ticked_at timestamptz NOT NULL DEFAULT now(),
    PRIMARY KEY (build_id, revision, item_key),
    FOREIGN KEY (build_id, revision) REFERENCES config_revisions (build_id, number) ON DELETE CASCADE
  )`.execute(db);

  await sql`CREATE TABLE releases (
    id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
    build_id uuid NOT NULL REFERENCES builds(id) ON DELETE CASCADE,
    workshop_id uuid NOT NULL,
    number integer NOT NULL CHECK (number >= 1),
    revision integer NOT NULL,
    template_ref text NOT NULL CHECK (length(template_ref) BETWEEN 1 AND 200),
    template_version integer NOT NULL CHECK (template_version >= 1),
    name_mode text NOT NULL CHECK (name_mode IN ('long', '8.3')),
    card_gb numeric NOT NULL CHECK (card_gb > 0),
    bundle_sha256 text NOT NULL CHECK (bundle_sha256 ~ '^[0-9a-f]{64}$'),
    bundle_bytes bigint NOT NULL CHECK (bundle_bytes > 0),
    note text NOT NULL DEFAULT '' CHECK (length(note) <= 2000),
    released_by uuid REFERENCES users(id) ON DELETE SET NULL,
    released_at timestamptz NOT NULL DEFAULT now(),
    UNIQUE (build_id, number),
    FOREIGN KEY (build_id, revision) REFERENCES config_revisions (build_id, number) ON DELETE CASCADE
  )`.execute(db);
  await sql`CREATE INDEX releases_workshop_idx ON releases (workshop_id, released_at DESC)`.execute(db);

  await sql`CREATE FUNCTION releases_immutable() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      IF TG_OP = 'DELETE' THEN
        IF EXISTS (SELECT 1 FROM builds WHERE id = OLD.build_id) THEN
          RAISE EXCEPTION 'releases are immutable: delete the whole build instead';
        END IF;
        RETURN OLD;
      END IF;
      IF NEW.released_by IS NULL AND OLD.released_by IS NOT NULL
         AND (to_jsonb(NEW) - 'released_by') = (to_jsonb(OLD) - 'released_by') THEN
        RETURN NEW;
      END IF;
      RAISE EXCEPTION 'releases are immutable';
    END $$`.execute(db);
  await sql`CREATE TRIGGER releases_immutable BEFORE UPDATE OR DELETE ON releases
    FOR EACH ROW EXECUTE FUNCTION releases_immutable()`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`DROP TABLE IF EXISTS releases`.execute(db);
  await sql`DROP FUNCTION IF EXISTS releases_immutable()`.execute(db);
  await sql`DROP TABLE IF EXISTS bench_check_ticks`.execute(db);
}
