import { describe, expect, it } from "vitest";
import { crossSiteReason } from "./origin";

const OURS = ["http://127.0.0.1:5178"];
const req = (method: string, headers: Record<string, string>) => new Request("http://127.0.0.1:5178/logout", { method, headers });

describe("cross-site refusal", () => {
  it.each([
    ["POST", { Origin: "http://evil.test" }, true],
    ["POST", { Origin: "null" }, true],
    ["POST", { "Sec-Fetch-Site": "cross-site" }, true],
    ["POST", { "Sec-Fetch-Site": "same-site", Origin: "http://127.0.0.1:5178" }, true],
    ["POST", { Referer: "http://evil.test/page" }, true],
    ["PUT", { Origin: "http://evil.test", Cookie: "__hb=1" }, true],
    ["DELETE", { "Sec-Fetch-Site": "cross-site" }, true],
    ["POST", { Origin: "http://127.0.0.1:5178", "Sec-Fetch-Site": "same-origin" }, false],
    ["POST", { "Sec-Fetch-Site": "same-origin" }, false],
    ["POST", { Referer: "http://127.0.0.1:5178/builds" }, false],
    ["POST", {}, false],
    ["POST", { Authorization: "Bearer abc" }, false],
    ["GET", { Origin: "http://evil.test", "Sec-Fetch-Site": "cross-site" }, false],
    ["HEAD", { Origin: "http://evil.test" }, false],
  ] as const)("%s %j refused: %s", (method, headers, refused) => {
    expect(crossSiteReason(req(method, headers), OURS) !== null).toBe(refused);
  });
});
