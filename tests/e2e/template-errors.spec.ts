// Template errors a person can act on: each diagnostic in the editor quotes its line with a
// caret under the column, a workshop without builds still gets its template checked, and a
// refused save lists what was wrong (and stores nothing).
import type { Page } from "@playwright/test";
import type pg from "pg";
import { test, expect } from "./fixtures";
import { insertTemplate, replaceSource, typeAtStart, uniq } from "./template-helpers";

const versionCount = async (sql: pg.Pool, id: string) => (await sql.query("SELECT count(*)::int AS n FROM template_versions WHERE template_id = $1", [id])).rows[0].n as number;

/** A frame's text exactly as shown (Playwright's text matchers fold the spaces a caret needs). */
const frameText = (page: Page, i = 0, within = "problems") => page.getByTestId(within).getByTestId("code-frame").nth(i).evaluate((el) => el.textContent);

/** Horizontal distance between the caret and the first character of `word` on the frame's quoted line. */
async function caretOffset(page: Page, within: string, i: number, word: string): Promise<number> {
  return page
    .getByTestId(within)
    .getByTestId("code-frame")
    .nth(i)
    .evaluate((pre, w) => {
      const caret = pre.querySelector("[data-testid=code-frame-caret]")!;
      const quoted = [...pre.querySelectorAll("span")].find((s) => s.textContent!.startsWith(">"))!;
      const text = quoted.firstChild as Text;
      const range = document.createRange();
      const at = text.data.indexOf(w);
      range.setStart(text, at);
      range.setEnd(text, at + 1);
      return Math.abs(range.getBoundingClientRect().left - caret.getBoundingClientRect().left);
    }, word);
}

test("a diagnostic quotes its line with a caret under the column, and a refused save lists its errors", async ({ page, signIn, sql }) => {
  const id = await insertTemplate(sql, `frames-${uniq()}`, ["Build: @( meta.buildName )@\nEnd\n"]);
  try {
    await signIn("demo-builder");
    await page.goto(`/templates/${id}`);
    await expect(page.getByTestId("problems-none")).toBeVisible();

    // A misspelt field in a new first line.
    await typeAtStart(page, "@( config.rig.chanels )@ channels\n");
    const problem = page.getByTestId("problems").getByTestId("problem");
    await expect(problem).toHaveCount(1);
    await expect(problem).toContainText("1:15 error (check): unknown field 'chanels' on rig — did you mean 'channels'?");
    expect(await frameText(page)).toBe(["> 1 | @( config.rig.chanels )@ channels", `    | ${" ".repeat(14)}^^^^^^^`].join("\n"));
    await expect(problem.getByTestId("code-frame-caret")).toHaveText("^^^^^^^");
    expect(await caretOffset(page, "problems", 0, "chanels")).toBeLessThan(1);

    // A second broken tag further down: its frame shows the line before it too.
    await page.keyboard.press("Control+End");
    await page.keyboard.insertText("Client: @( meta.clientNme )@\n");
    await expect(problem).toHaveCount(2);
    await expect(problem.nth(1)).toContainText("4:17 error (check): unknown field 'clientNme' on meta — did you mean 'clientName'?");
    expect(await frameText(page, 1)).toBe(["  3 | End", "> 4 | Client: @( meta.clientNme )@", `    | ${" ".repeat(16)}^^^^^^^^^`].join("\n"));
    expect(await caretOffset(page, "problems", 1, "clientNme")).toBeLessThan(1);

    // Clicking a problem's line:column puts the editor's cursor on that line; typing lands there.
    await problem.nth(0).getByRole("button", { name: "1:15" }).click();
    await expect(page.locator("[data-testid=template-editor] .cm-activeLine")).toHaveText("@( config.rig.chanels )@ channels");
    await problem.nth(1).getByRole("button", { name: "4:17" }).click();
    await expect(page.locator("[data-testid=template-editor] .cm-activeLine")).toHaveText("Client: @( meta.clientNme )@");
    await page.keyboard.press("End");
    await page.keyboard.insertText(" // here");
    await expect(page.locator("[data-testid=template-editor] .cm-activeLine")).toHaveText("Client: @( meta.clientNme )@ // here");
    await page.keyboard.press("Backspace");
    for (let i = 0; i < " // her".length; i++) await page.keyboard.press("Backspace");

    // Saving it is refused; the answer lists both errors with their frames, and nothing is stored.
    await page.getByRole("button", { name: "Save as version 2" }).click();
    await expect(page.getByTestId("save-status")).toHaveText("The template has 2 errors; nothing was saved.");
    const refused = page.getByTestId("save-errors");
    await expect(refused).toContainText("Fix these in the source and save again");
    await expect(refused.getByTestId("save-error")).toHaveCount(2);
    await expect(refused.getByTestId("save-error").nth(0)).toContainText("1:15 error (check): unknown field 'chanels' on rig — did you mean 'channels'?");
    await expect(refused.getByTestId("save-error").nth(1)).toContainText("4:17 error (check): unknown field 'clientNme' on meta — did you mean 'clientName'?");
    expect(await frameText(page, 0, "save-errors")).toBe(["> 1 | @( config.rig.chanels )@ channels", `    | ${" ".repeat(14)}^^^^^^^`].join("\n"));
    expect(await frameText(page, 1, "save-errors")).toBe(["  3 | End", "> 4 | Client: @( meta.clientNme )@", `    | ${" ".repeat(16)}^^^^^^^^^`].join("\n"));
    expect(await versionCount(sql, id)).toBe(1);

    // Fixed, it saves, and the list of refused errors goes away.
    await replaceSource(page, "@( config.rig.channels[0].pixels )@ pixels\nBuild: @( meta.buildName )@\n");
    await expect(page.getByTestId("problems-none")).toBeVisible();
    await page.getByRole("button", { name: "Save as version 2" }).click();
    await expect(page.getByTestId("save-status")).toHaveText("Saved version 2.");
    await expect(page.getByTestId("save-errors")).toHaveCount(0);
    expect(await versionCount(sql, id)).toBe(2);
  } finally {
    await sql.query("DELETE FROM templates WHERE id = $1", [id]);
  }
});

