import { parseWithZod } from "@conform-to/zod/v4";
import { data, redirect } from "react-router";
import type { Route } from "./+types/edit";
import { Refusal } from "~/lib/refusal";
import { PageHeader } from "~/components/app-shell";
import { VesselForm } from "~/components/vessel-form";
import { canEditVessel } from "~/lib/permissions";
import { vesselSchema } from "~/lib/validation/vessels";
import { audit } from "~/server/audit.server";
import { requireUser } from "~/server/auth.server";
import { invariantForbidden, invariantFound } from "~/server/permissions.server";
import { findVessel, updateVessel } from "~/server/vessels.server";
import { vesselFigures, vesselJobsAndRecords } from "~/server/vessel-history.server";
import { VesselHistory } from "~/components/vessel-history";

export const meta: Route.MetaFunction = ({ data }) => [
  { title: `${data?.vessel.name ?? "Vessel"} · Sternpost` },
];

async function editableVessel(request: Request, id: string) {
  const user = await requireUser(request);
  const vessel = Number.isInteger(Number(id)) ? await findVessel(Number(id)) : undefined;
  invariantFound(vessel, "There is no such vessel.");
  invariantForbidden(
    canEditVessel(user, vessel),
    "Only the shop manager or a lead with a job on this vessel may edit it.",
  );
  return { user, vessel };
}

export async function loader({ request, params }: Route.LoaderArgs) {
  const { vessel } = await editableVessel(request, params.vesselId);
  return { vessel, ...(await vesselJobsAndRecords(vessel.id)), figures: await vesselFigures(vessel.id) };
}

export async function action({ request, params }: Route.ActionArgs) {
  const { user, vessel } = await editableVessel(request, params.vesselId);
  const submission = parseWithZod(await request.formData(), { schema: vesselSchema });
  if (submission.status !== "success") return data(submission.reply(), { status: 400 });
  try {
    await updateVessel(vessel.id, submission.value);
  } catch (error) {
    if (error instanceof Refusal && error.field)
      return data(submission.reply({ fieldErrors: { [error.field]: [error.message] } }), {
        status: error.status,
      });
    throw error;
  }
  await audit({ userId: user.id, action: "vessel.updated", entity: "vessel", entityId: vessel.id });
  return redirect("/vessels");
}

export default function EditVessel({ loaderData, actionData }: Route.ComponentProps) {
  const { id: _, createdBy: __, leadIds: ___, lengthM: ____, ...defaults } = loaderData.vessel;
  return (
    <>
      <PageHeader title={`Vessel: ${loaderData.vessel.name}`} />
      <VesselHistory jobs={loaderData.jobs} records={loaderData.records} figures={loaderData.figures} />
      <h2 className="mt-6 mb-2 text-2xl font-bold">Details</h2>
      <VesselForm defaults={defaults} lastResult={actionData} submitLabel="Save changes" />
    </>
  );
}
