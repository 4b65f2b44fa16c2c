// Workshop templates: a name per workshop and an append-only list of versions. A save is a new
// version row; nothing here ever updates a version. Every read is scoped to the workshop.
import type { Kysely } from "kysely";
import type { Database } from "../db/types";
import { isUuid } from "./builds.server";

type Db = Kysely<Database>;

export type TemplateSummary = { id: string; name: string; latest: number; updatedAt: Date; createdAt: Date };

export async function listTemplates(db: Db, workshopId: string): Promise<TemplateSummary[]> {
  const rows = await db
    .selectFrom("templates as t")
    .innerJoin("template_versions as v", "v.template_id", "t.id")
    .select(["t.id", "t.name", "t.created_at"])
    .select((eb) => [eb.fn.max("v.version").as("latest"), eb.fn.max("v.created_at").as("updated_at")])
    .where("t.workshop_id", "=", workshopId)
    .groupBy(["t.id", "t.name", "t.created_at"])
    .orderBy("t.name")
    .execute();
  return rows.map((r) => ({ id: r.id, name: r.name, latest: Number(r.latest), updatedAt: new Date(r.updated_at as unknown as string), createdAt: r.created_at }));
}

export async function getTemplate(db: Db, workshopId: string, id: string) {
  if (!isUuid(id)) return undefined;
  return db.selectFrom("templates").selectAll().where("workshop_id", "=", workshopId).where("id", "=", id).executeTakeFirst();
}

export async function findTemplateByName(db: Db, workshopId: string, name: string) {
  return db.selectFrom("templates").selectAll().where("workshop_id", "=", workshopId).where("name", "=", name).executeTakeFirst();
}

/** One version of a workshop template (the latest when `version` is omitted). */
export async function getTemplateVersion(db: Db, workshopId: string, id: string, version?: number) {
  if (!isUuid(id)) return undefined;
  let q = db
    .selectFrom("template_versions as v")
    .innerJoin("templates as t", "t.id", "v.template_id")
    .leftJoin("users as u", "u.id", "v.created_by")
    .select(["t.id", "t.name", "v.version", "v.source", "v.created_at", "u.display_name as author"])
    .where("t.workshop_id", "=", workshopId)
    .where("t.id", "=", id);
  q = version === undefined ? q.orderBy("v.version", "desc").limit(1) : q.where("v.version", "=", version);
  return q.executeTakeFirst();
}

export async function listVersions(db: Db, workshopId: string, id: string) {
  if (!isUuid(id)) return [];
  return db
    .selectFrom("template_versions as v")
    .innerJoin("templates as t", "t.id", "v.template_id")
    .leftJoin("users as u", "u.id", "v.created_by")
    .select(["v.version", "v.created_at", "u.display_name as author"])
    .where("t.workshop_id", "=", workshopId)
    .where("t.id", "=", id)
    .orderBy("v.version", "desc")
    .execute();
}

/** name → source of each template's latest version: what `use "name"(…)` resolves to. */
export async function latestSources(db: Db, workshopId: string): Promise<Record<string, string>> {
  const rows = await db
    .selectFrom("template_versions as v")
    .innerJoin("templates as t", "t.id", "v.template_id")
    .select(["t.name", "v.source"])
    .where("t.workshop_id", "=", workshopId)
    .where("v.version", "=", (eb) => eb.selectFrom("template_versions as w").select((e) => e.fn.max("w.version").as("m")).whereRef("w.template_id", "=", "t.id"))
    .execute();
  const out: Record<string, string> = Object.create(null);
  for (const r of rows) out[r.name] = r.source;
  return out;
}

export type CreateResult = { kind: "created"; id: string } | { kind: "taken" };

/** A new template with its version 1, or "taken" when the workshop already has the name. */
export async function createTemplate(db: Db, workshopId: string, userId: string | null, name: string, source: string): Promise<CreateResult> {
  return db.transaction().execute(async (trx) => {
    const row = await trx
      .insertInto("templates")
      .values({ workshop_id: workshopId, name, created_by: userId })
      .onConflict((oc) => oc.constraint("templates_workshop_name_key").doNothing())
      .returning("id")
      .executeTakeFirst();
    if (!row) return { kind: "taken" } as const;
    await trx.insertInto("template_versions").values({ template_id: row.id, version: 1, source, created_by: userId }).execute();
    return { kind: "created", id: row.id } as const;
  });
}

export type SaveVersionResult = { kind: "saved"; version: number } | { kind: "stale"; latest: number } | { kind: "missing" };

/**
 * Store `source` as the next version, only if the latest version is still `expectedLatest`
 * (the one the editor was opened at); two saves from the same version cannot both win, since
 * (template_id, version) is the primary key.
 */
export async function saveTemplateVersion(db: Db, workshopId: string, id: string, userId: string | null, source: string, expectedLatest: number): Promise<SaveVersionResult> {
  const t = await getTemplate(db, workshopId, id);
  if (!t) return { kind: "missing" };
  const r = await db
    .insertInto("template_versions")
    .columns(["template_id", "version", "source", "created_by"])
    .expression((eb) =>
      eb
        .selectFrom("template_versions")
        .select((e) => [e.val(id).as("template_id"), e(e.fn.max("version"), "+", 1).as("version"), e.val(source).as("source"), e.val(userId).as("created_by")])
        .where("template_id", "=", id)
        .having((e) => e.fn.max("version"), "=", expectedLatest),
    )
    .onConflict((oc) => oc.columns(["template_id", "version"]).doNothing())
    .returning("version")
    .executeTakeFirst();
  if (r) return { kind: "saved", version: r.version };
  const latest = await getTemplateVersion(db, workshopId, id);
  return { kind: "stale", latest: latest?.version ?? 0 };
}

/** Pin a build to a template version (both null: back to the built-in generic header). */
export async function pinTemplate(db: Db, workshopId: string, buildId: string, pin: { templateId: string; version: number } | null) {
  const r = await db
    .updateTable("builds")
    .set({ pinned_template_id: pin?.templateId ?? null, pinned_template_version: pin?.version ?? null })
    .where("workshop_id", "=", workshopId)
    .where("id", "=", buildId)
    .executeTakeFirst();
  return Number(r.numUpdatedRows) === 1;
}
