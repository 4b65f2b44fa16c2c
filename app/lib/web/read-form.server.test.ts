import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { parseUrlEncoded, urlEncodedFieldWithNul } from "./read-form.server";

describe("reading URL-encoded forms", () => {
  it("gives what URLSearchParams gives, for random fields and raw bytes", () => {
    const part = fc.oneof(fc.string({ unit: "binary", maxLength: 8 }), fc.constantFrom("%", "%ED%A0%80", "%zz", "+", "%2B", "=", "&", "%00"));
    fc.assert(
      fc.property(fc.array(fc.tuple(fc.string({ maxLength: 6 }), fc.string({ unit: "binary", maxLength: 10 })), { maxLength: 5 }), fc.array(part, { maxLength: 6 }), (fields, raw) => {
        const encoded = new URLSearchParams(fields).toString();
        expect([...parseUrlEncoded(encoded).entries()]).toEqual([...new URLSearchParams(encoded).entries()]);
        const junk = raw.join("");
        expect([...parseUrlEncoded(junk).entries()]).toEqual([...new URLSearchParams(junk).entries()]);
      }),
      { numRuns: 1000 },
    );
  });

  it("finds the field with a NUL without decoding the rest", () => {
    expect(urlEncodedFieldWithNul("intent=save&source=abc&name=Kite%00")).toBe("name");
    expect(urlEncodedFieldWithNul("intent=save&na%20me=%00")).toBe("na me");
    expect(urlEncodedFieldWithNul("intent=save&source=%2500")).toBeNull();
  });
});
