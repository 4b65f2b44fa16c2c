// The demo workshop, Ember & Anvil Props: three staff who sign in with GitHub, two clients who
// sign in by e-mail, and two builds. Safe to run any number of times.
import { sql, type Kysely } from "kysely";
import { demoConfig, demoConfigSmall } from "../app/lib/config/demo";
import { validate } from "../app/lib/checks/validate";
import type { Database, Role } from "../app/lib/db/types";
import { seedLibrary } from "./seed-library";

export const DEMO_PEOPLE: { login: string | null; email: string | null; name: string; role: Role }[] = [
  { login: "demo-owner", email: "owner@ember-anvil.example.test", name: "Demo Owner", role: "owner" },
  { login: "demo-builder", email: "builder@ember-anvil.example.test", name: "Demo Builder", role: "builder" },
  { login: "demo-reviewer", email: "reviewer@ember-anvil.example.test", name: "Demo Reviewer", role: "reviewer" },
  { login: null, email: "client-one@example.test", name: "Client One", role: "client" },
  { login: null, email: "client-two@example.test", name: "Client Two", role: "client" },
];

export async function seed(db: Kysely<Database>) {
  await db
    .insertInto("workshops")
    .values({ name: "Ember & Anvil Props", slug: "ember-anvil" })
    .onConflict((oc) => oc.column("slug").doNothing())
    .execute();
  const ws = await db.selectFrom("workshops").select("id").where("slug", "=", "ember-anvil").executeTakeFirstOrThrow();

  const ids = new Map<string, string>();
  for (const p of DEMO_PEOPLE) {
    const key = (p.login ?? p.email)!;
    let user = await db
      .selectFrom("users")
      .select("id")
      .where((eb) =>
        p.login ? eb(sql`lower(github_login)`, "=", p.login.toLowerCase()) : eb(sql`lower(email)`, "=", p.email!.toLowerCase()),
      )
      .executeTakeFirst();
    user ??= await db
      .insertInto("users")
      .values({ github_login: p.login, email: p.email, display_name: p.name })
      .returning("id")
      .executeTakeFirstOrThrow();
    ids.set(key, user.id);
    await db
      .insertInto("memberships")
      .values({ workshop_id: ws.id, user_id: user.id, role: p.role })
      .onConflict((oc) => oc.columns(["workshop_id", "user_id"]).doNothing())
      .execute();
  }

  const builds = [
    { name: "Kestrel", client: "client-one@example.test", clientName: "Client One", status: "configuring" as const, notes: "Brushed-steel hilt, chamber window on the emitter side, crystal under the pommel cap.", config: demoConfig() },
    { name: "Harrier", client: "client-two@example.test", clientName: "Client Two", status: "in-review" as const, notes: "Weathered bronze finish; client asked for a gentle chamber pulse.", config: demoConfigSmall() },
  ];
  for (const b of builds) {
    const exists = await db.selectFrom("builds").select("id").where("workshop_id", "=", ws.id).where("name", "=", b.name).executeTakeFirst();
    if (exists) continue;
    const savedAt = new Date();
    const row = await db
      .insertInto("builds")
      .values({
        workshop_id: ws.id,
        name: b.name,
        client_name: b.clientName,
        client_user_id: ids.get(b.client) ?? null,
        hilt_notes: b.notes,
        status: b.status,
        config: JSON.stringify(b.config),
        config_saved_at: savedAt,
      })
      .returning(["id", "config_version"])
      .executeTakeFirstOrThrow();
    // Its first revision, as every new build gets one (migration 0700).
    const found = validate(b.config);
    await db
      .insertInto("config_revisions")
      .values({
        build_id: row.id,
        workshop_id: ws.id,
        number: row.config_version,
        config: JSON.stringify(b.config),
        author_id: ids.get("demo-builder") ?? null,
        created_at: savedAt,
        message: "First config",
        template_id: null,
        template_version: null,
        error_count: found.filter((d) => d.severity === "error").length,
        warning_count: found.filter((d) => d.severity === "warning").length,
      })
      .execute();
  }
  await seedLibrary(db, ws.id, ids.get("demo-builder") ?? null);
  return { workshopId: ws.id };
}
