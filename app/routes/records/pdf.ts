import type { Route } from "./+types/pdf";
import { photoBytes } from "~/server/photos.server";
import { requireRecord } from "~/server/record-access.server";
import { yardSettings } from "~/server/yard.server";

/** The record as a PDF, rendered from the stored snapshot (so it is the same every time). */
export async function loader({ request, params }: Route.LoaderArgs) {
  const { record } = await requireRecord(request, params.recordId);
  // The PDF library is loaded on the first PDF asked for, not with every server (memory).
  const { renderRecordPdf } = await import("~/server/record-pdf.server");
  const pdf = await renderRecordPdf(record.content, {
    digest: record.digest,
    verifyUrl: record.content.verifyUrl,
    photoBytes,
    timeZone: (await yardSettings()).timeZone,
  });
  const name = record.content.vessel.name.replace(/[^A-Za-z0-9]+/g, "-");
  return new Response(new Uint8Array(pdf), {
    headers: {
      "Content-Type": "application/pdf",
      "Content-Disposition": `attachment; filename="commissioning-record-${name}.pdf"`,
      "Cache-Control": "private, no-store",
    },
  });
}
