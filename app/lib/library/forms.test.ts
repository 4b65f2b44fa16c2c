// The library's page forms: a choice of preset and version, tags, and collision choices.
import { describe, expect, it } from "vitest";
import { addForm, choicesOf, saveForm } from "./forms";

const id = "0a1b2c3d-0000-4000-8000-123456789abc";

describe("library forms", () => {
  it("reads preset@latest and preset@n; refuses anything else with a message", () => {
    expect(addForm.parse({ choice: `${id}@latest`, fontId: "ashfall", configVersion: "3" })).toEqual({ choice: { libraryPresetId: id, version: null }, fontId: "ashfall", configVersion: 3 });
    expect(addForm.parse({ choice: `${id}@2`, fontId: "ashfall", configVersion: "3" }).choice.version).toBe(2);
    for (const bad of ["", `${id}@0`, `${id}@x`, "nope@latest", `${id}@99999999999`]) {
      const r = addForm.safeParse({ choice: bad, fontId: "ashfall", configVersion: "3" });
      expect(r.success, bad).toBe(false);
    }
    expect(addForm.safeParse({ choice: `${id}@1`, fontId: "ashfall", configVersion: "2147483648" }).success).toBe(false);
  });

  it("splits tags, drops blanks and duplicates, and refuses bad ones", () => {
    const ok = saveForm.parse({ presetId: "ashfall", libraryPresetId: "", baseVersion: "", name: " Ember ", tags: "warm, warm , ,demo", changelog: "First" });
    expect(ok).toMatchObject({ libraryPresetId: null, baseVersion: null, name: "Ember", tags: ["warm", "demo"] });
    expect(saveForm.safeParse({ presetId: "ashfall", libraryPresetId: "", baseVersion: "", name: "E", tags: "<script>", changelog: "x" }).success).toBe(false);
    expect(saveForm.safeParse({ presetId: "ashfall", libraryPresetId: "", baseVersion: "", name: "E", tags: "", changelog: "  " }).success).toBe(false);
  });

  it("reads collision choices by path, ignoring anything but mine or theirs", () => {
    const f = new FormData();
    f.set("choice:.looks.blade[id:l-1].color", "mine");
    f.set("choice:.looks.blade[id:l-2].color", "theirs");
    f.set("choice:.x", "both");
    f.set("other", "mine");
    expect(choicesOf(f)).toEqual({ ".looks.blade[id:l-1].color": "mine", ".looks.blade[id:l-2].color": "theirs" });
  });
});
