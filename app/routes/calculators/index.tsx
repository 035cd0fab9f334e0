import type { Route } from "./+types/index";
import { requireCapability } from "~/server/permissions.server";
import { PageHeader } from "~/components/app-shell";
import { CalculatorList } from "~/components/calculators/calculator-list";
import { calculations } from "~/lib/calc";
import { checkWhenOnline } from "~/lib/offline/calculator-check";

export const meta: Route.MetaFunction = () => [{ title: "Calculators · Sternpost" }];

/** The calculators are part of the yard's work: a surveyor has no use for them (403). */
export async function loader({ request }: Route.LoaderArgs) {
  await requireCapability(request, "calculators:use");
  return null;
}

/** Offline, the page still opens: see checkWhenOnline. */
export const clientLoader = ({ serverLoader }: Route.ClientLoaderArgs) => checkWhenOnline(serverLoader);

export default function Calculators() {
  return (
    <>
      <PageHeader title="Calculators" />
      <p className="mb-6 max-w-3xl text-ink-soft">
        The arithmetic of the job, worked on this tablet with or without a connection. Each one says the rule
        it applies and where the rule comes from; the engine maker's instructions and a qualified person's
        judgement govern.
      </p>
      <CalculatorList calculations={calculations} />
    </>
  );
}
