import { Outlet } from "react-router";
import type { Route } from "./+types/shell";
import { AppShell } from "~/components/app-shell";
import { requireUser } from "~/server/auth.server";

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireUser(request);
  return { user: { id: user.id, name: user.name, role: user.role, email: user.email } };
}

export default function Shell({ loaderData }: Route.ComponentProps) {
  return (
    <AppShell user={loaderData.user}>
      <Outlet />
    </AppShell>
  );
}
