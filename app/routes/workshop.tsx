import { data, Form, useActionData } from "react-router";
import { z } from "zod";
import { requireViewer } from "~/lib/auth/auth.server";
import { fieldErrors } from "~/lib/forms/form-errors";
import { ROLES } from "~/lib/db/types";
import { fail } from "~/lib/web/http.server";
import { can } from "~/lib/auth/permissions";
import { cancelInvitationOf, changeRoleOf, invitationsOf, inviteTo, membersOf, removeMemberOf } from "~/lib/auth/members.server";
import type { Route } from "./+types/workshop";

export const meta: Route.MetaFunction = () => [{ title: "Workshop · Hiltbench" }];

export async function loader({ request }: Route.LoaderArgs) {
  const v = await requireViewer(request, "view:members");
  const manage = can(v.role, "manage:members");
  return {
    workshop: v.workshop.name,
    me: v.user.id,
    manage,
    members: (await membersOf(v)).map((m) => ({ ...m, created_at: m.created_at.toISOString() })),
    invitations: manage ? (await invitationsOf(v)).map((i) => ({ id: i.id, github_login: i.github_login, email: i.email, role: i.role })) : [],
  };
}

const inviteSchema = z
  .object({
    target: z.string().trim().min(1, "Enter a GitHub login or an e-mail address.").max(254),
    role: z.enum(ROLES, { message: "Choose a role." }),
  })
  .transform((v, ctx) => {
    if (v.target.includes("@")) {
      if (!z.email().safeParse(v.target).success) ctx.addIssue({ code: "custom", path: ["target"], message: "That e-mail address does not look right." });
      return { email: v.target, role: v.role };
    }
    if (!/^[A-Za-z0-9](?:[A-Za-z0-9-]{0,38})$/.test(v.target))
      ctx.addIssue({ code: "custom", path: ["target"], message: "A GitHub login has 1–39 letters, digits or dashes." });
    return { githubLogin: v.target, role: v.role };
  });

const uuid = z.uuid({ message: "Unknown member." });

export async function action({ request }: Route.ActionArgs) {
  const v = await requireViewer(request, "manage:members");
  const form = await request.formData();
  const intent = form.get("intent");
  if (intent === "invite") {
    const parsed = inviteSchema.safeParse(Object.fromEntries(form));
    if (!parsed.success) return data({ intent, errors: fieldErrors(parsed.error), message: null }, { status: 400 });
    const r = await inviteTo(v, parsed.data, parsed.data.role);
    if (!r.ok) return data({ intent, errors: { target: r.message }, message: null }, { status: r.status });
    return { intent, errors: {}, message: "Invitation recorded. They join when they first sign in." };
  }
  if (intent === "role" || intent === "remove") {
    const userId = uuid.safeParse(form.get("userId"));
    if (!userId.success) fail(400, "Unknown member.");
    const r =
      intent === "role"
        ? await (async () => {
            const role = z.enum(ROLES).safeParse(form.get("role"));
            if (!role.success) fail(400, "Choose a role from the list.");
            return changeRoleOf(v, userId.data, role.data);
          })()
        : await removeMemberOf(v, userId.data);
    if (!r.ok) return data({ intent, errors: { member: r.message }, message: null }, { status: r.status });
    return { intent, errors: {}, message: intent === "role" ? "Role changed." : "Member removed." };
  }
  if (intent === "cancel-invite") {
    const id = uuid.safeParse(form.get("invitationId"));
    if (!id.success || !(await cancelInvitationOf(v, id.data))) fail(404, "No such invitation.");
    return { intent, errors: {}, message: "Invitation cancelled." };
  }
  fail(400, "Unknown action.");
}

export default function Workshop({ loaderData }: Route.ComponentProps) {
  const { members, invitations, manage, workshop } = loaderData;
  const result = useActionData<typeof action>();
  const errors = (result?.errors ?? {}) as Record<string, string>;
  return (
    <div className="space-y-6">
      <h1>{workshop}</h1>
      {result?.message ? <p role="status" className="text-signal-ok">{result.message}</p> : null}
      {errors.member ? <p role="alert" className="text-signal-error">{errors.member}</p> : null}
      <section className="card">
        <h2>Members</h2>
        <table className="table mt-3" data-testid="members">
          <thead>
            <tr>
              <th>Name</th>
              <th>GitHub</th>
              <th>E-mail</th>
              <th>Role</th>
              {manage ? <th>Actions</th> : null}
            </tr>
          </thead>
          <tbody>
            {members.map((m) => (
              <tr key={m.id}>
                <td>{m.display_name}</td>
                <td className="font-mono text-xs">{m.github_login ?? "—"}</td>
                <td className="text-xs">{m.email ?? "—"}</td>
                <td>
                  {manage ? (
                    <Form method="post" className="flex items-center gap-2">
                      <input type="hidden" name="intent" value="role" />
                      <input type="hidden" name="userId" value={m.id} />
                      <select name="role" defaultValue={m.role} className="field w-32" aria-label={`Role of ${m.display_name}`}>
                        {ROLES.map((r) => (
                          <option key={r}>{r}</option>
                        ))}
                      </select>
                      <button className="btn" type="submit">
                        Change
                      </button>
                    </Form>
                  ) : (
                    m.role
                  )}
                </td>
                {manage ? (
                  <td>
                    <Form method="post">
                      <input type="hidden" name="userId" value={m.id} />
                      <button className="btn btn-danger" type="submit" name="intent" value="remove" aria-label={`Remove ${m.display_name}`}>
                        Remove
                      </button>
                    </Form>
                  </td>
                ) : null}
              </tr>
            ))}
          </tbody>
        </table>
      </section>
      {manage ? (
        <section className="card">
          <h2>Invite someone</h2>
          <Form method="post" className="mt-3 flex flex-wrap items-end gap-3">
            <div>
              <label className="label" htmlFor="target">
                GitHub login or e-mail
              </label>
              <input id="target" name="target" className="field w-72" aria-invalid={errors.target ? true : undefined} />
              {errors.target ? <p className="field-error">{errors.target}</p> : null}
            </div>
            <div>
              <label className="label" htmlFor="invite-role">
                Role
              </label>
              <select id="invite-role" name="role" className="field" defaultValue="builder">
                {ROLES.map((r) => (
                  <option key={r}>{r}</option>
                ))}
              </select>
            </div>
            <button className="btn btn-primary" type="submit" name="intent" value="invite">
              Invite
            </button>
          </Form>
          {invitations.length ? (
            <ul className="mt-4 space-y-2 text-sm">
              {invitations.map((i) => (
                <li key={i.id} className="flex items-center gap-3">
                  <span>
                    {i.github_login ?? i.email} · {i.role} · pending
                  </span>
                  <Form method="post">
                    <input type="hidden" name="invitationId" value={i.id} />
                    <button className="btn" name="intent" value="cancel-invite">
                      Cancel
                    </button>
                  </Form>
                </li>
              ))}
            </ul>
          ) : null}
        </section>
      ) : null}
    </div>
  );
}
