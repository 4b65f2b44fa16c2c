// Workshop templates: a name per workshop and an append-only list of versions. A save is a new
// version row; nothing here ever updates a version. Every read is scoped to the workshop.
import { sql, type Kysely } from "kysely";
import type { Database, TemplateUses } from "../db/types";
import { partialsUsed } from "../template/partials-used";
import { isUuid } from "./builds.server";
import { isInt4 } from "../input/edges";

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
  if (!isUuid(id) || (version !== undefined && !isInt4(version, 1))) return undefined;
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

/**
 * What `source` uses, followed through the templates it uses: each workshop template reached by
 * `use "name"`, at its latest version now. A name that is no workshop template (a built-in, or
 * nothing yet) is left out and resolves as it does today.
 */
export async function usesOf(db: Db, workshopId: string, source: string): Promise<TemplateUses> {
  const uses: TemplateUses = Object.create(null);
  // Every name looked up once, found or not (a built-in or unknown name is simply not recorded).
  const asked = new Set(partialsUsed(source));
  let pending = [...asked];
  while (pending.length) {
    const rows = await db
      .selectFrom("template_versions as v")
      .innerJoin("templates as t", "t.id", "v.template_id")
      .select(["t.id", "t.name", "v.version", "v.source"])
      .where("t.workshop_id", "=", workshopId)
      .where("t.name", "in", pending)
      .where("v.version", "=", (eb) => eb.selectFrom("template_versions as w").select((e) => e.fn.max("w.version").as("m")).whereRef("w.template_id", "=", "t.id"))
      .execute();
    pending = [];
    for (const r of rows) {
      uses[r.name] = { id: r.id, version: r.version };
      for (const n of partialsUsed(r.source))
        if (!asked.has(n)) {
          asked.add(n);
          pending.push(n);
        }
    }
  }
  return uses;
}

/**
 * The partials a saved version recorded when it was saved. A version saved before they were
 * recorded records them now, once, so from its first render on its output no longer follows
 * later edits of its partials. Empty for a version that is not the workshop's.
 */
export async function recordedUses(db: Db, workshopId: string, id: string, version: number): Promise<TemplateUses> {
  const row = await db
    .selectFrom("template_versions as v")
    .innerJoin("templates as t", "t.id", "v.template_id")
    .select(["v.source", "v.uses"])
    .where("t.workshop_id", "=", workshopId)
    .where("v.template_id", "=", id)
    .where("v.version", "=", version)
    .executeTakeFirst();
  if (!row) return Object.create(null);
  if (row.uses) return row.uses;
  await db
    .updateTable("template_versions")
    .set({ uses: JSON.stringify(await usesOf(db, workshopId, row.source)) })
    .where("template_id", "=", id)
    .where("version", "=", version)
    .where("uses", "is", null)
    .execute();
  // Read back: a render racing this one may have recorded first, and its record is the one kept.
  const again = await db.selectFrom("template_versions").select("uses").where("template_id", "=", id).where("version", "=", version).executeTakeFirstOrThrow();
  return again.uses ?? Object.create(null);
}

