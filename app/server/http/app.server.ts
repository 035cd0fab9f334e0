import { randomFillSync, randomUUID } from "node:crypto";
import { readdirSync } from "node:fs";
import type { IncomingMessage, ServerResponse } from "node:http";
import compression from "compression";
import express, { type NextFunction, type Request, type Response } from "express";
import helmet from "helmet";
import { pinoHttp } from "pino-http";
import type { ServerBuild } from "react-router";
import { databaseIsUp } from "../database-health.server.ts";
import { env } from "../env.server.ts";
import { logger } from "../logger.server.ts";
import { sendRefusal, sendUnavailable } from "./answers.server.ts";
import { reactRouterHandler } from "./bridge.server.ts";
import { refusal } from "./guards.server.ts";
import { SYNC_BUDGET_RETRY_S, syncBudgetRefusal } from "./sync-budget.server.ts";
import { startMailRetries } from "../mail-outbox.server.ts";

/** A path fit for a log line: no query string (it may carry anything) and no invitation token. */
export const loggedPath = (url: string) =>
  url.split("?")[0]!.replace(/^\/invitation\/[^/]+/, "/invitation/:token");

const requestLogger = pinoHttp({
  logger,
  genReqId: () => randomUUID(),
  // One line per request: id, method, route, status, time and user id; nothing from the body,
  // no cookie, no query string.
  serializers: {
    req: (req: { id: string; method: string; url: string }) => ({
      id: req.id,
      method: req.method,
      route: loggedPath(req.url),
    }),
    res: (res: { statusCode: number }) => ({ status: res.statusCode }),
    // pino-http makes up an error for every 5xx; the real ones are logged with their stack where
    // they happen (entry.server.tsx), so the made-up one is left out.
    err: () => undefined,
  },
  customProps: (_req: IncomingMessage, res: ServerResponse) => {
    const userId = (res as Response).locals?.userId;
    return userId ? { userId } : {};
  },
  customLogLevel: (_req, res, error) => (error || res.statusCode >= 500 ? "error" : "info"),
  customSuccessMessage: () => "request",
  customErrorMessage: () => "request",
});

/**
 * A fresh 128-bit nonce per response, cut from a pool of random bytes the system's generator
 * refills 256 nonces at a time (one call costs several microseconds; each slice is used once).
 */
const noncePool = Buffer.alloc(16 * 256);
let nonceAt = noncePool.length;
function cspNonce() {
  if (nonceAt === noncePool.length) {
    randomFillSync(noncePool);
    nonceAt = 0;
  }
  return noncePool.toString("base64", nonceAt, (nonceAt += 16));
}

/**
 * The static files at the root of the client build (the service worker, its manifest, icons),
 * listed once: every other request (pages, API, health) goes on without a look at the disk.
 */
function rootFiles() {
  const names = new Set(readdirSync("build/client").filter((name) => name !== "assets"));
  const serve = express.static("build/client", { maxAge: 0 });
  return (req: Request, res: Response, next: NextFunction) =>
    names.has(req.path.split("/")[1] ?? "") ? serve(req, res, next) : next();
}

const https = () => env().APP_URL.startsWith("https:");

/** Content-Security-Policy: this origin only, scripts and styles inline only with the request's nonce. */
const securityHeaders = () =>
  helmet({
    contentSecurityPolicy: {
      useDefaults: false,
      directives: {
        defaultSrc: ["'self'"],
        scriptSrc: ["'self'", (_req, res) => `'nonce-${(res as Response).locals.cspNonce}'`],
        styleSrc: ["'self'", (_req, res) => `'nonce-${(res as Response).locals.cspNonce}'`],
        imgSrc: ["'self'", "data:", "blob:"],
        fontSrc: ["'self'"],
        connectSrc: ["'self'"],
        workerSrc: ["'self'"],
        manifestSrc: ["'self'"],
        objectSrc: ["'none'"],
        baseUri: ["'self'"],
        formAction: ["'self'"],
        frameAncestors: ["'none'"],
        upgradeInsecureRequests: https() ? [] : null,
      },
    },
    strictTransportSecurity: https() ? { maxAge: 31_536_000, includeSubDomains: true } : false,
    referrerPolicy: { policy: "same-origin" },
    xFrameOptions: { action: "deny" },
    // Photos and fonts are this origin's own; nothing is embedded from elsewhere.
    crossOriginEmbedderPolicy: false,
  });

/**
 * The production HTTP server around React Router (server.js starts it): request logs, security
 * headers, static files, the checks every state-changing request passes, a bound on the refused
 * sync operations an account can leave behind, and 503 while the database is down. It keeps no state, so any number can run side by side.
 */
export function createHttpApp(build: ServerBuild) {
  // Mail the mail server did not take is tried again from here (every instance; each message once).
  startMailRetries();
  const app = express();
  app.disable("x-powered-by");
  if (process.env.TRUST_PROXY) app.set("trust proxy", process.env.TRUST_PROXY);
  app.use(requestLogger);
  app.use((_req, res, next) => {
    res.locals.cspNonce = cspNonce();
    res.set("Permissions-Policy", "camera=(self), geolocation=()");
    next();
  });
  app.use(securityHeaders());
  app.use(compression());
  app.use("/assets", express.static("build/client/assets", { immutable: true, maxAge: "1y" }));
  // The service worker and manifest must be revalidated so updates reach the tablets.
  app.use(rootFiles());

  app.use((req, res, next) => {
    const refused = refusal({
      method: req.method,
      pathname: req.path,
      ownOrigin: `${req.protocol}://${req.get("host")}`,
      header: (name) => req.get(name),
    });
    if (refused) return sendRefusal(req, res, refused);
    next();
  });
  app.use(async (req, res, next) => {
    if (await databaseIsUp()) return next();
    sendUnavailable(req, res);
  });
  app.post("/api/sync", async (req, res, next) => {
    const refused = await syncBudgetRefusal(req.get("cookie") ?? null);
    if (!refused) return next();
    res.set("Retry-After", String(SYNC_BUDGET_RETRY_S));
    sendRefusal(req, res, refused);
  });
  app.all(
    "*splat",
    reactRouterHandler(build, (req, res) => ({
      clientAddress: req.ip ?? req.socket.remoteAddress ?? "unknown",
      cspNonce: String(res.locals.cspNonce),
    })),
  );
  app.use((error: unknown, req: Request, res: Response, _next: NextFunction) => {
    logger.error({ err: error, requestId: req.id }, "unhandled error");
    if (!res.headersSent) res.status(500).type("text").send("Unexpected server error");
    else res.end();
  });
  return app;
}
