import { data, Form, useActionData } from "react-router";
import { z } from "zod";
import { requireViewer } from "~/lib/auth/auth.server";
import { createTokenFor, revokeTokenOf, tokensOf } from "~/lib/auth/account.server";
import { fail } from "~/lib/web/http.server";
import type { Route } from "./+types/account";

export const meta: Route.MetaFunction = () => [{ title: "Account · Hiltbench" }];

export async function loader({ request }: Route.LoaderArgs) {
  const v = await requireViewer(request);
  const tokens = await tokensOf(v);
  return {
    user: v.user,
    role: v.role,
    tokens: tokens.map((t) => ({ id: t.id, name: t.name, prefix: t.prefix, created: t.created_at.toISOString(), lastUsed: t.last_used_at?.toISOString() ?? null, revoked: t.revoked_at !== null })),
  };
}

export async function action({ request }: Route.ActionArgs) {
  const v = await requireViewer(request, "use:api");
  const form = await request.formData();
  if (form.get("intent") === "create") {
    const name = z.string().trim().min(1, "Name the token (what script uses it?).").max(60, "Keep the name under 60 characters.").safeParse(form.get("name") ?? "");
    if (!name.success) return data({ error: name.error.issues[0].message, token: null }, { status: 400 });
    const t = await createTokenFor(v, name.data);
    return { error: null, token: t.token };
  }
  if (form.get("intent") === "revoke") {
    const id = z.uuid().safeParse(form.get("tokenId"));
    if (!id.success || !(await revokeTokenOf(v, id.data))) fail(404, "No such active token.");
    return { error: null, token: null };
  }
  fail(400, "Unknown action.");
}

export default function Account({ loaderData }: Route.ComponentProps) {
  const { user, role, tokens } = loaderData;
  const result = useActionData<typeof action>();
  return (
    <div className="max-w-3xl space-y-6">
      <h1>Account</h1>
      <section className="card text-sm">
        <p>
          {user.displayName} · {role}
        </p>
        <p className="text-iron-400">
          GitHub: {user.githubLogin ?? "—"} · e-mail: {user.email ?? "—"}
        </p>
      </section>
      <section className="card">
        <h2>Personal API tokens</h2>
        <p className="mt-1 text-sm text-iron-400">
          Scripts call the JSON API with <code className="font-mono">Authorization: Bearer &lt;token&gt;</code>. A token acts as you, with your role. Every route, with examples, is in the <a href="/api/docs">API reference</a>.
        </p>
        {result?.token ? (
          <div className="mt-3 rounded border border-brass-400 p-3" role="status">
            <p className="text-sm">Copy this token now; it will not be shown again.</p>
            <code className="mt-2 block break-all font-mono text-brass-300" data-testid="new-token">
              {result.token}
            </code>
          </div>
        ) : null}
        <Form method="post" className="mt-4 flex items-end gap-3">
          <div>
            <label className="label" htmlFor="token-name">
              Token name
            </label>
            <input id="token-name" name="name" className="field w-64" placeholder="e.g. bench script" />
            {result?.error ? <p className="field-error">{result.error}</p> : null}
          </div>
          <button className="btn btn-primary" name="intent" value="create">
            Create token
          </button>
        </Form>
        <table className="table mt-4">
          <thead>
            <tr>
              <th>Name</th>
              <th>Starts with</th>
              <th>Created</th>
              <th>Last used</th>
              <th>
                <span className="sr-only">Actions</span>
              </th>
            </tr>
          </thead>
          <tbody>
            {tokens.map((t) => (
              <tr key={t.id}>
                <td>{t.name}</td>
                <td className="font-mono text-xs">{t.prefix}…</td>
                <td className="font-mono text-xs">{t.created.slice(0, 16).replace("T", " ")}</td>
                <td className="font-mono text-xs">{t.lastUsed ? t.lastUsed.slice(0, 16).replace("T", " ") : "never"}</td>
                <td>
                  {t.revoked ? (
                    <span className="text-iron-400">revoked</span>
                  ) : (
                    <Form method="post">
                      <input type="hidden" name="tokenId" value={t.id} />
                      <button className="btn btn-danger" name="intent" value="revoke" aria-label={`Revoke ${t.name}`}>
                        Revoke
                      </button>
                    </Form>
                  )}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </section>
    </div>
  );
}