/** name → source of the partials a saved version renders with: the versions it recorded. */
export async function sourcesForVersion(db: Db, workshopId: string, id: string, version: number): Promise<{ sources: Record<string, string>; uses: TemplateUses }> {
  const uses = await recordedUses(db, workshopId, id, version);
  const sources: Record<string, string> = Object.create(null);
  const pairs = Object.entries(uses);
  if (pairs.length) {
    const rows = await db
      .selectFrom("template_versions as v")
      .innerJoin("templates as t", "t.id", "v.template_id")
      .select(["t.id", "v.version", "v.source"])
      .where("t.workshop_id", "=", workshopId)
      .where((eb) => eb.or(pairs.map(([, u]) => eb.and([eb("v.template_id", "=", u.id), eb("v.version", "=", u.version)]))))
      .execute();
    const byKey = new Map(rows.map((r) => [`${r.id}@${r.version}`, r.source]));
    // A partial deleted since (only possible when no pinned build needed it) is simply missing.
    for (const [name, u] of pairs) {
      const src = byKey.get(`${u.id}@${u.version}`);
      if (src !== undefined) sources[name] = src;
    }
  }
  return { sources, uses };
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
    const uses = JSON.stringify(await usesOf(trx, workshopId, source));
    await trx.insertInto("template_versions").values({ template_id: row.id, version: 1, source, created_by: userId, uses }).execute();
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
  // The partials' versions as they are now: what this version renders with from now on.
  const uses = JSON.stringify(await usesOf(db, workshopId, source));
  const r = await db
    .insertInto("template_versions")
    .columns(["template_id", "version", "source", "created_by", "uses"])
    .expression((eb) =>
      eb
        .selectFrom("template_versions")
        .select((e) => [
          e.val(id).as("template_id"),
          e(e.fn.max("version"), "+", 1).as("version"),
          e.val(source).as("source"),
          e.val(userId).as("created_by"),
          sql<string>`${uses}::jsonb`.as("uses"),
        ])
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

/** PostgreSQL's foreign_key_violation: a row still refers to one being deleted, or no longer exists. */
export function isForeignKeyViolation(e: unknown): boolean {
  return typeof e === "object" && e !== null && (e as { code?: unknown }).code === "23503";
}

/** What stops a template from being deleted; every list empty means nothing depends on it. */
export type TemplateDependents = {
  /** Builds (archived ones too) pinned to one of its versions. */
  pinnedBy: { id: string; name: string; version: number; archived: boolean }[];
  /** Other templates whose latest version uses it as a partial. */
  usedBy: { id: string; name: string }[];
  /** Builds pinned to an older version of another template, and that version uses it. */
  usedThroughPins: { id: string; name: string; template: string; version: number }[];
};

export const hasDependents = (d: TemplateDependents) => d.pinnedBy.length + d.usedBy.length + d.usedThroughPins.length > 0;

/** One sentence naming everything that depends on the template, for a 409 and for the page. */
export function describeDependents(name: string, d: TemplateDependents): string {
  const parts: string[] = [];
  const builds = (xs: { name: string; archived?: boolean; version: number }[]) =>
    xs.map((b) => `${b.name}${b.archived ? " (archived)" : ""} (v${b.version})`).join(", ");
  if (d.pinnedBy.length) parts.push(`${d.pinnedBy.length === 1 ? "build" : "builds"} ${builds(d.pinnedBy)} ${d.pinnedBy.length === 1 ? "is" : "are"} pinned to it`);
  if (d.usedBy.length) parts.push(`${d.usedBy.length === 1 ? "template" : "templates"} ${d.usedBy.map((t) => t.name).join(", ")} ${d.usedBy.length === 1 ? "uses" : "use"} it as a partial`);
  for (const b of d.usedThroughPins) parts.push(`build ${b.name} is pinned to ${b.template} v${b.version}, which uses it`);
  return `'${name}' cannot be deleted: ${parts.join("; ")}. Nothing was deleted.`;
}

/** Builds and templates of the workshop that would break if template `id` (named `name`) went. */
export async function templateDependents(db: Db, workshopId: string, id: string, name: string): Promise<TemplateDependents> {
  const pins = await db
    .selectFrom("builds as b")
    .innerJoin("template_versions as v", (j) => j.onRef("v.template_id", "=", "b.pinned_template_id").onRef("v.version", "=", "b.pinned_template_version"))
    .innerJoin("templates as t", "t.id", "v.template_id")
    .select(["b.id", "b.name", "b.archived_at", "t.id as template_id", "t.name as template_name", "v.version", "v.source", "v.uses"])
    .where("b.workshop_id", "=", workshopId)
    .orderBy("b.name")
    .execute();
  const latest = await db
    .selectFrom("template_versions as v")
    .innerJoin("templates as t", "t.id", "v.template_id")
    .select(["t.id", "t.name", "v.source"])
    .where("t.workshop_id", "=", workshopId)
    .where("t.id", "!=", id)
    .where("v.version", "=", (eb) => eb.selectFrom("template_versions as w").select((e) => e.fn.max("w.version").as("m")).whereRef("w.template_id", "=", "t.id"))
    .orderBy("t.name")
    .execute();
  const usedBy = latest.filter((t) => partialsUsed(t.source).has(name)).map((t) => ({ id: t.id, name: t.name }));
  const latestSource = new Map(latest.map((t) => [t.id, t.source]));
  return {
    pinnedBy: pins.filter((p) => p.template_id === id).map((p) => ({ id: p.id, name: p.name, version: p.version, archived: p.archived_at !== null })),
    usedBy,
    // A pin on another template's latest version is already covered by usedBy.
    usedThroughPins: pins
      // Through the pinned version's recorded partials too: it may reach this one through another.
      .filter(
        (p) =>
          p.template_id !== id &&
          ((latestSource.get(p.template_id) !== p.source && partialsUsed(p.source).has(name)) || Object.values(p.uses ?? {}).some((u) => u.id === id)),
      )
      .map((p) => ({ id: p.id, name: p.name, template: p.template_name, version: p.version })),
  };
}

export type DeleteResult = { kind: "deleted"; name: string; versions: number } | { kind: "missing" } | { kind: "in-use"; name: string; dependents: TemplateDependents };

/**
 * Delete a workshop template and all its versions, in one transaction, unless something
 * depends on it. The template row is locked first: a build being pinned to it at the same
 * moment either commits before the check (and is found) or waits and then fails its foreign
 * key; should a pin slip in anyway, the RESTRICT foreign key refuses the delete.
 */
export async function deleteTemplate(db: Db, workshopId: string, id: string): Promise<DeleteResult> {
  if (!isUuid(id)) return { kind: "missing" };
  try {
    return await db.transaction().execute(async (trx) => {
      const t = await trx.selectFrom("templates").select(["id", "name"]).where("workshop_id", "=", workshopId).where("id", "=", id).forUpdate().executeTakeFirst();
      if (!t) return { kind: "missing" } as const;
      const dependents = await templateDependents(trx, workshopId, id, t.name);
      if (hasDependents(dependents)) return { kind: "in-use", name: t.name, dependents } as const;
      const count = await trx.selectFrom("template_versions").select((e) => e.fn.countAll<string>().as("n")).where("template_id", "=", id).executeTakeFirstOrThrow();
      await trx.deleteFrom("templates").where("id", "=", id).execute();
      return { kind: "deleted", name: t.name, versions: Number(count.n) } as const;
    });
  } catch (e) {
    if (!isForeignKeyViolation(e)) throw e;
    const t = await getTemplate(db, workshopId, id);
    if (!t) return { kind: "missing" };
    return { kind: "in-use", name: t.name, dependents: await templateDependents(db, workshopId, id, t.name) };
  }
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
