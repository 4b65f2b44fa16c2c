// Helpers shared by the template specs: arranging templates directly in the database, putting a
// build back as it was, and typing into the template editor.
import { randomBytes } from "node:crypto";
import type { Page } from "@playwright/test";
import type pg from "pg";

export const uniq = () => randomBytes(3).toString("hex");

/** A workshop template made directly in the database (for tests about something else). */
export async function insertTemplate(sql: pg.Pool, name: string, sources: string[], workshopId?: string): Promise<string> {
  const ws = workshopId ?? (await sql.query("SELECT workshop_id FROM builds WHERE name = 'Kestrel' LIMIT 1")).rows[0].workshop_id;
  const t = await sql.query("INSERT INTO templates (workshop_id, name) VALUES ($1, $2) RETURNING id", [ws, name]);
  for (const [i, s] of sources.entries()) await sql.query("INSERT INTO template_versions (template_id, version, source) VALUES ($1, $2, $3)", [t.rows[0].id, i + 1, s]);
  return t.rows[0].id;
}

/** Puts a build's pin and config back as they were after `body`. */
export async function keepingBuild(sql: pg.Pool, id: string, body: () => Promise<void>) {
  const before = (await sql.query("SELECT config, pinned_template_id, pinned_template_version FROM builds WHERE id = $1", [id])).rows[0];
  try {
    await body();
  } finally {
    await sql.query("UPDATE builds SET config = $2, config_version = config_version + 1, pinned_template_id = $3, pinned_template_version = $4 WHERE id = $1", [
      id,
      JSON.stringify(before.config),
      before.pinned_template_id,
      before.pinned_template_version,
    ]);
  }
}

/** Puts the cursor at the very start of the template editor and inserts text there. */
export async function typeAtStart(page: Page, text: string) {
  await page.locator("[data-testid=template-editor] .cm-content").click();
  await page.keyboard.press("Control+Home");
  await page.keyboard.insertText(text);
}

/** Replaces everything in the template editor with `text`. */
export async function replaceSource(page: Page, text: string) {
  await page.locator("[data-testid=template-editor] .cm-content").click();
  await page.keyboard.press("Control+A");
  await page.keyboard.insertText(text);
}
