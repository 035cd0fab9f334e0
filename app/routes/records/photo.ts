import { fileTypeFromBuffer } from "file-type";
import { data } from "react-router";
import type { Route } from "./+types/photo";
import { photoBytes } from "~/server/photos.server";
import { requireRecord } from "~/server/record-access.server";

/** A photo of an issued record, for whoever may read the record (surveyors included). */
export async function loader({ request, params }: Route.LoaderArgs) {
  const { record } = await requireRecord(request, params.recordId);
  const listed = record.content.checklists.some((c) => c.photos.some((p) => p.id === params.photoId));
  if (!listed) throw data({ message: "This photo is not part of the record." }, { status: 404 });
  const bytes = await photoBytes(params.photoId);
  if (!bytes) throw data({ message: "The photo file is missing from the store." }, { status: 404 });
  const type = (await fileTypeFromBuffer(bytes))?.mime ?? "application/octet-stream";
  return new Response(new Uint8Array(bytes), {
    headers: {
      "Content-Type": type,
      "Cache-Control": "private, max-age=3600",
      "X-Content-Type-Options": "nosniff",
    },
  });
}
