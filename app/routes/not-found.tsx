import { data } from "react-router";

export function loader() {
  throw data({ message: "There is no page at this address. Check the link, or go back to the builds." }, { status: 404 });
}

export default function NotFound() {
  return null;
}
