import { useState } from "react";
import { straighteningHistory } from "~/lib/calc";
import { StraighteningDiagram, formatLength, type LengthUnit } from "~/components/diagrams";

/**
 * The worst TIR after each straightening attempt, kept while the page is open: read the shaft,
 * keep the result, straighten, read again. The diagram shows the attempts coming down to the limit.
 */
export function StraighteningLog({
  worstTirIn,
  limitTirIn,
  lengthUnit,
}: {
  worstTirIn?: number;
  limitTirIn?: number;
  lengthUnit: LengthUnit;
}) {
  const [attempts, setAttempts] = useState<number[]>([]);
  const history =
    attempts.length && limitTirIn !== undefined
      ? straighteningHistory({ attemptsTirIn: attempts, limitTirIn })
      : null;
  return (
    <section aria-labelledby="straightening-heading" className="card flex flex-col gap-3">
      <h2 id="straightening-heading" className="text-xl font-bold">
        Straightening attempts
      </h2>
      <p className="text-ink-soft">
        Keep the worst TIR of each full set of readings, straighten at the high spot, read again and keep the
        new result.
      </p>
      <div className="flex flex-wrap gap-2">
        <button
          type="button"
          className="btn btn-primary"
          disabled={worstTirIn === undefined}
          onClick={() => worstTirIn !== undefined && setAttempts((all) => [...all, worstTirIn])}
        >
          {worstTirIn === undefined
            ? `Keep the worst TIR as attempt ${attempts.length + 1}`
            : `Keep ${formatLength(worstTirIn, lengthUnit)} as attempt ${attempts.length + 1}`}
        </button>
        {attempts.length > 0 && (
          <button type="button" className="btn" onClick={() => setAttempts([])}>
            Clear the attempts
          </button>
        )}
      </div>
      {history && limitTirIn !== undefined && (
        <div
          className="mx-auto w-full max-w-3xl [&_svg]:h-auto [&_svg]:w-full"
          data-testid="straightening-diagram"
        >
          <StraighteningDiagram
            history={history}
            limitTirIn={limitTirIn}
            attemptLabels={["As found"]}
            lengthUnit={lengthUnit}
          />
        </div>
      )}
    </section>
  );
}
