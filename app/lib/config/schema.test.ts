import { describe, expect, it } from "vitest";
import { configSchema } from "./schema";
import { demoConfig, demoConfigSmall } from "./demo";

describe("config schema", () => {
  it("accepts the demo configs", () => {
    expect(configSchema.safeParse(demoConfig()).success).toBe(true);
    expect(configSchema.safeParse(demoConfigSmall()).success).toBe(true);
  });
  it("rejects a bad colour", () => {
    const c = demoConfig();
    (c.presets[0].looks.blade.layers[0] as { color: string }).color = "#12345g";
    expect(configSchema.safeParse(c).success).toBe(false);
  });
});
