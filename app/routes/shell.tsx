import { Outlet, redirect, useRouteLoaderData, type ShouldRevalidateFunctionArgs } from "react-router";
import type { Route } from "./+types/shell";
import { AppShell } from "~/components/app-shell";
import { ErrorMessage } from "~/components/error-page";
import { YardTimeZone } from "~/components/local-time";
import { DEFAULT_TIME_ZONE } from "~/lib/format";
import { requireUser } from "~/server/auth.server";
import { yardSettings } from "~/server/yard.server";
import type { Role } from "~/lib/roles";

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireUser(request);
  const { timeZone } = await yardSettings();
  return {
    user: { id: user.id, name: user.name, role: user.role, email: user.email },
    timeZone,
    offline: false,
  };
}

const YARD_ZONE_KEY = "sternpost.yardTimeZone";

/** Offline, the person is the one who last signed in on this tablet (kept with their work). */
export async function clientLoader({ serverLoader }: Route.ClientLoaderArgs) {
  try {
    const data = await serverLoader();
    // Kept for offline use: a tablet writes times in the yard's zone with no connection too.
    localStorage.setItem(YARD_ZONE_KEY, data.timeZone);
    return data;
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
    const timeZone = localStorage.getItem(YARD_ZONE_KEY) ?? DEFAULT_TIME_ZONE;
    return { user, timeZone, offline: true };
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
    <YardTimeZone value={loaderData.timeZone}>
      <AppShell user={loaderData.user}>
        <Outlet />
      </AppShell>
    </YardTimeZone>
  );
}

/** A page's error keeps the header and the sync bar: entries still waiting stay visible. */
export function ErrorBoundary({ error }: Route.ErrorBoundaryProps) {
  const data = useRouteLoaderData<typeof loader>("routes/shell");
  if (!data) return <ErrorMessage error={error} />;
  return (
    <YardTimeZone value={data.timeZone}>
      <AppShell user={data.user}>
        <ErrorMessage error={error} />
      </AppShell>
    </YardTimeZone>
  );
}
