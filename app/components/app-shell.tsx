import { useEffect, useRef } from "react";
import { Form, NavLink, useLocation } from "react-router";
import { navigationFor, type Actor } from "~/lib/permissions";
import { roleLabels, type Role } from "~/lib/roles";
import { SyncStatusBar } from "./sync-status.tsx";
import { UpdatePrompt } from "./update-prompt.tsx";

/** The manager's screens share one menu so the navigation stays on one row on a tablet. */
const SHOP_SCREENS = new Set(["/library", "/people", "/audit", "/yard"]);

/** A drop-down that closes when the place changes, when another is opened, or on a tap outside. */
function Menu({
  label,
  current,
  children,
  align = "left",
}: {
  label: React.ReactNode;
  current: boolean;
  children: React.ReactNode;
  align?: "left" | "right";
}) {
  const ref = useRef<HTMLDetailsElement>(null);
  const location = useLocation();
  useEffect(() => {
    if (ref.current) ref.current.open = false;
  }, [location.pathname]);
  useEffect(() => {
    const close = (event: PointerEvent) => {
      if (ref.current && !ref.current.contains(event.target as Node)) ref.current.open = false;
    };
    document.addEventListener("pointerdown", close);
    return () => document.removeEventListener("pointerdown", close);
  }, []);
  return (
    <details ref={ref} className="group relative">
      <summary
        className={`flex min-h-12 cursor-pointer list-none items-center gap-2 rounded-md px-3 font-bold ${
          current ? "bg-paper text-ink" : "text-paper hover:bg-ink-soft"
        }`}
      >
        {label}
        <span aria-hidden="true" className="text-sm transition-transform group-open:rotate-180">
          ▾
        </span>
      </summary>
      <div
        className={`absolute top-full z-30 mt-1 flex min-w-48 flex-col gap-1 rounded-md border border-rule bg-card p-1 text-ink shadow-lg ${
          align === "right" ? "right-0" : "left-0"
        }`}
      >
        {children}
      </div>
    </details>
  );
}

const linkClass = (isActive: boolean, inMenu = false) =>
  `flex min-h-12 items-center rounded-md px-3 font-bold no-underline ${
    inMenu
      ? isActive
        ? "bg-ink text-paper"
        : "text-ink hover:bg-paper"
      : isActive
        ? "bg-paper text-ink"
        : "text-paper hover:bg-ink-soft"
  }`;

export function AppShell({
  user,
  children,
}: {
  user: Actor & { name: string; role: Role };
  children: React.ReactNode;
}) {
  const location = useLocation();
  const items = navigationFor(user);
  const shop = items.filter((i) => SHOP_SCREENS.has(i.to));
  const grouped = shop.length > 1;
  const inline = grouped ? items.filter((i) => !SHOP_SCREENS.has(i.to)) : items;
  const currentShop = shop.find((i) => location.pathname.startsWith(i.to));
  return (
    <div className="flex min-h-dvh flex-col">
      <header className="sticky top-0 z-20 bg-ink text-paper">
        <div className="mx-auto flex max-w-6xl items-center gap-3 px-3 py-1">
          <a
            href="/"
            className="flex min-h-12 shrink-0 items-center gap-2 text-xl font-bold text-paper no-underline"
          >
            <img src="/icon.svg" alt="" width={32} height={32} />
            <span className="hidden lg:inline">Sternpost</span>
          </a>
          <nav aria-label="Main" className="flex flex-1 items-center gap-1">
            {inline.map((item) => (
              <NavLink
                key={item.to}
                to={item.to}
                end={item.to === "/"}
                className={({ isActive }) => linkClass(isActive)}
              >
                {item.label}
              </NavLink>
            ))}
            {grouped && (
              <Menu label={currentShop ? `Shop · ${currentShop.label}` : "Shop"} current={!!currentShop}>
                {shop.map((item) => (
                  <NavLink key={item.to} to={item.to} className={({ isActive }) => linkClass(isActive, true)}>
                    {item.label}
                  </NavLink>
                ))}
              </Menu>
            )}
          </nav>
          <Menu
            align="right"
            current={false}
            label={
              <span className="text-sm">
                {user.name.split(" ")[0]} · <span data-testid="role">{roleLabels[user.role]}</span>
              </span>
            }
          >
            <p className="px-3 py-2 text-sm">
              Signed in as <strong>{user.name}</strong>
            </p>
            <NavLink to="/account" className={({ isActive }) => linkClass(isActive, true)}>
              Account settings
            </NavLink>
            <Form method="post" action="/logout">
              <button type="submit" className="btn w-full">
                Sign out
              </button>
            </Form>
          </Menu>
        </div>
        {user.role !== "surveyor" && (
          <div className="border-t border-ink-soft">
            <div className="mx-auto max-w-6xl px-4 py-1">
              <SyncStatusBar />
            </div>
          </div>
        )}
      </header>
      <UpdatePrompt />
      <main className="mx-auto w-full max-w-6xl flex-1 px-4 py-6">{children}</main>
      <footer className="border-t border-rule px-4 py-3 text-center text-sm text-ink-soft">
        Sternpost records and computes; the engine maker's installation instructions, the applicable
        standards, local regulations and a qualified person's judgement govern the work.
      </footer>
    </div>
  );
}

export function PageHeader({ title, children }: { title: string; children?: React.ReactNode }) {
  return (
    <div className="mb-6 flex flex-wrap items-end justify-between gap-4">
      <h1 className="text-3xl font-bold">{title}</h1>
      {children && <div className="flex flex-wrap gap-2">{children}</div>}
    </div>
  );
}
