import pino from "pino";

/**
 * One structured logger for the server: JSON lines on standard output (one per request, see
 * http/app.server.ts), read with `node server.js | npx pino-pretty` or any log shipper.
 * LOG_LEVEL sets the level (silent by default under vitest).
 */
export const logger = pino(
  {
    level: process.env.LOG_LEVEL ?? (process.env.NODE_ENV === "test" ? "silent" : "info"),
    base: { app: "sternpost" },
    // Belt and braces: these never reach a log line, whatever object is logged.
    redact: {
      paths: [
        "password",
        "*.password",
        "req.headers.cookie",
        "req.headers.authorization",
        "res.headers['set-cookie']",
      ],
      censor: "[hidden]",
    },
  },
  // Written asynchronously (buffered, flushed at exit): a synchronous write per request stalls
  // every request behind a slow reader of standard output.
  pino.destination({ dest: 1, sync: false }),
);
