// Where a build's presets came from, over its revisions: one row each time a preset's library
// origin is set or cleared, with the revision it holds from. `build_preset_origins` stays the
// current state; this log lets restoring revision N put back the origins revision N had (an
// update then merges from the library version those looks really came from). A row with a null
// library preset means "no library origin from this revision on". No foreign key to library
// versions: an unused version may still be deleted; a restore skips an origin whose version is gone.
// Backfill: each current origin, from the first revision saved at or after it was recorded (the
// save and the origin share a transaction), else the build's current revision.
// Frozen in time: never import app code here.
import { sql, type Kysely } from "kysely";

export async function up(db: Kysely<any>): Promise<void> {
  await sql`CREATE TABLE preset_origin_events (
    id bigserial PRIMARY KEY,
    build_id uuid NOT NULL REFERENCES builds(id) ON DELETE CASCADE,
    preset_id text NOT NULL,
    revision integer NOT NULL CHECK (revision >= 1),
    library_preset_id uuid REFERENCES library_presets(id) ON DELETE CASCADE,
    library_version integer CHECK (library_version >= 1),
    recorded_at timestamptz NOT NULL DEFAULT now(),
    CHECK ((library_preset_id IS NULL) = (library_version IS NULL))
  )`.execute(db);
  await sql`CREATE INDEX preset_origin_events_build_idx ON preset_origin_events (build_id, preset_id, revision DESC, id DESC)`.execute(db);
  await sql`INSERT INTO preset_origin_events (build_id, preset_id, revision, library_preset_id, library_version, recorded_at)
    SELECT o.build_id, o.preset_id,
           coalesce((SELECT min(r.number) FROM config_revisions r WHERE r.build_id = o.build_id AND r.created_at >= o.added_at), b.config_version),
           o.library_preset_id, o.library_version, o.added_at
    FROM build_preset_origins o JOIN builds b ON b.id = o.build_id`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`DROP TABLE IF EXISTS preset_origin_events`.execute(db);
}
