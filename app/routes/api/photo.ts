import type { Route } from "./+types/photo";
import { z } from "zod";
import { requireApiUser } from "~/server/auth.server";
import { env } from "~/server/env.server";
import { Refusal } from "~/lib/refusal";
import { readPhoto, storePhoto } from "~/server/photos.server";
import { problem } from "~/server/problem.server";

/**
 * PUT /api/photos/:photoId?checklistId=…&itemKey=… with the image bytes as the body: stores the
 * photo (201), or answers 200 when the same bytes are already stored under the id. Refusals:
 * 400 malformed, 401 signed out, 403 not the person's checklist, 404 no such checklist or item,
 * 409 checklist locked or different bytes for the id, 413 too large, 415 not JPEG/PNG/WebP.
 *
 * GET /api/photos/:photoId: the bytes, to people who may see the checklist.
 */

const placeSchema = z.object({
  checklistId: z.uuid({ error: "checklistId must be the checklist's UUID" }),
  itemKey: z.string().min(1, { error: "itemKey is missing" }).max(80, { error: "itemKey is too long" }),
});
const idSchema = z.uuid();

/** The body, or null once it passes `max` bytes (reading stops there). */
async function readBody(request: Request, max: number): Promise<Uint8Array | null> {
  if (Number(request.headers.get("Content-Length") ?? 0) > max) return null;
  if (!request.body) return new Uint8Array();
  const chunks: Uint8Array[] = [];
  let total = 0;
  const reader = request.body.getReader();
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    total += value.byteLength;
    if (total > max) {
      await reader.cancel();
      return null;
    }
    chunks.push(value);
  }
  const body = new Uint8Array(total);
  let at = 0;
  for (const chunk of chunks) {
    body.set(chunk, at);
    at += chunk.byteLength;
  }
  return body;
}

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireApiUser(request);
  if (!idSchema.safeParse(params.photoId).success) return problem(400, "A photo id is a UUID.");
  try {
    const photo = await readPhoto(user, params.photoId);
    // The SDK reads an object into a plain (never shared) ArrayBuffer.
    return new Response(photo.data as Uint8Array<ArrayBuffer>, {
      headers: {
        "Content-Type": photo.contentType,
        "Content-Length": String(photo.data.byteLength),
        // The bytes of an id never change, but only this person's browser may keep them.
        "Cache-Control": "private, max-age=31536000, immutable",
        ETag: `"${photo.sha256}"`,
      },
    });
  } catch (error) {
    if (error instanceof Refusal) return problem(error.status, error.message);
    throw error;
  }
}

export async function action({ request, params }: Route.ActionArgs) {
  if (request.method !== "PUT") return problem(405, "Send a photo with PUT.");
  const user = await requireApiUser(request);
  if (!idSchema.safeParse(params.photoId).success) return problem(400, "A photo id is a UUID.");
  const url = new URL(request.url);
  const place = placeSchema.safeParse({
    checklistId: url.searchParams.get("checklistId"),
    itemKey: url.searchParams.get("itemKey"),
  });
  if (!place.success) return problem(400, place.error.issues[0]!.message);
  const max = env().PHOTO_MAX_BYTES;
  const bytes = await readBody(request, max);
  if (!bytes) return problem(413, `A photo may be at most ${max} bytes.`);
  try {
    const { created, photo } = await storePhoto(user, { id: params.photoId, ...place.data, bytes });
    return Response.json(photo, { status: created ? 201 : 200 });
  } catch (error) {
    if (error instanceof Refusal) return problem(error.status, error.message);
    throw error;
  }
}
