// The demo builds' fonts as real files: each received font gets synthesized WAVs for the cues
// its config names (app/lib/audio/synth.ts), uploaded through the same accept path as a
// person's upload, so storage, rows and the config agree. Promised fonts stay promised.
// Idempotent: a font that already has an upload is left alone. Generated at seed time; no
// sound file is kept in the repository.
import { mkdtemp, rm } from "node:fs/promises";
import { tmpdir } from "node:os";
import path from "node:path";
import type { Kysely } from "kysely";
import { synthFont } from "../app/lib/audio/synth";
import type { Database } from "../app/lib/db/types";
import { acceptUpload } from "../app/lib/fonts/accept.server";
import { DEFAULT_LAYOUT } from "../app/lib/fonts/layout";
import { stageWav } from "../app/lib/fonts/stage.server";
import type { FileStorage } from "../app/lib/storage/types";

/** Each demo font's fundamental, so their hums differ. */
const BASE_HZ: Record<string, number> = { ashfall: 98, glasswind: 147, tidebreak: 82.4, emberdusk: 110, northlight: 130.8 };

export async function seedDemoFonts(db: Kysely<Database>, workshopId: string, storage: FileStorage): Promise<number> {
  const builds = await db.selectFrom("builds").select(["id", "name", "config", "status"]).where("workshop_id", "=", workshopId).where("name", "in", ["Kestrel", "Harrier"]).execute();
  let n = 0;
  for (const b of builds) {
    for (const font of b.config.fonts) {
      if (font.status !== "received") continue;
      const has = await db.selectFrom("font_uploads").select("id").where("build_id", "=", b.id).where("font_id", "=", font.id).executeTakeFirst();
      if (has) continue;
      const dir = await mkdtemp(path.join(tmpdir(), "hb-seed-"));
      try {
        const files = [];
        for (const f of synthFont(font.cues, BASE_HZ[font.id] ?? 120))
          files.push(await stageWav((async function* () { yield f.bytes; })(), f.name, dir, Infinity));
        await acceptUpload(db, storage, { workshopId, buildId: b.id, fontId: font.id, userId: null, layout: DEFAULT_LAYOUT, files, ignored: [] });
        n++;
      } finally {
        await rm(dir, { recursive: true, force: true });
      }
    }
  }
  // Receiving a font is a config save, which sends a build in review back to configuring
  // (migration 0760). In the demo story the fonts came before the review was asked for, so each
  // build keeps the status the seed gave it.
  for (const b of builds) await db.updateTable("builds").set({ status: b.status }).where("id", "=", b.id).execute();
  return n;
}
