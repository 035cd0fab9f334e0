import type { Route } from "./+types/index";
import { PageHeader } from "~/components/app-shell";
import { CalculatorList } from "~/components/calculators/calculator-list";
import { calculations } from "~/lib/calc";

// No loader: the calculators compute in the browser and must work with no connection.
export const meta: Route.MetaFunction = () => [{ title: "Calculators · Sternpost" }];

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
