import { existsSync } from "node:fs";
import path from "node:path";
import { pathToFileURL } from "node:url";
import { createRequestHandler, type ServerBuild } from "react-router";
import { TEST_PASSWORD } from "./fixtures.ts";

const buildFile = path.resolve("build/server/index.js");

/** The production build's request handler, called in-process (npm test builds first). */
export async function appHandler() {
  if (!existsSync(buildFile))
    throw new Error("No production build: run `npx react-router build` first (npm test does).");
  const build = (await import(pathToFileURL(buildFile).href)) as ServerBuild;
  const handle = createRequestHandler(build, "production");
  return (url: string, init: RequestInit & { cookie?: string; clientAddress?: string } = {}) => {
    const { cookie, clientAddress = "127.0.0.1", ...rest } = init;
    const headers = new Headers(rest.headers);
    if (cookie) headers.set("Cookie", cookie);
    return handle(new Request(`http://localhost${url}`, { ...rest, headers, redirect: "manual" }), {
      clientAddress,
    });
  };
}

export async function signInCookie(
  app: Awaited<ReturnType<typeof appHandler>>,
  email: string,
  password = TEST_PASSWORD,
) {
  const response = await app("/login", {
    method: "POST",
    body: new URLSearchParams({ email, password, redirectTo: "/" }),
  });
  const cookie = response.headers.get("Set-Cookie");
  if (response.status !== 302 || !cookie) throw new Error(`Sign-in failed for ${email}: ${response.status}`);
  return cookie.split(";")[0]!;
}
