// GET /api/docs: the API reference, public (no sign-in), drawn in React from the OpenAPI document
// that /api/openapi.json serves. Nothing is loaded from elsewhere; fonts are the app's own.
import { ApiReference, type ApiDoc } from "~/components/api-doc/ApiReference";
import { ErrorPage } from "~/components/ErrorPage";
import { apiDocument } from "~/lib/api-doc/document";
import type { Route } from "./+types/api.docs";

export const meta: Route.MetaFunction = () => [{ title: "API reference · Hiltbench" }];

export function ErrorBoundary({ error }: Route.ErrorBoundaryProps) {
  return <ErrorPage error={error} back={[{ to: "/", label: "Back to Hiltbench" }]} />;
}

export function loader() {
  return { doc: apiDocument() as unknown as ApiDoc };
}

export default function ApiDocs({ loaderData }: Route.ComponentProps) {
  return (
    <main>
      <ApiReference doc={loaderData.doc} />
    </main>
  );
}
