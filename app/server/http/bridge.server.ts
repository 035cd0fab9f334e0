import type { IncomingMessage } from "node:http";
import { writeReadableStreamToWritable } from "@react-router/node";
import type { Request as ExpressRequest, Response as ExpressResponse } from "express";
import { createRequestHandler, type AppLoadContext, type ServerBuild } from "react-router";
import { databaseIsUp } from "../database-health.server.ts";
import { REQUEST_ID_HEADER, takeNotes } from "../request-log.server.ts";
import { BodyOverLimit, bodyLimit, tooDeep, tooLarge, type Refusal } from "./guards.server.ts";
import { jsonDepthWatch } from "./json-depth.server.ts";
import { sendRefusal, sendUnavailable } from "./answers.server.ts";

/**
 * The request's body as a web stream that stops at `limit` bytes, or at JSON nested deeper than
 * MAX_JSON_DEPTH. Then the stream fails, `refuse` is told why (413 or 400), and the rest of the
 * body is read and dropped, never held.
 */
function limitedBody(req: IncomingMessage, limit: number, refuse: (refusal: Refusal) => void) {
  let total = 0;
  let settled = false;
  const depth = /^application\/json\b/i.test(req.headers["content-type"] ?? "") ? jsonDepthWatch() : null;
  return new ReadableStream<Uint8Array>(
    {
      start(controller) {
        const onData = (chunk: Buffer) => {
          total += chunk.byteLength;
          const refusal = total > limit ? tooLarge(limit) : depth && !depth.push(chunk) ? tooDeep() : null;
          if (refusal) {
            settled = true;
            refuse(refusal);
            controller.error(new BodyOverLimit());
            // Read the rest and drop it: memory stays flat and the client, still sending, gets
            // its 413 instead of a reset connection.
            req.off("data", onData);
            req.resume();
            return;
          }
          controller.enqueue(new Uint8Array(chunk.buffer, chunk.byteOffset, chunk.byteLength));
          if ((controller.desiredSize ?? 1) <= 0) req.pause();
        };
        req.on("data", onData);
        req.on("end", () => {
          if (!settled) controller.close();
          settled = true;
        });
        req.on("error", (error) => {
          if (!settled) controller.error(error);
          settled = true;
        });
      },
      pull() {
        req.resume();
      },
      cancel() {
        // The route stopped reading: drop the rest rather than leave the client hanging.
        settled = true;
        req.resume();
      },
    },
    { highWaterMark: 64 * 1024, size: (chunk) => chunk.byteLength },
  );
}

function webRequest(req: ExpressRequest, res: ExpressResponse, refuse: (refusal: Refusal) => void) {
  const url = new URL(req.originalUrl, `${req.protocol}://${req.get("host") ?? "localhost"}`);
  const headers = new Headers();
  for (const [key, value] of Object.entries(req.headers)) {
    if (Array.isArray(value)) for (const v of value) headers.append(key, v);
    else if (value !== undefined) headers.set(key, value);
  }
  headers.set(REQUEST_ID_HEADER, String(req.id));
  const controller = new AbortController();
  res.on("close", () => {
    if (!res.writableFinished) controller.abort();
  });
  const init: RequestInit & { duplex?: "half" } = { method: req.method, headers, signal: controller.signal };
  if (req.method !== "GET" && req.method !== "HEAD") {
    init.body = limitedBody(req, bodyLimit(url.pathname), refuse);
    init.duplex = "half";
  }
  return new Request(url, init);
}

async function send(res: ExpressResponse, response: Response) {
  if (res.destroyed || res.writableEnded) return void (await response.body?.cancel());
  res.statusMessage = response.statusText;
  res.status(response.status);
  for (const [key, value] of response.headers.entries()) res.append(key, value);
  if (response.body) await writeReadableStreamToWritable(response.body, res);
  else res.end();
}

/**
 * Hands a request to React Router with its body limited, and turns the route's answer into the
 * right status when the route could not know it: 413 when the body ran over its limit while being
 * read (also for chunked bodies), 400 for JSON nested too deep or when a body claiming to be a form was not one, 503 while the
 * database is down.
 */
export function reactRouterHandler(
  build: ServerBuild,
  loadContext: (req: ExpressRequest, res: ExpressResponse) => AppLoadContext,
) {
  const handle = createRequestHandler(build, process.env.NODE_ENV);
  return async (req: ExpressRequest, res: ExpressResponse) => {
    let overflow: Refusal | null = null;
    const request = webRequest(req, res, (refusal) => (overflow = refusal));
    // Whatever of the body the route left unread is read and dropped once the answer is out, so a
    // client still sending gets its answer instead of a stalled or reset connection.
    res.once("finish", () => {
      if (req.complete) return;
      req.removeAllListeners("data");
      req.resume();
    });
    const response = await handle(request, loadContext(req, res));
    const notes = takeNotes(String(req.id));
    if (notes.userId) res.locals.userId = notes.userId;
    if (overflow) {
      await response.body?.cancel();
      return sendRefusal(req, res, overflow);
    }
    if (response.status >= 500 && notes.unreadableBody) {
      await response.body?.cancel();
      return sendRefusal(req, res, { status: 400, message: "The request's body could not be read as sent." });
    }
    if (response.status >= 500 && !(await databaseIsUp({ fresh: true }))) {
      await response.body?.cancel();
      return sendUnavailable(req, res);
    }
    await send(res, response);
  };
}
