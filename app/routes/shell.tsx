import { Outlet, redirect, useRouteLoaderData, type ShouldRevalidateFunctionArgs } from "react-router";
import type { Route } from "./+types/shell";
import { AppShell } from "~/components/app-shell";
import { ErrorMessage } from "~/components/error-page";
import { requireUser } from "~/server/auth.server";
import type { Role } from "~/lib/roles";

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireUser(request);
  return { user: { id: user.id, name: user.name, role: user.role, email: user.email }, offline: false };
}

/** Offline, the person is the one who last signed in on this tablet (kept with their work). */
export async function clientLoader({ serverLoader }: Route.ClientLoaderArgs) {
  try {
    return await serverLoader();
  } catch (error) {
    if (error instanceof Response) throw error;
    const { getMeta } = await import("~/lib/offline/store.client");
    const user = await getMeta<{
      id: number;
      name: string;
      role: Role;
      email: string;
    }>("user");
    if (!user) throw redirect("/login");
    return { user, offline: true };
  }
}

/** Entries are written locally; there is nothing to fetch again after one. */
export function shouldRevalidate({
  formMethod,
  currentUrl,
  nextUrl,
  defaultShouldRevalidate,
}: ShouldRevalidateFunctionArgs) {
  if (
    formMethod &&
    formMethod !== "GET" &&
    currentUrl.pathname === nextUrl.pathname &&
    nextUrl.pathname.startsWith("/checklists/")
  )
    return false;
  return defaultShouldRevalidate;
}

export default function Shell({ loaderData }: Route.ComponentProps) {
  return (
    <AppShell user={loaderData.user}>
      <Outlet />
    </AppShell>
  );
}

/** A page's error keeps the header and the sync bar: entries still waiting stay visible. */
export function ErrorBoundary({ error }: Route.ErrorBoundaryProps) {
  const data = useRouteLoaderData<typeof loader>("routes/shell");
  if (!data) return <ErrorMessage error={error} />;
  return (
    <AppShell user={data.user}>
      <ErrorMessage error={error} />
    </AppShell>
  );
}
