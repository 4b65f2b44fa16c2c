// The demo workshop's preset library: "Ashfall embers" (two versions; the Kestrel's Ashfall
// preset came from v1, so its Looks page shows "update available") and "Tidebreak swell" (one
// version, used by the Harrier). Invented, like the rest of the demo. Safe to run again.
import type { Kysely } from "kysely";
import { demoConfig } from "../app/lib/config/demo";
import { newLayer } from "../app/lib/config/layers";
import type { Database } from "../app/lib/db/types";
import { bodyFromBuildPreset } from "../app/lib/library/adapt";
import { checkBody } from "../app/lib/library/check";
import type { PresetBody } from "../app/lib/library/format";

type Version = { body: PresetBody; changelog: string; daysAgo: number };

function emberVersions(): Version[] {
  const v1 = bodyFromBuildPreset(demoConfig(), "ashfall", { name: "Ashfall embers", tags: ["warm", "demo"], notes: "The shop's ember look: orange base, hot clash." })!.body;
  const v2 = structuredClone(v1);
  // v2: drifting embers over the base, and a slightly longer clash.
  v2.looks["main-blade"].layers.splice(1, 0, newLayer("drift", { id: "l-embr01", colors: ["#ff8a3d", "#b3124a"], bandPixels: 18, speedPixelsPerSecond: 12, opacity: 0.45 }));
  const clash = v2.looks["main-blade"].layers.find((l) => l.kind === "spark" && l.event === "clash") as { decayMs: number } | undefined;
  if (clash) clash.decayMs = 200;
  return [
    { body: v1, changelog: "First publish from the Kestrel", daysAgo: 20 },
    { body: v2, changelog: "Drifting embers; a longer clash", daysAgo: 3 },
  ];
}

function tideVersions(): Version[] {
  const v1 = bodyFromBuildPreset(demoConfig(), "tidebreak", { name: "Tidebreak swell", tags: ["cool", "demo"], notes: "Blue to teal, calm." })!.body;
  return [{ body: v1, changelog: "First publish", daysAgo: 10 }];
}

export async function seedLibrary(db: Kysely<Database>, workshopId: string, authorId: string | null) {
  const made = new Map<string, string>();
  for (const [name, versions] of [
    ["Ashfall embers", emberVersions()],
    ["Tidebreak swell", tideVersions()],
  ] as const) {
    const exists = await db.selectFrom("library_presets").select("id").where("workshop_id", "=", workshopId).where("name", "=", name).executeTakeFirst();
    if (exists) continue;
    const last = versions[versions.length - 1].body;
    const at = (days: number) => new Date(Date.now() - days * 86400000);
    const p = await db
      .insertInto("library_presets")
      .values({ workshop_id: workshopId, name, tags: last.tags, notes: last.notes, head_version: versions.length, created_by: authorId, created_at: at(versions[0].daysAgo), published_at: at(versions[versions.length - 1].daysAgo) })
      .returning("id")
      .executeTakeFirstOrThrow();
    made.set(name, p.id);
    let n = 0;
    for (const v of versions) {
      n += 1;
      const { counts } = checkBody(v.body);
      await db
        .insertInto("library_versions")
        .values({ preset_id: p.id, version: n, workshop_id: workshopId, body: JSON.stringify(v.body), changelog: v.changelog, author_id: authorId, created_at: at(v.daysAgo), error_count: counts.errors, warning_count: counts.warnings })
        .execute();
    }
  }
  // Where the demo builds' presets came from: the Kestrel's Ashfall from v1 (an update waits), the Harrier's Tidebreak from v1.
  const origins: [build: string, preset: string, library: string][] = [
    ["Kestrel", "ashfall", "Ashfall embers"],
    ["Harrier", "tidebreak", "Tidebreak swell"],
  ];
  for (const [build, preset, library] of origins) {
    const libId = made.get(library);
    if (!libId) continue;
    const b = await db.selectFrom("builds").select(["id", "config_version"]).where("workshop_id", "=", workshopId).where("name", "=", build).executeTakeFirst();
    if (!b) continue;
    const set = await db.insertInto("build_preset_origins").values({ build_id: b.id, preset_id: preset, workshop_id: workshopId, library_preset_id: libId, library_version: 1 }).onConflict((oc) => oc.doNothing()).executeTakeFirst();
    // The origin's history too, from the build's first revision (restoring it keeps the origin).
    if (Number(set.numInsertedOrUpdatedRows ?? 0) > 0)
      await db.insertInto("preset_origin_events").values({ build_id: b.id, preset_id: preset, revision: 1, library_preset_id: libId, library_version: 1 }).execute();
  }
}
