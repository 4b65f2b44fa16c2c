import { describe, expect, it } from "vitest";
import { commentMail, composeMail, linkTo, reviewRequestedMail, signInCodeMail, verdictMail } from "./messages";

describe("mail messages", () => {
  it("joins links onto APP_URL with or without a trailing slash", () => {
    expect(linkTo("http://127.0.0.1:5178", "/builds/x/reviews/1")).toBe("http://127.0.0.1:5178/builds/x/reviews/1");
    expect(linkTo("https://hb.example.test/", "/a?b=1")).toBe("https://hb.example.test/a?b=1");
  });

  it("a review request names the build, revision and requester, with the link in both parts", () => {
    const m = reviewRequestedMail({ to: "r@example.test", requesterName: "Demo Builder", buildName: "Kestrel", revision: 4, note: "New font", url: "http://h/builds/k/reviews/4" });
    expect(m.subject).toBe("Review requested: Kestrel, revision 4");
    expect(m.text).toContain("Demo Builder asks you to review revision 4");
    expect(m.text).toContain("> New font");
    expect(m.text).toContain("Open the review: http://h/builds/k/reviews/4");
    expect(m.html).toContain('<a href="http://h/builds/k/reviews/4">Open the review</a>');
  });

  it("escapes what people typed in the HTML part and shortens long quotes", () => {
    const m = commentMail({ to: "b@example.test", authorName: "<R>", where: "line 3", body: `<script>x</script>${"a".repeat(2000)}`, buildName: "K&K", revision: 1, url: "http://h/x?a=1&b=2" });
    expect(m.html).not.toContain("<script>");
    expect(m.html).toContain("&lt;script&gt;");
    expect(m.html).toContain('href="http://h/x?a=1&amp;b=2"');
    expect(m.text.length).toBeLessThan(1000);
  });

  it("verdicts read differently for approval and for changes", () => {
    const a = verdictMail({ to: "b@e.test", reviewerName: "R", verdict: "approved", buildName: "Kestrel", revision: 2, url: "http://h/" });
    const c = verdictMail({ to: "b@e.test", reviewerName: "R", verdict: "changes-requested", buildName: "Kestrel", revision: 2, url: "http://h/" });
    expect(a.subject).toMatch(/^Approved/);
    expect(c.subject).toMatch(/^Changes requested/);
    expect(c.text).toContain("asked for changes to revision 2");
  });

  it("composeMail is the generic builder other features use", () => {
    const m = composeMail({ kind: "release", to: "c@e.test", subject: "Released", paragraphs: ["One", "Two"], action: { label: "See it", url: "http://h/r" } });
    expect(m.text.split("\n\n").slice(0, 3)).toEqual(["One", "Two", "See it: http://h/r"]);
    expect(m.kind).toBe("release");
  });
});

describe("sign-in code mail", () => {
  it("carries the code, how long it lasts and the one-time link, and says why it came", () => {
    const m = signInCodeMail({ to: "client-one@example.test", code: "123456", minutes: 10, url: "http://127.0.0.1:5178/login/link?t=abc" });
    expect(m.subject).toBe("Your Hiltbench sign-in code: 123456");
    expect(m.text).toContain("Your sign-in code is 123456");
    expect(m.text).toContain("for 10 minutes");
    expect(m.text).toContain("Sign in to Hiltbench: http://127.0.0.1:5178/login/link?t=abc");
    expect(m.text).toContain("someone asked to sign in to Hiltbench with this address");
    expect(m.html).toContain('href="http://127.0.0.1:5178/login/link?t=abc"');
  });
});
