import { Link } from "react-router";
import type { Route } from "./+types/list";
import { PageHeader } from "~/components/app-shell";
import { can, canEditVessel } from "~/lib/permissions";
import { hullTypeLabels } from "~/lib/validation/vessels";
import { requireCapability } from "~/server/permissions.server";
import { listVessels } from "~/server/vessels.server";

export const meta: Route.MetaFunction = () => [{ title: "Vessels · Sternpost" }];

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireCapability(request, "vessels:view");
  const vessels = await listVessels();
  return {
    canCreate: can(user, "vessels:create"),
    vessels: vessels.map((v) => ({ ...v, editable: canEditVessel(user, v) })),
  };
}

export default function Vessels({ loaderData }: Route.ComponentProps) {
  return (
    <>
      <PageHeader title="Vessels">
        {loaderData.canCreate && (
          <Link className="btn btn-primary" to="/vessels/new">
            Add a vessel
          </Link>
        )}
      </PageHeader>
      <table className="w-full border-collapse">
        <thead>
          <tr className="border-b-2 border-ink text-left">
            <th className="p-2">Name</th>
            <th className="p-2">HIN</th>
            <th className="p-2">Length</th>
            <th className="p-2">Hull</th>
            <th className="p-2">Owner</th>
          </tr>
        </thead>
        <tbody>
          {loaderData.vessels.map((v) => (
            <tr key={v.id} className="border-b border-rule">
              <td className="p-2 font-bold">
                {v.editable ? (
                  <Link className="flex min-h-12 items-center text-harbour underline" to={`/vessels/${v.id}`}>
                    {v.name}
                  </Link>
                ) : (
                  v.name
                )}
              </td>
              <td className="p-2 font-mono">{v.hin ?? "—"}</td>
              <td className="num p-2">
                {v.lengthValue} {v.lengthUnit}
              </td>
              <td className="p-2">{hullTypeLabels[v.hullType]}</td>
              <td className="p-2">{v.ownerName}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </>
  );
}
