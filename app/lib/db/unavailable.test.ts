import { describe, expect, it } from "vitest";
import { isDatabaseUnavailable } from "./unavailable";

const withCode = (code: string, message = "x") => Object.assign(new Error(message), { code });

describe("isDatabaseUnavailable", () => {
  it.each([
    ["admin shutdown", withCode("57P01", "terminating connection due to administrator command")],
    ["crash shutdown", withCode("57P02")],
    ["cannot connect now", withCode("57P03", "the database system is shutting down")],
    ["connection exception class 08", withCode("08006")],
    ["refused", withCode("ECONNREFUSED", "connect ECONNREFUSED 127.0.0.1:5432")],
    ["reset", withCode("ECONNRESET")],
    ["cut mid-query", new Error("Connection terminated unexpectedly")],
    ["pool connect timeout", new Error("timeout exceeded when trying to connect")],
    ["wrapped", new Error("outer", { cause: withCode("57P01") })],
    ["aggregate", Object.assign(new AggregateError([withCode("ECONNREFUSED")]), {})],
  ])("%s is a database outage", (_, e) => expect(isDatabaseUnavailable(e)).toBe(true));

  it.each([
    ["unique violation", withCode("23505", "duplicate key value")],
    ["syntax", withCode("42601")],
    ["plain error", new Error("boom")],
    ["a string", "Connection terminated"],
    ["null", null],
  ])("%s is not", (_, e) => expect(isDatabaseUnavailable(e)).toBe(false));
});
