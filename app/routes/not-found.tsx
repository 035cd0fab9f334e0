import { data } from "react-router";

export function loader() {
  throw data(
    { message: "There is no page at this address. It may have been moved, or the link is mistyped." },
    { status: 404 },
  );
}

export default function NotFound() {
  return null;
}
