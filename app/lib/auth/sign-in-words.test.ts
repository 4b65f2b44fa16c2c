import { describe, expect, it } from "vitest";
import { clientLanding } from "./sign-in-words";

describe("clientLanding", () => {
  it("keeps a handoff sheet's address and nothing else", () => {
    const id = "1db90078-0c95-4e1e-bdd8-d5338c94dc35";
    expect(clientLanding(`/handoff/${id}`)).toBe(`/handoff/${id}`);
    for (const other of [undefined, null, "", "/builds", "//evil.test/handoff/x", `https://evil.test/handoff/${id}`, `/handoff/${id}/../../builds`, `/handoff/${id}?x=1`])
      expect(clientLanding(other)).toBe("/handoff");
  });
});
