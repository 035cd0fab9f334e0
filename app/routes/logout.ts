import { redirect } from "react-router";
import type { Route } from "./+types/logout";
import { signOut } from "~/server/auth.server";

export async function action({ request }: Route.ActionArgs) {
  return redirect("/login", { headers: { "Set-Cookie": await signOut(request) } });
}

export function loader() {
  return redirect("/");
}
