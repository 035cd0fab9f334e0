import { parseWithZod } from "@conform-to/zod/v4";
import { data, redirect } from "react-router";
import type { Route } from "./+types/new";
import { Refusal } from "~/lib/refusal";
import { PageHeader } from "~/components/app-shell";
import { VesselForm } from "~/components/vessel-form";
import { vesselSchema } from "~/lib/validation/vessels";
import { audit } from "~/server/audit.server";
import { requireCapability } from "~/server/permissions.server";
import { createVessel } from "~/server/vessels.server";

export const meta: Route.MetaFunction = () => [{ title: "Add a vessel · Sternpost" }];

export async function loader({ request }: Route.LoaderArgs) {
  await requireCapability(request, "vessels:create");
  return null;
}

export async function action({ request }: Route.ActionArgs) {
  const user = await requireCapability(request, "vessels:create");
  const submission = parseWithZod(await request.formData(), { schema: vesselSchema });
  if (submission.status !== "success") return data(submission.reply(), { status: 400 });
  try {
    const id = await createVessel(submission.value, user.id);
    await audit({ userId: user.id, action: "vessel.created", entity: "vessel", entityId: id });
    return redirect("/vessels");
  } catch (error) {
    if (error instanceof Refusal && error.field)
      return data(submission.reply({ fieldErrors: { [error.field]: [error.message] } }), {
        status: error.status,
      });
    throw error;
  }
}

export default function NewVessel({ actionData }: Route.ComponentProps) {
  return (
    <>
      <PageHeader title="Add a vessel" />
      <VesselForm lastResult={actionData} submitLabel="Save vessel" />
    </>
  );
}
