// Client requests as people make them: the client asks on their handoff page, the
// builder gets the e-mail, opens the build's Requests tab (its badge counts what waits), takes the
// request in hand with a reply, is refused a decline without a reason, closes it, and the client
// gets the answer by e-mail; the builder also logs a request a client made by phone. Bad input
// at the API: 4xx with a message, nothing stored.
import type pg from "pg";
import { test, expect, BASE_URL, signInRequest } from "./fixtures";

async function newBuild(sql: pg.Pool, name: string): Promise<string> {
  const r = await sql.query(
    `INSERT INTO builds (workshop_id, name, client_name, client_user_id, status, config, config_saved_at)
     SELECT workshop_id, $1, 'Client One', (SELECT id FROM users WHERE email = 'client-one@example.test'), 'released', config, now() FROM builds WHERE name = 'Kestrel' ORDER BY created_at LIMIT 1 RETURNING id`,
    [name],
  );
  return r.rows[0].id;
}

async function mailTo(sql: pg.Pool, to: string, subject: string): Promise<{ text_body: string }> {
  let row: { text_body: string } | undefined;
  await expect
    .poll(async () => {
      row = (await sql.query("SELECT text_body FROM mail_sink_messages WHERE $1 = ANY(envelope_to) AND subject LIKE $2 ORDER BY received_at DESC LIMIT 1", [to, `%${subject}%`])).rows[0];
      return Boolean(row);
    }, { timeout: 20_000, message: `mail to ${to} about ${subject}` })
    .toBe(true);
  return row!;
}

test("a client asks for one more font; the builder answers on the Requests tab and the client is told", async ({ page, signIn, sql, playwright }) => {
  test.setTimeout(90_000);
  const name = `Gyrfalcon ${Date.now()}`;
  const id = await newBuild(sql, name);
  const client = await playwright.request.newContext({ baseURL: BASE_URL, extraHTTPHeaders: { Origin: BASE_URL } });
  try {
    await signInRequest(client, "client-one");
    // The client asks on their handoff page.
    await signIn("client-one");
    await page.goto(`/handoff/${id}`);
    const ask = page.getByRole("form", { name: "Send a request" });
    await ask.getByLabel("What would you like?").selectOption({ label: "One more sound font" });
    await ask.getByLabel("In your words").fill("Could the Gyrfalcon get one more font?\nSomething like a storm at sea.");
    await ask.getByRole("button", { name: "Send to the workshop" }).click();
    await expect(page.getByRole("status")).toContainText("Sent. The workshop has been told");
    await expect(page.getByTestId("my-request")).toHaveCount(1);
    await expect(page.getByTestId("my-request-status")).toHaveText("Sent, not yet read");
    await expect(ask.getByLabel("In your words")).toHaveValue("");

    // The builder hears of it by e-mail and follows the link.
    const mail = await mailTo(sql, "builder@ember-anvil.example.test", `Client One asks: one more sound font (${name})`);
    expect(mail.text_body).toContain("> Something like a storm at sea.");
    await page.context().clearCookies();
    await signIn("demo-builder");
    await page.goto(`/builds/${id}`);
    await expect(page.getByTestId("open-requests")).toHaveText("1");
    await page.getByRole("navigation", { name: "Build sections" }).getByRole("link", { name: /Requests/ }).click();
    await expect(page).toHaveURL(new RegExp(`/builds/${id}/requests$`));
    const item = page.getByTestId("client-request").first();
    await expect(item).toContainText("One more sound font");
    await expect(item).toContainText("Something like a storm at sea.");
    await expect(item.getByTestId("request-status")).toHaveText("Sent, not yet read");

    await item.getByLabel("Status").selectOption({ label: "The workshop is on it" });
    await item.getByLabel("Reply the client reads").fill("We have a stormy font ready; we will load it next week.");
    await item.getByRole("button", { name: "Save the answer" }).click();
    await expect(page.getByTestId("request-message")).toHaveText("Saved: the workshop is on it.");
    await expect(item.getByTestId("request-status")).toHaveText("The workshop is on it");
    await mailTo(sql, "client-one@example.test", `Your request about the ${name}: the workshop is on it`);

    // Declining needs a reason the client can read; nothing changes without one.
    await item.getByLabel("Status").selectOption({ label: "Declined" });
    await item.getByLabel("Reply the client reads").fill("");
    await item.getByRole("button", { name: "Save the answer" }).click();
    await expect(page.getByTestId("request-message")).toContainText("Say why in the reply when you decline a request");
    await expect(item.getByTestId("request-status")).toHaveText("The workshop is on it");

    await item.getByLabel("Status").selectOption({ label: "Done" });
    await item.getByLabel("Reply the client reads").fill("Loaded as font 4; hold the auxiliary button to reach it.");
    await item.getByRole("button", { name: "Save the answer" }).click();
    await expect(item.getByTestId("request-status")).toHaveText("Done");
    await expect(page.getByTestId("open-requests")).toHaveCount(0);
    const told = await mailTo(sql, "client-one@example.test", `Your request about the ${name}: done`);
    expect(told.text_body).toContain("> Loaded as font 4; hold the auxiliary button to reach it.");

    // The client reads the answer on their handoff page, and through the API it uses.
    const list = await (await client.get(`/api/builds/${id}/requests`)).json();
    expect(list).toMatchObject({ open: 0, requests: [{ kind: "font", status: "done", statusLabel: "Done", reply: "Loaded as font 4; hold the auxiliary button to reach it." }] });
    const clientPage = await client.get(`/handoff/${id}`);
    expect(await clientPage.text()).toContain("Loaded as font 4; hold the auxiliary button to reach it.");

    // A request made by phone, logged by the builder.
    await page.getByLabel("What kind").selectOption({ label: "Something is not working" });
    await page.getByLabel("What they asked").fill("Called: the chamber strip flickers after a drop.");
    await page.getByRole("button", { name: "Log the request" }).click();
    await expect(page.getByTestId("request-message")).toHaveText("Request logged for the client.");
    await expect(page.getByTestId("client-request").first()).toContainText("Called: the chamber strip flickers after a drop.");
    await expect(page.getByTestId("client-request").first()).toContainText("Demo Builder");
    await expect(page.getByTestId("open-requests")).toHaveText("1");
  } finally {
    await client.dispose();
    await sql.query("DELETE FROM builds WHERE id = $1", [id]);
  }
});

