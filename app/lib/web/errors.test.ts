import { UNSAFE_ErrorResponseImpl as ErrorResponse } from "react-router";
import { describe, expect, it } from "vitest";
import { describeError, errorTitle } from "./errors";

describe("what an error page says", () => {
  it("tells 404, 403, 409 and a server failure apart, with the server's own message", () => {
    const notFound = describeError(new ErrorResponse(404, "Not Found", { message: "No build with this id in your workshop." }));
    expect(notFound).toMatchObject({ status: 404, title: "Not found", message: "No build with this id in your workshop." });
    expect(notFound.advice).toMatch(/deleted|another workshop/);
    const forbidden = describeError(new ErrorResponse(403, "Forbidden", { message: "Your role (client) does not allow this." }));
    expect(forbidden).toMatchObject({ status: 403, title: "Not allowed" });
    expect(forbidden.advice).toMatch(/owner/);
    expect(describeError(new ErrorResponse(409, "Conflict", { message: "stale" })).advice).toMatch(/Reload/);
    expect(describeError(new ErrorResponse(418, "", "plain text"))).toMatchObject({ status: 418, title: "That did not work", message: "plain text" });
    const bug = describeError(new Error("secret stack detail"));
    expect(bug).toMatchObject({ status: 500, title: "Something went wrong" });
    expect(JSON.stringify(bug)).not.toContain("secret");
    expect(errorTitle(new ErrorResponse(404, "", null))).toBe("Not found · Hiltbench");
  });
});
