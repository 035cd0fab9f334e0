import { Link } from "react-router";
import type { CalcDefinition } from "~/lib/calc";

/** The calculations grouped by the part of the job they serve; any the groups do not name come last. */
const groups: { title: string; names: string[] }[] = [
  {
    title: "Shaft and coupling",
    names: ["shaftRunout", "couplingFace", "couplingRim", "couplingFit", "isoFit"],
  },
  {
    title: "Keys, tapers and threads",
    names: ["keyForShaft", "keyForShaftMm", "propellerTaper", "threadPitch"],
  },
  { title: "Engine alignment", names: ["mountMoves", "shimStack"] },
  { title: "Shaft size and bearings", names: ["shaftDiameter", "bearingSpacing"] },
  { title: "Propeller and sea trial", names: ["propSlip", "seaTrialLoading"] },
  { title: "Exhaust", names: ["exhaustInjection", "exhaustBackPressure"] },
  { title: "Electrical", names: ["wireSize"] },
  { title: "Hull", names: ["validateHin"] },
];

export function CalculatorList({ calculations }: { calculations: Record<string, CalcDefinition> }) {
  const grouped = new Set(groups.flatMap((g) => g.names));
  const sections = [
    ...groups.map((g) => ({
      title: g.title,
      items: g.names.filter((n) => Object.hasOwn(calculations, n)).map((n) => calculations[n]),
    })),
    { title: "Other", items: Object.values(calculations).filter((c) => !grouped.has(c.name)) },
  ].filter((s) => s.items.length > 0);
  return (
    <div className="flex flex-col gap-8">
      {sections.map((section) => (
        <section key={section.title} aria-labelledby={`group-${section.title}`}>
          <h2 id={`group-${section.title}`} className="mb-3 text-xl font-bold">
            {section.title}
          </h2>
          <ul className="grid gap-3 md:grid-cols-2">
            {section.items.map((c) => (
              <li key={c.name}>
                <Link
                  to={`/calculators/${c.name}`}
                  className="card flex min-h-12 flex-col gap-1 no-underline hover:border-copper"
                >
                  <span className="text-lg font-bold text-harbour underline">{c.title}</span>
                  <span className="text-ink">{c.summary}</span>
                </Link>
              </li>
            ))}
          </ul>
        </section>
      ))}
    </div>
  );
}