test("a workshop without builds still sees its template's problems, with code frames", async ({ page, signIn, sql }) => {
  const login = `solo-${uniq()}`;
  const ws = (await sql.query("INSERT INTO workshops (name, slug) VALUES ('Lone Bench', 'lone-' || substr(md5(random()::text), 1, 8)) RETURNING id")).rows[0].id;
  const user = (await sql.query("INSERT INTO users (github_login, display_name) VALUES ($1, 'Lone Builder') RETURNING id", [login])).rows[0].id;
  try {
    await sql.query("INSERT INTO memberships (workshop_id, user_id, role) VALUES ($1, $2, 'builder')", [ws, user]);
    const id = await insertTemplate(sql, "lone-header", ["/* lone */\n@( config.rig.chanels )@\n"], ws);
    await signIn(login);
    await page.goto(`/templates/${id}`);
    await expect(page.getByText("Your workshop has no builds to preview with.")).toBeVisible();
    const problem = page.getByTestId("problems").getByTestId("problem");
    await expect(problem).toHaveCount(1);
    await expect(problem).toContainText("2:15 error (check): unknown field 'chanels' on rig — did you mean 'channels'?");
    expect(await frameText(page)).toBe(["  1 | /* lone */", "> 2 | @( config.rig.chanels )@", `    | ${" ".repeat(14)}^^^^^^^`].join("\n"));
    await expect(page.locator("[data-testid=template-editor] .cm-lintRange-error")).toHaveText("chanels");

    // Typing changes them live, as with a build: an unclosed tag, then nothing left to report.
    await page.locator("[data-testid=template-editor] .cm-content").click();
    await page.keyboard.press("Control+A");
    await page.keyboard.insertText("/* lone */\n@( meta.buildName\n");
    await expect(problem).toHaveCount(1);
    await expect(problem).toContainText("2:1 error (tokenize): this tag '@(' is never closed with ')@'");
    await expect(problem.getByTestId("code-frame-caret")).toHaveText("^^");
    await page.keyboard.press("Control+A");
    await page.keyboard.insertText("/* lone */\n@( meta.buildName )@\n");
    await expect(page.getByTestId("problems-none")).toBeVisible();
    expect(await versionCount(sql, id)).toBe(1);
  } finally {
    await sql.query("DELETE FROM workshops WHERE id = $1", [ws]);
    await sql.query("DELETE FROM users WHERE id = $1", [user]);
  }
});

test("the Render view quotes the failing template line under its error", async ({ page, signIn, sql }) => {
  const name = `broken-render-${uniq()}`;
  // Compiles (the value is only known at render) and fails when rendered.
  const source = "first line\n@( config.rig.board.dataPins[0] / 0 )@\n";
  const id = await insertTemplate(sql, name, [source]);
  try {
    const kestrel = (await sql.query("SELECT id FROM builds WHERE name = 'Kestrel' LIMIT 1")).rows[0].id;
    await signIn("demo-builder");
    await page.goto(`/builds/${kestrel}/render?template=${id}`);
    const alert = page.getByRole("alert");
    await expect(alert).toContainText("The template did not render this build:");
    await expect(alert).toContainText("2:4 (render)");
    await expect(alert).toContainText("division by zero");
    const frame = await page.getByTestId("render-error-frame").first().evaluate((el) => el.textContent);
    expect(frame).toContain("first line");
    expect(frame).toContain("@( config.rig.board.dataPins[0] / 0 )@");
    expect(frame).toContain("^");
  } finally {
    await sql.query("DELETE FROM templates WHERE id = $1", [id]);
  }
});
