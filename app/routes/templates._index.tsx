// The workshop's templates: the built-ins (read-only) and the workshop's own, and a form to
// start a new one from a copy of any of them. After a delete the list says what went.
import { data, Form, Link, redirect, useActionData, useNavigation } from "react-router";
import { z } from "zod";
import { ErrorPage } from "~/components/ErrorPage";
import { requireViewer } from "~/lib/auth/auth.server";
import { can } from "~/lib/auth/permissions";
import { fieldErrors } from "~/lib/forms/form-errors";
import { createTemplateFrom, workshopTemplates } from "~/lib/rendering/library.server";
import { BUILTIN_NAMES, BUILTIN_TEMPLATES } from "~/lib/template";
import { errorTitle } from "~/lib/web/errors";
import type { Route } from "./+types/templates._index";

export const meta: Route.MetaFunction = ({ error }) => [{ title: error ? errorTitle(error) : "Templates · Hiltbench" }];

const BUILTIN_NOTES: Record<string, string> = {
  "generic-header": "Hiltbench's C header; reads back into the model. Builds use it unless they pin another.",
  "readable-copy": "The plain-text summary that goes on the card beside the config.",
  "config-json": "The config model as JSON, for scripts.",
};

export async function loader({ request }: Route.LoaderArgs) {
  const v = await requireViewer(request, "view:templates");
  const mine = await workshopTemplates(v);
  // `?deleted=name&versions=n` comes from the delete's redirect; it only reads as done while
  // the workshop really has no template of that name.
  const url = new URL(request.url);
  const gone = url.searchParams.get("deleted");
  const count = Number(url.searchParams.get("versions"));
  const deleted =
    gone && gone.length <= 60 && !mine.some((t) => t.name === gone) ? { name: gone, versions: Number.isInteger(count) && count > 0 ? count : null } : null;
  return {
    deleted,
    builtins: BUILTIN_NAMES.map((name) => ({ name, note: BUILTIN_NOTES[name] ?? "", lines: BUILTIN_TEMPLATES[name].split("\n").length })),
    templates: mine.map((t) => ({ id: t.id, name: t.name, latest: t.latest, updatedAt: t.updatedAt.toISOString() })),
    canEdit: can(v.role, "edit:template"),
  };
}

const NewTemplate = z.object({
  name: z
    .string()
    .trim()
    .min(1, "Give the template a name.")
    .max(60, "At most 60 characters.")
    .regex(/^[a-z0-9][a-z0-9_-]*$/, "Lower-case letters, digits, - and _ only (other templates use it by this name)."),
  from: z.string().min(1, "Choose what to start from."),
});

type ActionAnswer = { fieldErrors: Partial<Record<"name" | "from", string>>; message?: string };

export async function action({ request }: Route.ActionArgs) {
  const v = await requireViewer(request, "edit:template");
  const form = await request.formData();
  const parsed = NewTemplate.safeParse({ name: form.get("name") ?? "", from: form.get("from") ?? "" });
  if (!parsed.success) {
    return data<ActionAnswer>({ fieldErrors: fieldErrors(parsed.error) }, { status: 400 });
  }
  const r = await createTemplateFrom(v, parsed.data.name, parsed.data.from);
  if (r.kind === "refused") return data<ActionAnswer>({ fieldErrors: { [r.field]: r.message } }, { status: 400 });
  return redirect(`/templates/${r.id}`);
}

/** 403 for a role without templates, or a server failure, with a way back. */
export function ErrorBoundary({ error }: Route.ErrorBoundaryProps) {
  return <ErrorPage error={error} back={[{ to: "/builds", label: "Back to builds" }]} />;
}

