/**
 * An error in words a person at the tablet can act on. A fetch that never reached the server
 * throws a TypeError whose text depends on the browser ("Failed to fetch", "Load failed",
 * "NetworkError when attempting to fetch resource."): that is the connection, never a message to
 * show as it is. A programming error (TypeError, RangeError…) shows the fallback; other errors
 * keep their own sentence (ours are written for people).
 */
const PROGRAMMING = new Set([
  "TypeError",
  "RangeError",
  "ReferenceError",
  "SyntaxError",
  "EvalError",
  "URIError",
]);

export function plainError(error: unknown, fallback = "Something went wrong on this tablet."): string {
  if (isNetworkError(error))
    return "No connection to the server right now; try again once the tablet is online.";
  if (
    error instanceof Error &&
    error.message &&
    !PROGRAMMING.has(error.name) &&
    !/^[A-Z][a-zA-Z]*Error\b/.test(error.message)
  )
    return error.message;
  return fallback;
}

export function isNetworkError(error: unknown): boolean {
  return (
    error instanceof TypeError &&
    /failed to fetch|load failed|networkerror|network request failed|fetch failed/i.test(error.message)
  );
}
