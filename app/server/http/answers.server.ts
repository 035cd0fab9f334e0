import type { Request as ExpressRequest, Response as ExpressResponse } from "express";
import { isApi, type Refusal } from "./guards.server.ts";

/** Seconds a client should wait before asking again while the database is away. */
export const RETRY_AFTER_S = 5;

/** Machines (the API, load balancers on /healthz) get JSON; people get a page. */
const wantsJson = (req: ExpressRequest) => isApi(req.path) || req.path === "/healthz";

const escape = (text: string) => text.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);

/** A plain page for people, in the app's words; styled by a nonce'd block (the CSP allows it). */
function page(res: ExpressResponse, title: string, message: string) {
  const nonce = String(res.locals.cspNonce ?? "");
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1"><title>${escape(title)} · Sternpost</title><style nonce="${nonce}">body{font-family:system-ui,sans-serif;max-width:40rem;margin:3rem auto;padding:0 1.5rem;color:#15212c;line-height:1.5}h1{font-size:1.8rem}</style></head><body><p><strong>Sternpost</strong></p><h1>${escape(title)}</h1><p>${escape(message)}</p><p><a href="/">Go to today's work</a></p></body></html>`;
}

/** A refusal before or instead of the route: JSON for the API, a page for people. */
export function sendRefusal(req: ExpressRequest, res: ExpressResponse, refusal: Refusal) {
  res.status(refusal.status);
  if (wantsJson(req)) return void res.json({ error: refusal.message });
  res.type("html").send(page(res, `Request refused (${refusal.status})`, refusal.message));
}

/** 503 while MariaDB is away: the tablet keeps its entries and tries again after Retry-After. */
export function sendUnavailable(req: ExpressRequest, res: ExpressResponse) {
  const message =
    "Sternpost cannot reach its database at the moment. Entries on the tablet are kept and sent when it is back; try again in a minute.";
  res.status(503).set({ "Retry-After": String(RETRY_AFTER_S), "Cache-Control": "no-store" });
  if (wantsJson(req)) return void res.json({ ok: false, error: message, retryAfterSeconds: RETRY_AFTER_S });
  res.type("html").send(page(res, "The server is unreachable for now (503)", message));
}
