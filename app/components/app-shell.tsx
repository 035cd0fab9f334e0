import { Form, NavLink } from "react-router";
import { navigationFor, type Actor } from "~/lib/permissions";
import { roleLabels, type Role } from "~/lib/roles";
import { SyncStatusBar } from "./sync-status.tsx";
import { UpdatePrompt } from "./update-prompt.tsx";

export function AppShell({
  user,
  children,
}: {
  user: Actor & { name: string; role: Role };
  children: React.ReactNode;
}) {
  return (
    <div className="flex min-h-dvh flex-col">
      <header className="bg-ink text-paper">
        <div className="mx-auto flex max-w-6xl flex-wrap items-center gap-x-6 gap-y-2 px-4 py-2">
          <a href="/" className="flex min-h-12 items-center gap-2 text-xl font-bold text-paper no-underline">
            <img src="/icon.svg" alt="" width={32} height={32} />
            Sternpost
          </a>
          <nav aria-label="Main" className="flex flex-1 flex-wrap gap-1">
            {navigationFor(user).map((item) => (
              <NavLink
                key={item.to}
                to={item.to}
                end={item.to === "/"}
                className={({ isActive }) =>
                  `flex min-h-12 items-center rounded-md px-4 font-bold no-underline ${
                    isActive ? "bg-paper text-ink" : "text-paper hover:bg-ink-soft"
                  }`
                }
              >
                {item.label}
              </NavLink>
            ))}
          </nav>
          <div className="flex items-center gap-3">
            <span className="text-sm">
              {user.name} · <span data-testid="role">{roleLabels[user.role]}</span>
            </span>
            <Form method="post" action="/logout">
              <button type="submit" className="btn border-paper bg-ink text-paper hover:bg-ink-soft">
                Sign out
              </button>
            </Form>
          </div>
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
