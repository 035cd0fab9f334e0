import { PassThrough } from "node:stream";
import { createReadableStreamFromReadable } from "@react-router/node";
import { isbot } from "isbot";
import { renderToPipeableStream, type RenderToPipeableStreamOptions } from "react-dom/server";
import {
  ServerRouter,
  type ActionFunctionArgs,
  type AppLoadContext,
  type EntryContext,
  type LoaderFunctionArgs,
} from "react-router";
import { NonceContext } from "~/lib/nonce";
import { BodyOverLimit } from "~/server/http/guards.server";
import { logger } from "~/server/logger.server";
import { noteUnreadableBody, REQUEST_ID_HEADER } from "~/server/request-log.server";

// server.js builds its HTTP server from the bundle through this export (see decision 050).
export { createHttpApp } from "~/server/http/app.server";

export const streamTimeout = 5_000;

/** React Router's Node entry, with the response's CSP nonce on every script it writes. */
export default function handleRequest(
  request: Request,
  responseStatusCode: number,
  responseHeaders: Headers,
  routerContext: EntryContext,
  loadContext: AppLoadContext,
) {
  if (request.method.toUpperCase() === "HEAD") {
    return new Response(null, { status: responseStatusCode, headers: responseHeaders });
  }
  const nonce = loadContext.cspNonce;
  return new Promise<Response>((resolve, reject) => {
    let shellRendered = false;
    const userAgent = request.headers.get("user-agent");
    const readyOption: keyof RenderToPipeableStreamOptions =
      (userAgent && isbot(userAgent)) || routerContext.isSpaMode ? "onAllReady" : "onShellReady";
    let timeoutId: ReturnType<typeof setTimeout> | undefined = setTimeout(
      () => abort(),
      streamTimeout + 1000,
    );

    const { pipe, abort } = renderToPipeableStream(
      <NonceContext.Provider value={nonce ?? ""}>
        <ServerRouter context={routerContext} url={request.url} nonce={nonce} />
      </NonceContext.Provider>,
      {
        nonce,
        [readyOption]() {
          shellRendered = true;
          const body = new PassThrough({
            final(callback) {
              clearTimeout(timeoutId);
              timeoutId = undefined;
              callback();
            },
          });
          responseHeaders.set("Content-Type", "text/html");
          pipe(body);
          resolve(
            new Response(createReadableStreamFromReadable(body), {
              headers: responseHeaders,
              status: responseStatusCode,
            }),
          );
        },
        onShellError(error: unknown) {
          reject(error);
        },
        onError(error: unknown) {
          responseStatusCode = 500;
          if (shellRendered) logger.error({ err: error }, "error while streaming a page");
        },
      },
    );
  });
}

/** A body that claims to be a form and is not one: the route could not read it. */
const unreadableBody = (error: unknown) =>
  error instanceof TypeError && /form ?data|body|multipart|boundary/i.test(error.message);

/**
 * Errors a loader or action did not expect. Their stack is logged once, here, with the request's
 * id; a broken request body is noted so the HTTP layer answers 400 instead of 500.
 */
export function handleError(error: unknown, { request }: LoaderFunctionArgs | ActionFunctionArgs) {
  // Answered by the HTTP layer (413) or gone: nothing to log.
  if (request.signal.aborted || error instanceof BodyOverLimit) return;
  const requestId = request.headers.get(REQUEST_ID_HEADER) ?? undefined;
  if (unreadableBody(error)) {
    noteUnreadableBody(request);
    logger.info({ requestId, reason: (error as Error).message }, "unreadable request body");
    return;
  }
  logger.error({ err: error, requestId }, "unexpected error in a route");
}
