import { Form, redirect, useActionData } from "react-router";
import { requireViewer } from "~/lib/auth/auth.server";
import { buildMetaSchema } from "~/lib/forms/build-forms";
import { fieldErrors } from "~/lib/forms/form-errors";
import { clientsOf, createBuildFor } from "~/lib/builds/builds.server";
import { data } from "react-router";
import type { Route } from "./+types/builds.new";
import { BuildMetaFields } from "~/components/BuildMetaFields";

export const meta: Route.MetaFunction = () => [{ title: "New build · Hiltbench" }];

export async function loader({ request }: Route.LoaderArgs) {
  const v = await requireViewer(request, "create:build");
  return { clients: await clientsOf(v) };
}

export async function action({ request }: Route.ActionArgs) {
  const v = await requireViewer(request, "create:build");
  const parsed = buildMetaSchema.safeParse(Object.fromEntries(await request.formData()));
  if (!parsed.success) return data({ errors: fieldErrors(parsed.error) }, { status: 400 });
  const r = await createBuildFor(v, parsed.data);
  if (!r.ok) return data({ errors: r.errors }, { status: 400 });
  throw redirect(`/builds/${r.id}`);
}

export default function NewBuild({ loaderData }: Route.ComponentProps) {
  const result = useActionData<typeof action>();
  return (
    <div className="max-w-3xl">
      <h1>New build</h1>
      <Form method="post" className="card mt-4">
        <BuildMetaFields clients={loaderData.clients} errors={result?.errors} />
        <button type="submit" className="btn btn-primary mt-4">
          Create build
        </button>
      </Form>
    </div>
  );
}