test("bad input at the requests API: 4xx with a message, nothing stored; a reviewer may not answer", async ({ sql, playwright }) => {
  const name = `Gyrfalcon-bad ${Date.now()}`;
  const id = await newBuild(sql, name);
  const client = await playwright.request.newContext({ baseURL: BASE_URL, extraHTTPHeaders: { Origin: BASE_URL } });
  const reviewer = await playwright.request.newContext({ baseURL: BASE_URL, extraHTTPHeaders: { Origin: BASE_URL } });
  try {
    await signInRequest(client, "client-one");
    await signInRequest(reviewer, "demo-reviewer");
    const count = async () => Number((await sql.query("SELECT count(*) FROM client_requests WHERE build_id = $1", [id])).rows[0].count);
    const cases: [unknown, number, RegExp][] = [
      [{ kind: "font", message: "   " }, 400, /message is empty/],
      [{ kind: "sword", message: "x" }, 400, /kind is one of font, colour, fault, other/],
      [{ kind: "font", message: "x".repeat(2001) }, 400, /at most 2000 characters/],
      [{ kind: "font", message: "x", status: "done" }, 400, /status/],
    ];
    for (const [data, status, message] of cases) {
      const r = await client.post(`/api/builds/${id}/requests`, { data });
      expect(r.status()).toBe(status);
      expect((await r.json()).error).toMatch(message);
    }
    const big = await client.post(`/api/builds/${id}/requests`, { data: { kind: "font", message: "x".repeat(20_000) } });
    expect(big.status()).toBe(413);
    const notJson = await client.post(`/api/builds/${id}/requests`, { headers: { "Content-Type": "application/json" }, data: "{kind:" });
    expect(notJson.status()).toBe(400);
    expect(await count()).toBe(0);
    const made = await client.post(`/api/builds/${id}/requests`, { data: { kind: "colour", message: "A warmer blade, please." } });
    const reqId = (await made.json()).id;
    const byReviewer = await reviewer.put(`/api/builds/${id}/requests/${reqId}`, { data: { status: "done", version: 1 } });
    expect(byReviewer.status()).toBe(403);
    const byClient = await client.put(`/api/builds/${id}/requests/${reqId}`, { data: { status: "done", version: 1 } });
    expect(byClient.status()).toBe(403);
    // Another client's build is not there for this client.
    const other = (await sql.query("SELECT id FROM builds WHERE name = 'Harrier'")).rows[0].id;
    expect((await client.post(`/api/builds/${other}/requests`, { data: { kind: "font", message: "x" } })).status()).toBe(404);
    const row = (await sql.query("SELECT status, version FROM client_requests WHERE id = $1", [reqId])).rows[0];
    expect(row).toEqual({ status: "open", version: 1 });
  } finally {
    await client.dispose();
    await reviewer.dispose();
    await sql.query("DELETE FROM builds WHERE id = $1", [id]);
  }
});
