// The sink's MIME reading checked against nodemailer's own composer (the encoder the app uses):
// what goes in comes back out, through quoted-printable, base64, encoded words and long lines.
import MailComposer from "nodemailer/lib/mail-composer";
import { describe, expect, it } from "vitest";
import { readMessage } from "./mime";

async function compose(mail: ConstructorParameters<typeof MailComposer>[0]): Promise<string> {
  const buf = await new MailComposer(mail).compile().build();
  return buf.toString("utf8");
}

describe("readMessage (against nodemailer's MailComposer)", () => {
  it("reads a plain ASCII text and HTML message", async () => {
    const raw = await compose({ from: "a@example.test", to: "b@example.test", subject: "Review requested", text: "Hello\nhttp://127.0.0.1/x", html: "<p>Hello</p>", messageId: "<m1@hb>" });
    const m = readMessage(raw);
    expect(m.subject).toBe("Review requested");
    expect(m.text).toBe("Hello\nhttp://127.0.0.1/x");
    expect(m.html).toBe("<p>Hello</p>");
    expect(m.messageId).toBe("m1@hb");
    expect(m.to).toBe("b@example.test");
  });

  it("decodes quoted-printable and encoded-word subjects with non-ASCII and long lines", async () => {
    const long = `${"Kestrel › chamber strip › layer 2 (drift) ".repeat(8)}end`;
    const raw = await compose({ from: "a@example.test", to: "Ωmega <b@example.test>", subject: "Änderung — Kestrel › Ashfall", text: `${long}\nzweite Zeile = gleich`, html: `<p>${long}</p>` });
    const m = readMessage(raw);
    expect(m.subject).toBe("Änderung — Kestrel › Ashfall");
    expect(m.text).toBe(`${long}\nzweite Zeile = gleich`);
    expect(m.html).toBe(`<p>${long}</p>`);
    expect(m.to).toContain("Ωmega");
  });

  it("decodes base64 bodies", async () => {
    const raw = await compose({ from: "a@example.test", to: "b@example.test", subject: "x", text: "Ünïcödé everywhere ✓", textEncoding: "base64" });
    expect(readMessage(raw).text).toBe("Ünïcödé everywhere ✓");
  });
});
