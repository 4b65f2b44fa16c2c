// The page that asks for the e-mailed code (decision 023). Posting an address here sends the
// code (the client form on /login posts here too); posting a code signs the client in.
import { data, Form, redirect, useActionData, useSearchParams } from "react-router";
import { getSessionUserId } from "~/lib/auth/auth.server";
import { pendingAddress, requestSignInCode, verifySignInCode } from "~/lib/auth/email-sign-in.server";
import { clientLanding, CODE_DIGITS, SIGN_IN_MESSAGES } from "~/lib/auth/sign-in-words";
import { nextCookie } from "./auth.github";
import { readFormLimited } from "~/lib/web/body.server";
import type { Route } from "./+types/login.code";

export const meta: Route.MetaFunction = () => [{ title: "Your sign-in code · Hiltbench" }];

export async function loader({ request }: Route.LoaderArgs) {
  if (await getSessionUserId(request)) throw redirect("/builds");
  return { address: pendingAddress(request) };
}

export async function action({ request }: Route.ActionArgs) {
  const form = await readFormLimited(request, 4096, "The form is too large.");
  const intent = form.get("intent");
  if (intent !== "send" && intent !== "verify") return data({ intent: "verify" as const, error: "Say whether to send a code or check one." }, { status: 400 });
  const outcome = intent === "send" ? await requestSignInCode(request, form) : await verifySignInCode(request, form);
  if (outcome.ok && intent === "send") {
    // A handoff sheet the client was sent to (a release e-mail's link) is where the sign-in ends.
    const next = clientLanding(form.get("next"));
    if (next !== "/handoff") outcome.headers.append("Set-Cookie", await nextCookie.serialize(next));
  }
  if (outcome.ok && intent === "verify") {
    const next = clientLanding(await nextCookie.parse(request.headers.get("Cookie")));
    outcome.headers.append("Set-Cookie", await nextCookie.serialize("", { maxAge: 0 }));
    throw redirect(next, { headers: outcome.headers });
  }
  if (outcome.ok) throw redirect(outcome.to, { headers: outcome.headers });
  return data({ intent, error: outcome.message }, { status: outcome.status, headers: outcome.headers });
}

export default function SignInCode({ loaderData }: Route.ComponentProps) {
  const result = useActionData<typeof action>();
  const [params] = useSearchParams();
  const codeError = result?.intent === "verify" ? result.error : null;
  const sendError = result?.intent === "send" ? result.error : null;
  return (
    <main className="mx-auto max-w-md px-6 py-20">
      <h1>Type your sign-in code</h1>
      {loaderData.address && !sendError ? (
        <p className="mt-3 text-iron-300" role="status">
          {SIGN_IN_MESSAGES.sent}
        </p>
      ) : null}
      {params.get("failed") && !result ? (
        <p className="mt-3 text-signal-error" role="alert">
          {SIGN_IN_MESSAGES.noCode}
        </p>
      ) : null}
      <Form method="post" className="mt-6 space-y-3">
        <input type="hidden" name="intent" value="verify" />
        <label className="block">
          <span className="text-sm">The {CODE_DIGITS}-digit code from the e-mail</span>
          <input
            name="code"
            inputMode="numeric"
            autoComplete="one-time-code"
            pattern="[0-9]*"
            maxLength={CODE_DIGITS}
            required
            className="field mt-1 font-mono tracking-widest"
            aria-invalid={codeError ? true : undefined}
            aria-describedby={codeError ? "code-error" : undefined}
          />
        </label>
        {codeError ? (
          <p id="code-error" className="text-signal-error" role="alert">
            {codeError}
          </p>
        ) : null}
        <button type="submit" className="btn btn-primary">
          Sign in
        </button>
      </Form>
      <section aria-labelledby="new-code" className="mt-10 border-t border-soot-700 pt-6">
        <h2 id="new-code" className="text-lg">
          Ask for a new code
        </h2>
        <Form method="post" className="mt-3 space-y-3">
          <input type="hidden" name="intent" value="send" />
          <label className="block">
            <span className="text-sm">Your e-mail address</span>
            <input
              type="email"
              name="email"
              required
              autoComplete="email"
              defaultValue={loaderData.address ?? ""}
              className="field mt-1"
              aria-invalid={sendError ? true : undefined}
              aria-describedby={sendError ? "email-error" : undefined}
            />
          </label>
          {sendError ? (
            <p id="email-error" className="text-signal-error" role="alert">
              {sendError}
            </p>
          ) : null}
          <button type="submit" className="btn">
            E-mail me a code
          </button>
        </Form>
      </section>
    </main>
  );
}
