// Sign out: a POST to /logout, the same on the workshop's pages and the client's.
import { Form } from "react-router";

export function SignOutButton() {
  return (
    <Form method="post" action="/logout">
      <button className="btn" type="submit">
        Sign out
      </button>
    </Form>
  );
}
