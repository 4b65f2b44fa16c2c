// The workshop's preset library: presets (name, tags, notes, a counter of publishes) and their
// immutable versions (the preset's looks by channel role, a changelog line, author, time and the
// validator's counts), and where a build's preset came from (library preset and version).
//
// Versions are immutable like config revisions: a trigger refuses UPDATE and DELETE, except
// - DELETE once the library preset row is gone (its ON DELETE CASCADE);
// - DELETE of a version no build uses, and only inside a transaction that first ran
//   `SET LOCAL hiltbench.version_delete = 'unused'` (the app's one guarded path; a version a
//   build's preset came from is refused even then, and the foreign key below refuses it too);
// - UPDATE that only sets `author_id` to NULL (ON DELETE SET NULL from users).
// Frozen in time: never import app code here.
import { sql, type Kysely } from "kysely";

export async function up(db: Kysely<any>): Promise<void> {
  await sql`CREATE TABLE library_presets (
    id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
    workshop_id uuid NOT NULL REFERENCES workshops(id) ON DELETE CASCADE,
    name text NOT NULL,
    tags text[] NOT NULL DEFAULT '{}',
    notes text NOT NULL DEFAULT '',
    head_version integer NOT NULL DEFAULT 0 CHECK (head_version >= 0),
    created_by uuid REFERENCES users(id) ON DELETE SET NULL,
    created_at timestamptz NOT NULL DEFAULT now(),
    published_at timestamptz NOT NULL DEFAULT now()
  )`.execute(db);
  await sql`CREATE UNIQUE INDEX library_presets_workshop_name_key ON library_presets (workshop_id, lower(name))`.execute(db);
  await sql`CREATE INDEX library_presets_tags_idx ON library_presets USING gin (tags)`.execute(db);

  await sql`CREATE TABLE library_versions (
    preset_id uuid NOT NULL REFERENCES library_presets(id) ON DELETE CASCADE,
    version integer NOT NULL CHECK (version >= 1),
    workshop_id uuid NOT NULL,
    body jsonb NOT NULL,
    changelog text NOT NULL,
    author_id uuid REFERENCES users(id) ON DELETE SET NULL,
    created_at timestamptz NOT NULL DEFAULT now(),
    error_count integer NOT NULL DEFAULT 0,
    warning_count integer NOT NULL DEFAULT 0,
    PRIMARY KEY (preset_id, version)
  )`.execute(db);

  await sql`CREATE TABLE build_preset_origins (
    build_id uuid NOT NULL REFERENCES builds(id) ON DELETE CASCADE,
    preset_id text NOT NULL,
    workshop_id uuid NOT NULL,
    library_preset_id uuid NOT NULL,
    library_version integer NOT NULL,
    added_at timestamptz NOT NULL DEFAULT now(),
    PRIMARY KEY (build_id, preset_id),
    FOREIGN KEY (library_preset_id, library_version) REFERENCES library_versions (preset_id, version)
  )`.execute(db);
  await sql`CREATE INDEX build_preset_origins_library_idx ON build_preset_origins (library_preset_id, library_version)`.execute(db);

  await sql`CREATE FUNCTION library_versions_immutable() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      IF TG_OP = 'DELETE' THEN
        IF NOT EXISTS (SELECT 1 FROM library_presets WHERE id = OLD.preset_id) THEN
          RETURN OLD;
        END IF;
        IF current_setting('hiltbench.version_delete', true) = 'unused'
           AND NOT EXISTS (SELECT 1 FROM build_preset_origins o
                           WHERE o.library_preset_id = OLD.preset_id AND o.library_version = OLD.version) THEN
          RETURN OLD;
        END IF;
        RAISE EXCEPTION 'library versions are immutable: only a version no build uses can be deleted, through the library';
      END IF;
      IF NEW.author_id IS NULL AND OLD.author_id IS NOT NULL
         AND (to_jsonb(NEW) - 'author_id') = (to_jsonb(OLD) - 'author_id') THEN
        RETURN NEW;
      END IF;
      RAISE EXCEPTION 'library versions are immutable: publish a new version instead';
    END $$`.execute(db);
  await sql`CREATE TRIGGER library_versions_immutable BEFORE UPDATE OR DELETE ON library_versions
    FOR EACH ROW EXECUTE FUNCTION library_versions_immutable()`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`DROP TABLE IF EXISTS build_preset_origins`.execute(db);
  await sql`DROP TABLE IF EXISTS library_versions`.execute(db);
  await sql`DROP TABLE IF EXISTS library_presets`.execute(db);
  await sql`DROP FUNCTION IF EXISTS library_versions_immutable()`.execute(db);
}
