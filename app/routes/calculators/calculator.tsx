import { Link } from "react-router";
import type { Route } from "./+types/calculator";
import { requireCapability } from "~/server/permissions.server";
import { PageHeader } from "~/components/app-shell";
import { Calculator } from "~/components/calculators/calculator";
import { calculations } from "~/lib/calc";
import { checkWhenOnline } from "~/lib/offline/calculator-check";

const definitionOf = (name: string) => (Object.hasOwn(calculations, name) ? calculations[name] : undefined);

/** The calculators are part of the yard's work: a surveyor has no use for them (403). */
export async function loader({ request }: Route.LoaderArgs) {
  await requireCapability(request, "calculators:use");
  return null;
}

/** Offline, the page still opens: see checkWhenOnline. */
export const clientLoader = ({ serverLoader }: Route.ClientLoaderArgs) => checkWhenOnline(serverLoader);

export const meta: Route.MetaFunction = ({ params }) => [
  { title: `${definitionOf(params.name)?.title ?? "No such calculator"} · Sternpost` },
];

export default function CalculatorPage({ params }: Route.ComponentProps) {
  const definition = definitionOf(params.name);
  return (
    <>
      <p className="mb-1">
        <Link to="/calculators" className="font-bold text-harbour underline">
          ← Calculators
        </Link>
      </p>
      {definition ? (
        <>
          <PageHeader title={definition.title} />
          <p className="-mt-4 mb-6 text-ink-soft">{definition.summary}</p>
          <Calculator key={definition.name} definition={definition} />
        </>
      ) : (
        <>
          <PageHeader title="No such calculator" />
          <p role="alert" className="card">
            There is no calculator called “{params.name}”. Choose one from the{" "}
            <Link to="/calculators" className="font-bold text-harbour underline">
              list of calculators
            </Link>
            .
          </p>
        </>
      )}
    </>
  );
}
