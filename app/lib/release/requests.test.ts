import { describe, expect, it } from "vitest";
import { releasedMail } from "./mail";
import { formAsBody, readReleaseInput, readTickInput } from "./requests";

describe("release and tick requests", () => {
  it("reads a release body with the Bundle tab's defaults", () => {
    expect(readReleaseInput({ revision: 3 })).toEqual({ ok: true, value: { revision: 3, note: "", template: null, mode: "long", cardGb: 32 } });
    expect(readReleaseInput({ revision: 3, note: "  Handed over  ", template: "readable-copy", names: "8.3", card: 16 })).toEqual({
      ok: true,
      value: { revision: 3, note: "Handed over", template: "readable-copy", mode: "8.3", cardGb: 16 },
    });
  });

  it("names the field at fault", () => {
    const bad = (body: unknown) => {
      const r = readReleaseInput(body);
      return r.ok ? "accepted" : r.error;
    };
    expect(bad({})).toMatch(/^"revision": /);
    expect(bad({ revision: 0 })).toMatch(/"revision": revision is 1 or more/);
    expect(bad({ revision: 2 ** 31 })).toMatch(/"revision"/);
    expect(bad({ revision: 1, names: "9.9" })).toMatch(/"names": names is long or 8.3/);
    expect(bad({ revision: 1, card: -1 })).toMatch(/"card"/);
    expect(bad({ revision: 1, note: "x".repeat(2001) })).toMatch(/"note": note is at most 2000/);
    expect(bad({ revision: 1, note: "a\u0000b" })).toMatch(/"note"/);
    expect(bad({ revision: 1, extra: true })).toMatch(/extra/);
    const tick = readTickInput({ item: "card:matches", ticked: "yes" });
    expect(tick.ok ? "accepted" : tick.error).toMatch(/"ticked": ticked is true or false/);
    expect(readTickInput({ item: "", ticked: true }).ok).toBe(false);
  });

  it("reads a page form as the API's body", () => {
    const f = new URLSearchParams({ intent: "release", revision: "4", note: "n", template: "", names: "long", card: "8", ticked: "1" });
    expect(formAsBody(f, ["revision", "note", "template", "names", "card"])).toEqual({ revision: 4, note: "n", names: "long", card: 8 });
    expect(formAsBody(f, ["ticked"])).toEqual({ ticked: true });
    expect(formAsBody(new URLSearchParams({ revision: "four" }), ["revision"])).toEqual({ revision: "four" });
  });

  it("writes the client's e-mail with the note and the handoff link", () => {
    const m = releasedMail({ to: "c@example.test", clientName: "Client One", buildName: "Wren", number: 2, note: "Two presets <b>", url: "http://hb.test/handoff/abc" });
    expect(m).toMatchObject({ kind: "build-released", to: "c@example.test", subject: "Your saber is ready: Wren" });
    expect(m.text).toContain("release 2");
    expect(m.text).toContain("> Two presets <b>");
    expect(m.text).toContain("Open your handoff page: http://hb.test/handoff/abc");
    expect(m.html).toContain("Two presets &lt;b&gt;");
  });
});