export default function TemplatesPage({ loaderData }: Route.ComponentProps) {
  const { builtins, templates, canEdit, deleted } = loaderData;
  const answer = useActionData<typeof action>() as ActionAnswer | undefined;
  const busy = useNavigation().state === "submitting";
  return (
    <div className="space-y-6">
      <div className="flex flex-wrap items-baseline gap-4">
        <h1>Templates</h1>
        <Link to="/templates/reference">Language reference</Link>
      </div>
      {deleted ? (
        <p role="status" className="rounded-md border border-signal-ok/50 px-3 py-2 text-sm" data-testid="templates-notice">
          Deleted the template <span className="font-mono">{deleted.name}</span>
          {deleted.versions ? ` and its ${deleted.versions} ${deleted.versions === 1 ? "version" : "versions"}` : ""}.
        </p>
      ) : null}
      <p className="max-w-3xl text-iron-300">
        A template turns a build's config into the text that goes on the SD card. Builds render with the built-in generic header unless they pin a
        version of one of your workshop's templates on their Render view.
      </p>

      <section aria-labelledby="workshop-templates" className="card">
        <h2 id="workshop-templates">Your workshop's templates</h2>
        {templates.length === 0 ? (
          <p className="mt-2 text-iron-400">None yet. Start one from a built-in below.</p>
        ) : (
          <table className="table mt-3">
            <thead>
              <tr>
                <th scope="col">Name</th>
                <th scope="col">Latest version</th>
                <th scope="col">Last saved</th>
              </tr>
            </thead>
            <tbody>
              {templates.map((t) => (
                <tr key={t.id}>
                  <td>
                    <Link to={`/templates/${t.id}`} className="font-mono">
                      {t.name}
                    </Link>
                  </td>
                  <td>{t.latest}</td>
                  <td className="text-iron-300">{new Date(t.updatedAt).toISOString().slice(0, 16).replace("T", " ")} UTC</td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </section>

      <section aria-labelledby="builtin-templates" className="card">
        <h2 id="builtin-templates">Built-in templates</h2>
        <p className="mt-1 text-sm text-iron-400">Read-only; copy one to change it.</p>
        <table className="table mt-3">
          <tbody>
            {builtins.map((b) => (
              <tr key={b.name}>
                <td>
                  <Link to={`/templates/${b.name}`} className="font-mono">
                    {b.name}
                  </Link>
                </td>
                <td className="text-iron-300">{b.note}</td>
                <td className="text-iron-400">{b.lines} lines</td>
              </tr>
            ))}
          </tbody>
        </table>
      </section>

      {canEdit ? (
        <section aria-labelledby="new-template" className="card">
          <h2 id="new-template">New template</h2>
          <Form method="post" className="mt-3 flex flex-wrap items-start gap-4">
            <div>
              <label className="label" htmlFor="tpl-name">
                Name
              </label>
              <input id="tpl-name" name="name" className="field w-64 font-mono" required maxLength={60} aria-describedby="tpl-name-error" placeholder="shop-header" />
              {answer?.fieldErrors.name ? (
                <p id="tpl-name-error" className="field-error" role="alert">
                  {answer.fieldErrors.name}
                </p>
              ) : null}
            </div>
            <div>
              <label className="label" htmlFor="tpl-from">
                Start from a copy of
              </label>
              <select id="tpl-from" name="from" className="field w-64" defaultValue="generic-header">
                <optgroup label="Built-in">
                  {builtins.map((b) => (
                    <option key={b.name} value={b.name}>
                      {b.name}
                    </option>
                  ))}
                </optgroup>
                {templates.length ? (
                  <optgroup label="Your workshop">
                    {templates.map((t) => (
                      <option key={t.id} value={t.id}>
                        {t.name} (v{t.latest})
                      </option>
                    ))}
                  </optgroup>
                ) : null}
              </select>
              {answer?.fieldErrors.from ? <p className="field-error">{answer.fieldErrors.from}</p> : null}
            </div>
            <button type="submit" className="btn btn-primary mt-5" disabled={busy}>
              Create template
            </button>
          </Form>
        </section>
      ) : null}
    </div>
  );
}
