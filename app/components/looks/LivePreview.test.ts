import { createElement } from "react";
import { renderToString } from "react-dom/server";
import { describe, expect, it } from "vitest";
import { demoConfig } from "~/lib/config/demo";
import { ChannelPreview } from "./ChannelPreview";
import { LivePreview } from "./LivePreview";

// No DOM here: these check the server-rendered markup (what a route sends before hydration).
describe("LivePreview markup", () => {
  const html = renderToString(createElement(LivePreview, { config: demoConfig(), presetId: "ashfall" }));

  it("draws each channel at its real pixel count, the blade as a tall strip", () => {
    expect(html).toMatch(/<canvas[^>]*width="1"[^>]*height="132"[^>]*role="img"/);
    expect(html).toMatch(/<canvas[^>]*width="7"[^>]*height="1"[^>]*role="img"/);
    expect(html).toMatch(/<canvas[^>]*width="1"[^>]*height="1"[^>]*role="img"/);
    expect(html).toContain("Main blade: 132 pixels, 2 strips in parallel showing the same frame");
  });

  it("offers every event, playback, the timeline and the text alternative", () => {
    for (const label of ["Ignite", "Retract", "Clash", "Blast", "Lockup", "Drag", "Auxiliary", "Pause", "Demonstration sequence"]) {
      expect(html).toContain(`>${label}`);
    }
    expect(html).toMatch(/<input[^>]*type="range"[^>]*aria-label="Time"/);
    expect(html).toContain("Colour values as text");
    // Unlit at first: Retract is disabled, Ignite is not.
    expect(html).toMatch(/<button[^>]*disabled=""[^>]*>Retract/);
    expect(html).not.toMatch(/<button[^>]*disabled=""[^>]*>Ignite/);
  });

  it("says so when the preset is missing", () => {
    expect(renderToString(createElement(LivePreview, { config: demoConfig(), presetId: "nope" }))).toContain("There is no preset");
  });

  it("a lone pixel is round, a strip is not", () => {
    const c = demoConfig().rig.channels;
    expect(renderToString(createElement(ChannelPreview, { channel: c[2] }))).toContain("rounded-full");
    expect(renderToString(createElement(ChannelPreview, { channel: c[1] }))).not.toContain("rounded-full");
  });
});
