import { MAX_SYNC_BODY_BYTES } from "~/lib/sync/protocol";
import { env } from "../env.server.ts";
import { MAX_JSON_DEPTH } from "./json-depth.server.ts";

/** The largest body of a page's form (templates, the biggest forms, are ~20 kB). */
export const FORM_MAX_BYTES = 1024 * 1024;

const READS_NO_BODY = new Set(["GET", "HEAD", "OPTIONS"]);

export const isApi = (pathname: string) => pathname === "/api" || pathname.startsWith("/api/");

/** How many body bytes a request to this path may carry (photos and sync have their own limits). */
export function bodyLimit(pathname: string): number {
  if (pathname === "/api/sync") return MAX_SYNC_BODY_BYTES;
  if (pathname.startsWith("/api/photos/")) return env().PHOTO_MAX_BYTES;
  return FORM_MAX_BYTES;
}

export interface Refusal {
  status: 400 | 403 | 413 | 415 | 429;
  message: string;
}

interface Incoming {
  method: string;
  pathname: string;
  /** The origin the request was addressed to (scheme, host and port as the server saw them). */
  ownOrigin: string;
  header(name: string): string | undefined;
}

const mediaType = (header: string | undefined) => header?.split(";")[0]!.trim().toLowerCase() ?? "";
// Pages take forms, and JSON from code (fetcher.submit with encType "application/json").
const PAGE_BODY_TYPES = new Set([
  "application/x-www-form-urlencoded",
  "multipart/form-data",
  "application/json",
]);

/**
 * Checks made before a state-changing request reaches a route: it comes from this site (the
 * Origin header, or Sec-Fetch-Site where a browser sends no Origin), it is no larger than its
 * route accepts as declared, and its body is of a kind the route can read — a form (or JSON from
 * code) for pages, JSON for the sync API. null when the request may go on.
 */
export function refusal(req: Incoming): Refusal | null {
  if (READS_NO_BODY.has(req.method)) return null;
  const origin = req.header("origin");
  const allowed = new Set([req.ownOrigin, new URL(env().APP_URL).origin]);
  if (origin ? !allowed.has(origin) : req.header("sec-fetch-site") === "cross-site") {
    return { status: 403, message: "This request came from another site and was refused." };
  }
  const declared = Number(req.header("content-length") ?? 0);
  const limit = bodyLimit(req.pathname);
  if (declared > limit) return tooLarge(limit);
  const type = mediaType(req.header("content-type"));
  const hasBody = declared > 0 || req.header("transfer-encoding") !== undefined;
  if (req.pathname === "/api/sync" && type !== "application/json") {
    return { status: 415, message: "Send the sync request as application/json." };
  }
  if (!isApi(req.pathname) && hasBody && !PAGE_BODY_TYPES.has(type)) {
    return { status: 415, message: "This page takes a form; the request's body was something else." };
  }
  return null;
}

export const tooLarge = (limit: number): Refusal => ({
  status: 413,
  message: `This request is larger than the ${Math.round(limit / 1024)} kB this address accepts.`,
});

export const tooDeep = (): Refusal => ({
  status: 400,
  message: `The JSON in this request is nested more than ${MAX_JSON_DEPTH} levels deep.`,
});

/** Raised inside a route's body stream when the body runs past its limit or its depth (413, 400). */
export class BodyOverLimit extends Error {
  constructor() {
    super("request body over its limit");
  }
}
