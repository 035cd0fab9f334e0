import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  CalcError,
  bearingSpacing,
  convert,
  couplingFace,
  couplingFit,
  couplingRim,
  dimensionOf,
  exhaustBackPressure,
  mountMoves,
  propSlip,
  seaTrialLoading,
  shaftDiameter,
  shaftRunout,
  units,
  wireSize,
  type Unit,
} from "~/lib/calc";

/**
 * Rigid-body model of the engine, written here from the geometry rather than taken from the
 * library: its axis height at distance x forward of the coupling face is y(x) = offset + s·x with
 * s = −(top − bottom) / D (faces open at the top ⇔ nose low). Raising the mounts by a (front, at xf)
 * and b (rear, at xr) adds the straight line through (xr, b) and (xf, a).
 */
function afterMoves(
  offset: number,
  gapDiff: number,
  d: number,
  xr: number,
  xf: number,
  a: number,
  b: number,
) {
  const slope = -gapDiff / d + (a - b) / (xf - xr);
  const offsetAtFace = offset + b - ((a - b) / (xf - xr)) * xr;
  return { offsetAtFace, gapDiff: -slope * d };
}

const thou = (min: number, max: number) => fc.integer({ min, max }).map((n) => n / 1000);

describe("properties", () => {
  it("mountMoves applied to its own output leaves no misalignment", () => {
    fc.assert(
      fc.property(
        fc.record({
          d: fc.integer({ min: 2, max: 12 }),
          top: thou(0, 30),
          bottom: thou(0, 30),
          port: thou(0, 30),
          starboard: thou(0, 30),
          vertical: thou(-50, 50),
          horizontal: thou(-50, 50),
          xr: fc.integer({ min: 0, max: 40 }),
          span: fc.integer({ min: 4, max: 60 }),
        }),
        ({ d, top, bottom, port, starboard, vertical, horizontal, xr, span }) => {
          const xf = xr + span;
          const r = mountMoves({
            diameterIn: d,
            gapsIn: { top, bottom, port, starboard },
            offsetIn: { vertical, horizontal },
            rearMountIn: xr,
            frontMountIn: xf,
          });
          const v = afterMoves(vertical, top - bottom, d, xr, xf, r.front.raiseIn, r.rear.raiseIn);
          const h = afterMoves(
            horizontal,
            starboard - port,
            d,
            xr,
            xf,
            r.front.toStarboardIn,
            r.rear.toStarboardIn,
          );
          for (const residual of [v.offsetAtFace, v.gapDiff, h.offsetAtFace, h.gapDiff]) {
            expect(Math.abs(residual)).toBeLessThan(1e-9);
          }
        },
      ),
    );
  });

  it("conversions round-trip between every pair of units of one dimension", () => {
    const pairs = units.flatMap((a) =>
      units.filter((b) => dimensionOf(a) === dimensionOf(b)).map((b) => [a, b] as [Unit, Unit]),
    );
    fc.assert(
      fc.property(
        fc.constantFrom(...pairs),
        fc.double({ min: -1e6, max: 1e6, noNaN: true }),
        ([a, b], value) => {
          const back = convert(convert(value, a, b), b, a);
          expect(Math.abs(back - value)).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(value)));
        },
      ),
    );
  });

  it("shaftRunout does not depend on where the dial was zeroed", () => {
    const station = fc.record({
      positionIn: fc.integer({ min: 0, max: 120 }),
      readingsIn: fc.array(
        fc.integer({ min: -200, max: 200 }).map((n) => n / 10_000),
        { minLength: 2, maxLength: 12 },
      ),
      zero: fc.integer({ min: -5000, max: 5000 }).map((n) => n / 10_000),
    });
    fc.assert(
      fc.property(fc.array(station, { minLength: 1, maxLength: 6 }), thou(0, 10), (stations, limitTirIn) => {
        const asRead = shaftRunout({ stations, limitTirIn });
        const rezeroed = shaftRunout({
          stations: stations.map((s) => ({
            positionIn: s.positionIn,
            readingsIn: s.readingsIn.map((r) => r + s.zero),
          })),
          limitTirIn,
        });
        asRead.stations.forEach((s, i) => {
          expect(rezeroed.stations[i].tirIn).toBeCloseTo(s.tirIn, 10);
          expect(rezeroed.stations[i].highSpotIndex).toBe(s.highSpotIndex);
        });
        expect(rezeroed.maxTirIn).toBeCloseTo(asRead.maxTirIn, 10);
        expect(rezeroed.pass).toBe(asRead.pass);
      }),
    );
  });

  it("couplingRim offsets do not depend on where the dial was zeroed", () => {
    fc.assert(
      fc.property(
        thou(-20, 20),
        thou(-20, 20),
        thou(-20, 20),
        thou(-20, 20),
        thou(-500, 500),
        (top, bottom, port, starboard, zero) => {
          const a = couplingRim({ readingsIn: { top, bottom, port, starboard } });
          const b = couplingRim({
            readingsIn: {
              top: top + zero,
              bottom: bottom + zero,
              port: port + zero,
              starboard: starboard + zero,
            },
          });
          expect(b.verticalOffsetIn).toBeCloseTo(a.verticalOffsetIn, 10);
          expect(b.horizontalOffsetIn).toBeCloseTo(a.horizontalOffsetIn, 10);
        },
      ),
    );
  });

  it("never returns NaN or Infinity: either finite numbers or a CalcError", () => {
    const anyNumber = fc.oneof(
      fc.double(),
      fc.double({ min: 1e-6, max: 1e6, noNaN: true }),
      fc.constantFrom(0, -1, 1e308, -1e308, 5e-324, Number.NaN, Number.POSITIVE_INFINITY),
    );
    const finiteEverywhere = (value: unknown): boolean =>
      typeof value === "number"
        ? Number.isFinite(value)
        : typeof value === "object" && value !== null
          ? Object.values(value).every(finiteEverywhere)
          : true;
    const check = (run: () => unknown) => {
      try {
        expect(finiteEverywhere(run())).toBe(true);
      } catch (error) {
        if (!(error instanceof CalcError)) throw error;
      }
    };
    fc.assert(
      fc.property(anyNumber, anyNumber, anyNumber, anyNumber, (a, b, c, d) => {
        check(() => wireSize({ currentA: a, roundTripFt: b, systemVolts: c, dropPercent: d }));
        check(() => propSlip({ pitchIn: a, engineRpm: b, gearRatio: c, speedKnots: d }));
        check(() => shaftDiameter({ shp: a, shaftRpm: b, torsionalYieldPsi: c, safetyFactor: d }));
        check(() =>
          bearingSpacing({ shaftDiameterIn: a, shaftRpm: b, elasticModulusPsi: c, densityLbPerIn3: d }),
        );
        check(() =>
          mountMoves({
            diameterIn: a,
            gapsIn: { top: b, bottom: c, port: d, starboard: 0 },
            offsetIn: { vertical: a, horizontal: b },
            rearMountIn: c,
            frontMountIn: d,
            adjusterTpi: a,
          }),
        );
        check(() => couplingFace({ diameterIn: a, gapsIn: { top: b, bottom: c, port: d, starboard: a } }));
        check(() => couplingRim({ readingsIn: { top: a, bottom: b, port: c, starboard: d } }));
        check(() => shaftRunout({ stations: [{ positionIn: a, readingsIn: [b, c, d] }], limitTirIn: a }));
        check(() => seaTrialLoading({ wotRpm: a, ratedRpmMin: b, ratedRpmMax: c, rpmPerPitchIn: d }));
        check(() => exhaustBackPressure({ backPressureKPa: a, limitKPa: b }));
        check(() => couplingFit({ shaftIn: a, boreIn: b, targetClearanceIn: c }));
      }),
      { numRuns: 1000 },
    );
  });
});
