import { useEffect, useMemo, useState } from "react";
import { convert, runCalc, type CalcDefinition, type RunoutResult } from "~/lib/calc";
import { diagramFor, type LengthUnit } from "~/components/diagrams";
import {
  carriedBy,
  entryFor,
  hasInchLengths,
  initialEntries,
  readEntries,
  withLengthSystem,
  type Entries,
  type LengthSystem,
} from "./calc-entries";
import { EntryField } from "./calc-fields";
import { CalcResult, Caution } from "./calc-result";
import { plottableRuns, SpeedRuns, type SpeedRun } from "./speed-runs";
import { StraighteningLog } from "./straightening-log";

/** What to know before entering numbers: the conventions a calculation's inputs follow. */
const conventions: Record<string, string> = {
  shaftRunout:
    "At each station, read the dial at equal angles around one full turn. TIR is the largest reading minus the smallest, so the dial may be zeroed anywhere. The high spot is where the shaft bows toward the dial.",
  couplingFace:
    "Feeler gaps between the coupling faces at top, bottom, port and starboard, seen from aft. A gap larger at the top means the engine's nose is low; larger to starboard, the nose points to port.",
  couplingRim:
    "Dial clamped to the shaft's half, plunger on the rim of the engine's half, both halves turned together. The offset is half the difference of opposite readings; the two side readings added should equal top and bottom added.",
  mountMoves:
    "The engine moves, the shaft does not. Distances are measured forward from the coupling face to the front and rear mounts. Offset: how far the engine's coupling centre sits above the shaft's (negative: below) and to starboard (negative: to port), or give the rim readings instead. A gap larger at the top means the engine's nose is low. The result says each move in words (raise or lower, to port or to starboard) as the diagram's arrows show it; nut turns come from threads per inch or a metric pitch in mm. These are instructions: the face and rim checks give the verdict.",
  couplingFit:
    "Measure the shaft and the bore in several places and enter every reading: the largest shaft reading against the smallest bore reading decides the fit. Give the coupling maker's clearance limits for a verdict (negative = interference).",
  conductorCheck:
    "Round-trip length: from the source to the load and back. Conductor as printed on it (16, 1/0) or in mm² (2.5 mm²). Insulation rating in °C as printed on the cable (105 for most boat cable). Inside an engine space: yes or no.",
  speedRuns:
    "Run the same distance in opposite directions, one leg after the other, and enter each leg's time: the speed is the mean of the speeds over and back, which takes out the current.",
  heeledHeight:
    "Height of the point above the waterline with the boat upright, and its distance off the centreline towards the side that goes down.",
  tachPulses: "Pulley diameters in the same unit; poles as given by the alternator maker (often 12 or 14).",
  installationAngle:
    "Engine angle at rest, front up positive (on the engine's level pad), and the hull's bow-up trim under way.",
  propSlip:
    "Speed through the water: the mean of the speeds of two runs in opposite directions takes out the current (use Speed from timed runs).",
  seaTrialLoading:
    "Wide-open-throttle rpm with the boat at its normal load; the rated band is the engine maker's.",
  wireSize:
    "Round-trip length: from the source to the load and back again. 3 % drop for critical circuits, 10 % for others (ABYC E-11).",
};

const LENGTHS_KEY = "sternpost.calculator-lengths";

/**
 * One calculation: its inputs in the shop's units, the result as you type, the verdict, rule and
 * source, the caution, and the diagram. Runs in the browser only; nothing is sent anywhere.
 */
