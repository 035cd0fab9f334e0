import { isRouteErrorResponse } from "react-router";

/** What to tell a person about an error thrown by a loader, an action or a render. */
export function describeError(error: unknown): { title: string; message: string; stack?: string } {
  const fallback =
    "Sternpost hit an unexpected error. Your saved entries are safe; try again, and tell your manager if it repeats.";
  if (isRouteErrorResponse(error)) {
    const detail =
      typeof error.data === "object" && error.data?.message ? String(error.data.message) : undefined;
    if (error.status === 404)
      return {
        title: "Not found (404)",
        message:
          detail ?? "There is no page at this address. It may have been moved, or the link is mistyped.",
      };
    if (error.status === 403)
      return {
        title: "Not yours to open (403)",
        message:
          detail ?? "Your role does not give access to this page. Ask your shop manager if you need it.",
      };
    if (error.status === 503)
      return {
        title: "The server cannot reach its database (503)",
        message: detail ?? "Entries made on this tablet are kept and will be sent when the server is back.",
      };
    return { title: `${error.status} ${error.statusText}`, message: detail ?? fallback };
  }
  if (import.meta.env.DEV && error instanceof Error)
    return { title: "Something went wrong", message: error.message, stack: error.stack };
  return { title: "Something went wrong", message: fallback };
}

export function ErrorMessage({ error }: { error: unknown }) {
  const { title, message, stack } = describeError(error);
  return (
    <div className="mx-auto max-w-2xl" data-testid="error-page">
      <p className="text-sm font-bold tracking-wide text-copper uppercase">Sternpost</p>
      <h1 className="mt-2 text-3xl font-bold">{title}</h1>
      <p className="mt-4 text-lg">{message}</p>
      <p className="mt-6 flex gap-3">
        <a className="btn btn-primary" href="/">
          Go to today's work
        </a>
      </p>
      {stack && <pre className="mt-6 overflow-auto rounded bg-card p-4 text-sm">{stack}</pre>}
    </div>
  );
}
