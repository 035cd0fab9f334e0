import { Link } from "react-router";
import type { Route } from "./+types/view";
import { ChecklistOutline } from "~/components/checklist/checklist-outline";
import { checklistStateLabels } from "~/lib/checklist-sets";
import { requireChecklist } from "~/server/checklist-access.server";

export const meta: Route.MetaFunction = ({ data }) => [{ title: `${data?.checklist.title ?? "Checklist"} · Sternpost` }];

export async function loader({ request, params }: Route.LoaderArgs) {
  const { checklist, job } = await requireChecklist(request, params.checklistId);
  return { checklist, job: { id: job.id, vesselName: job.vesselName } };
}

export default function ChecklistView({ loaderData }: Route.ComponentProps) {
  const { checklist, job } = loaderData;
  return (
    <>
      <p className="mb-1">
        <Link to={`/jobs/${job.id}`} className="font-bold text-harbour underline">
          ← {job.vesselName}
        </Link>
      </p>
      <div className="mb-6 flex flex-wrap items-end justify-between gap-2">
        <h1 className="text-3xl font-bold">{checklist.title}</h1>
        <p className="text-lg">
          Version {checklist.version} · {checklistStateLabels[checklist.state]}
        </p>
      </div>
      {checklist.newerVersion && (
        <p className="mb-4 rounded-md border-2 border-harbour p-3">
          Version {checklist.newerVersion} of this template has been published since; this checklist stays on version {checklist.version}.
        </p>
      )}
      <ChecklistOutline template={checklist.template} />
    </>
  );
}