export function Calculator({ definition }: { definition: CalcDefinition }) {
  const { name } = definition;
  const [entries, setEntries] = useState<Entries>(() => initialEntries(name, definition.inputs));
  const [runs, setRuns] = useState<SpeedRun[]>([
    { rpm: "", knots: "" },
    { rpm: "", knots: "" },
  ]);
  // Inches first: the library's own unit and the one most of its inputs default to.
  const [system, setSystem] = useState<LengthSystem>("inch");

  // The shop's last choice of inches or millimetres, once the page is live (the server cannot know it).
  useEffect(() => {
    const saved = window.localStorage.getItem(LENGTHS_KEY);
    if (saved === "metric") {
      setSystem(saved);
      setEntries((current) => withLengthSystem(current, definition.inputs, saved));
    }
  }, [definition]);
  const chooseSystem = (next: LengthSystem) => {
    window.localStorage.setItem(LENGTHS_KEY, next);
    setSystem(next);
    setEntries((current) => withLengthSystem(current, definition.inputs, next));
  };

  const read = useMemo(() => readEntries(name, definition.inputs, entries), [name, definition, entries]);
  const ready = read.waiting.length === 0 && Object.keys(read.invalid).length === 0;
  const run = useMemo(() => (ready ? runCalc(name, read.inputs) : null), [ready, name, read]);
  const outcome = run && !("error" in run) ? run : null;
  const failure = run && "error" in run ? run.error : null;

  const errors: Record<string, string> = { ...read.invalid };
  if (failure) errors[entryFor(name, failure.field)] = failure.message;
  const unplaced = failure && !Object.hasOwn(entries, entryFor(name, failure.field)) ? failure.message : null;

  const lengthUnit: LengthUnit = system === "metric" ? "mm" : "in";
  const diagram = outcome
    ? diagramFor(name, outcome.detail, read.inputs, { lengthUnit, speedRuns: plottableRuns(runs) })
    : null;
  const limitTirIn =
    name === "shaftRunout" && read.inputs.limitTir?.kind === "number"
      ? convert(read.inputs.limitTir.value, read.inputs.limitTir.unit, "in")
      : undefined;

  const carried = carriedBy[name] ?? {};
  // A table of readings needs the full width; the result then follows the inputs.
  const wide = Object.values(entries).some((e) => e.shape === "grid");
  return (
    <div className="flex flex-col gap-6">
      {definition.caution && <Caution>{definition.caution}</Caution>}
      <div className={`grid items-start gap-6 ${wide ? "" : "md:grid-cols-2"}`}>
        <form
          className="card flex flex-col gap-5"
          onSubmit={(e) => e.preventDefault()}
          aria-label={`${definition.title}: inputs`}
        >
          {conventions[name] && <p className="text-ink-soft">{conventions[name]}</p>}
          {hasInchLengths(definition.inputs) && (
            <div className="flex flex-wrap items-center gap-2" role="group" aria-label="Lengths in">
              <span className="font-bold">Lengths in</span>
              {(["inch", "metric"] as const).map((option) => (
                <button
                  key={option}
                  type="button"
                  aria-pressed={system === option}
                  className={system === option ? "btn btn-primary" : "btn"}
                  onClick={() => chooseSystem(option)}
                >
                  {option === "inch" ? "Inches" : "Millimetres"}
                </button>
              ))}
            </div>
          )}
          {Object.entries(definition.inputs).map(([inputName, spec]) => {
            const entry = entries[inputName];
            if (!entry) return null;
            const carriedName = Object.keys(carried).find((n) => carried[n] === inputName);
            return (
              <EntryField
                key={inputName}
                calcName={name}
                name={inputName}
                spec={spec}
                carried={carriedName ? definition.inputs[carriedName] : undefined}
                entry={entry}
                error={errors[inputName]}
                onChange={(next) => setEntries((current) => ({ ...current, [inputName]: next }))}
              />
            );
          })}
          {name === "seaTrialLoading" && <SpeedRuns runs={runs} onChange={setRuns} />}
        </form>

        <section
          className={`card flex flex-col gap-4 ${wide ? "" : "md:sticky md:top-4"}`}
          aria-labelledby="result-heading"
          aria-live="polite"
        >
          <h2 id="result-heading" className="text-xl font-bold">
            Result
          </h2>
          {outcome ? (
            <CalcResult definition={definition} outcome={outcome} system={system} />
          ) : failure ? (
            <p role="alert" className="flex items-start gap-2 font-bold text-fault">
              <span aria-hidden="true">▲</span>
              <span>{unplaced ?? "Check the field marked ▲."}</span>
            </p>
          ) : Object.keys(read.invalid).length ? (
            <p className="font-bold text-fault">
              <span aria-hidden="true">▲ </span>Check the field marked ▲.
            </p>
          ) : (
            <p className="text-ink-soft">
              Waiting for: <span className="font-bold text-ink">{read.waiting.join("; ")}</span>.
            </p>
          )}
          {!outcome && (
            <p className="text-sm text-ink-soft">
              <strong className="text-ink">Source: </strong>
              {definition.source}
            </p>
          )}
        </section>
      </div>
      {diagram && (
        <section className="card" aria-label="Diagram">
          <div className="mx-auto w-full max-w-3xl [&_svg]:h-auto [&_svg]:w-full" data-testid="calc-diagram">
            {diagram}
          </div>
        </section>
      )}
      {name === "shaftRunout" && (
        <StraighteningLog
          worstTirIn={outcome ? (outcome.detail as RunoutResult).maxTirIn : undefined}
          limitTirIn={limitTirIn}
          lengthUnit={lengthUnit}
        />
      )}
    </div>
  );
}
