import { describe, expect, it } from "vitest";
import { rigErrorsForForm } from "./rig-form";

describe("validator errors on the rig form", () => {
  it("keys errors under rig by the form's field names and keeps the rest apart", () => {
    const r = rigErrorsForForm([
      { path: "rig.channels[0].pin", message: "Channel on pin 99 is not a data pin." },
      { path: "rig.channels[0].pin", message: "second message for the same field" },
      { path: "rig.board.dataPins[2]", message: "Pin listed twice." },
      { path: "presets[1].looks.emitter", message: "A look for a channel the rig no longer has." },
      { path: "rigging", message: "not under rig." },
    ]);
    expect(r.fieldErrors).toEqual({ "channels.0.pin": "Channel on pin 99 is not a data pin.", "board.dataPins.2": "Pin listed twice." });
    expect(r.elsewhere.map((d) => d.path)).toEqual(["presets[1].looks.emitter", "rigging"]);
  });
});
