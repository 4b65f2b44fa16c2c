// The template language reference, read from the same REFERENCE.md that ships beside the code.
import { Link } from "react-router";
import { ErrorPage } from "~/components/ErrorPage";
import { Markdown } from "~/components/Markdown";
import { requireViewer } from "~/lib/auth/auth.server";
import reference from "~/lib/template/REFERENCE.md?raw";
import type { Route } from "./+types/templates.reference";

export const meta: Route.MetaFunction = () => [{ title: "Template language reference · Hiltbench" }];

/** 403 for a role without templates, or a server failure, with a way back. */
export function ErrorBoundary({ error }: Route.ErrorBoundaryProps) {
  return <ErrorPage error={error} back={[{ to: "/builds", label: "Back to builds" }]} />;
}

export async function loader({ request }: Route.LoaderArgs) {
  await requireViewer(request, "view:templates");
  return null;
}

export default function TemplateReference() {
  return (
    <article aria-label="Template language reference">
      <p className="mb-4 text-sm">
        <Link to="/templates">← Templates</Link>
      </p>
      <Markdown source={reference} />
    </article>
  );
}
