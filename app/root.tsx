import { useEffect } from "react";
import { isRouteErrorResponse, Links, Meta, Outlet, Scripts, ScrollRestoration } from "react-router";
import type { Route } from "./+types/root";
import { useNonce } from "./lib/nonce.ts";
import "./app.css";

export const links: Route.LinksFunction = () => [
  { rel: "icon", href: "/icon.svg", type: "image/svg+xml" },
  { rel: "manifest", href: "/manifest.webmanifest" },
  { rel: "apple-touch-icon", href: "/icon-192.png" },
];

export function Layout({ children }: { children: React.ReactNode }) {
  const nonce = useNonce();
  return (
    <html lang="en">
      <head>
        <meta charSet="utf-8" />
        <meta name="viewport" content="width=device-width, initial-scale=1" />
        <meta name="theme-color" content="#15212c" />
        <Meta />
        <Links />
      </head>
      <body className="min-h-dvh">
        {children}
        <ScrollRestoration nonce={nonce} />
        <Scripts nonce={nonce} />
      </body>
    </html>
  );
}

export default function App() {
  useEffect(() => {
    // Marks the page as interactive (scripts loaded, event handlers attached); tests wait for it.
    document.documentElement.dataset.hydrated = "true";
  }, []);
  return <Outlet />;
}

export function ErrorBoundary({ error }: Route.ErrorBoundaryProps) {
  let title = "Something went wrong";
  let message =
    "Sternpost hit an unexpected error. Your saved entries are safe; try again, and tell your manager if it repeats.";
  let stack: string | undefined;
  if (isRouteErrorResponse(error)) {
    const detail =
      typeof error.data === "object" && error.data?.message ? String(error.data.message) : undefined;
    if (error.status === 404) {
      title = "Not found (404)";
      message =
        detail ?? "There is no page at this address. It may have been moved, or the link is mistyped.";
    } else if (error.status === 403) {
      title = "Not yours to open (403)";
      message =
        detail ?? "Your role does not give access to this page. Ask your shop manager if you need it.";
    } else {
      title = `${error.status} ${error.statusText}`;
      message = detail ?? message;
    }
  } else if (import.meta.env.DEV && error instanceof Error) {
    message = error.message;
    stack = error.stack;
  }
  return (
    <main className="mx-auto max-w-2xl p-6">
      <p className="text-sm font-bold tracking-wide text-copper uppercase">Sternpost</p>
      <h1 className="mt-2 text-3xl font-bold">{title}</h1>
      <p className="mt-4 text-lg">{message}</p>
      <p className="mt-6 flex gap-3">
        <a className="btn btn-primary" href="/">
          Go to today's work
        </a>
      </p>
      {stack && <pre className="mt-6 overflow-auto rounded bg-card p-4 text-sm">{stack}</pre>}
    </main>
  );
}
