import { execFileSync } from "node:child_process";
import { mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { diffTexts } from "./text-diff";

const lines = (n: number, f: (i: number) => string) => Array.from({ length: n }, (_, i) => f(i)).join("\n") + "\n";

describe("text diff of rendered output", () => {
  it("numbers lines, pairs changed lines side by side and marks the changed words", () => {
    const a = lines(10, (i) => `#define LINE_${i} ${i * 10}`);
    const b = a.replace("#define LINE_4 40", "#define LINE_4 44").replace("#define LINE_8 80\n", "");
    const d = diffTexts("a.h", "b.h", a, b);
    if (d.kind !== "changed") throw new Error(d.kind);
    expect([d.added, d.removed]).toEqual([1, 2]);
    const rows = d.hunks.flatMap((h) => h.rows);
    const removed = rows.find((r) => r.kind === "removed" && r.oldNo === 5)!;
    expect(removed).toMatchObject({ text: "#define LINE_4 40" });
    expect(removed.kind === "removed" && removed.words?.filter((w) => w.changed).map((w) => w.text)).toEqual(["40"]);
    const added = rows.find((r) => r.kind === "added")!;
    expect(added.kind === "added" && added.newNo).toBe(5);
    const pair = d.hunks.flatMap((h) => h.side).find((s) => s.left?.kind === "removed" && s.right?.kind === "added")!;
    expect([pair.left!.no, pair.right!.no]).toEqual([5, 5]);
  });

  it("says 'same' for equal text", () => {
    expect(diffTexts("a", "b", "x\n", "x\n").kind).toBe("same");
  });

  it("writes a patch that GNU patch applies (reference: the patch program)", () => {
    const a = lines(200, (i) => `line ${i} ${i % 7 === 0 ? "seven" : "plain"}`);
    const b = a.replace("line 13 plain", "line 13 changed").replace("line 150 plain\n", "").replace("line 199 plain\n", "line 199 plain\nline 200 new\n");
    const d = diffTexts("kestrel.h", "kestrel.h", a, b);
    if (d.kind !== "changed") throw new Error(d.kind);
    const dir = mkdtempSync(path.join(tmpdir(), "hb-patch-"));
    const file = path.join(dir, "kestrel.h");
    writeFileSync(file, a);
    execFileSync("patch", ["--quiet", file], { input: d.patch });
    expect(readFileSync(file, "utf8")).toBe(b);
  });
});
