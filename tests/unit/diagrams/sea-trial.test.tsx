import { describe, expect, it } from "vitest";
import { seaTrialLoading } from "~/lib/calc";
import { SeaTrialDiagram } from "~/components/diagrams";
import { elements, render, texts, titleOf } from "./markup";

const band = { ratedRpmMin: 3400, ratedRpmMax: 3600 };

describe("SeaTrialDiagram", () => {
  it("shades and names the rated band, draws the WOT rpm and says over-propped with the pitch change", () => {
    // WOT 3250 rpm below a 3400–3600 rpm band: over-propped. Indicative change aimed at mid-band
    // with about 200 rpm per inch of pitch (common practice): (3250 − 3500) / 200 = −1.25 in.
    const loading = seaTrialLoading({ wotRpm: 3250, ...band });
    const svg = render(
      <SeaTrialDiagram
        {...band}
        wotRpm={3250}
        loading={loading}
        points={[
          { rpm: 3250, knots: 27 },
          { rpm: 2000, knots: 14 },
        ]}
      />,
    );
    const words = texts(svg);
    expect(words).toContain("rated band 3400 rpm to 3600 rpm");
    expect(words).toContain("WOT 3250 rpm");
    expect(words).toContain("Over-propped: WOT 3250 rpm is below the rated band");
    expect(words).toContain("Indicative: about 1.25 in less pitch; the propeller shop advises");
    expect(words).toEqual(expect.arrayContaining(["3250 rpm, 27 kn", "2000 rpm, 14 kn"]));
    expect(titleOf(svg)).toContain("rated band 3400 rpm to 3600 rpm");
  });

  it("draws the band between its rpm on the same scale as the points", () => {
    const svg = render(<SeaTrialDiagram {...band} points={[{ rpm: 3500, knots: 30 }]} />);
    const shaded = elements(svg, "rect").find((r) => r.fill === "#fbefc8")!;
    const [point] = elements(svg, "circle");
    const top = Number(shaded.y);
    const bottom = top + Number(shaded.height);
    // 3500 rpm is the middle of 3400–3600: the point sits halfway down the band.
    expect(Number(point.cy)).toBeCloseTo((top + bottom) / 2, 0);
  });

  it("says in range, and gives each run's slip against the pitch speed", () => {
    // Pitch 24 in, 1.96 : 1 gear, 2800 rpm, 27 kn. Apparent slip (Gerr, Propeller Handbook):
    // pitch speed = 24 in × (2800 / 1.96) rpm × 60 min/h ÷ 72,913.4 in per nautical mile
    // (1852 m exactly ÷ 0.0254 m per in, NIST SP 811) = 28.213 kn; slip = (28.213 − 27) / 28.213 = 4.3 %.
    const loading = seaTrialLoading({ wotRpm: 2800, ratedRpmMin: 2700, ratedRpmMax: 2900 });
    const svg = render(
      <SeaTrialDiagram
        wotRpm={2800}
        ratedRpmMin={2700}
        ratedRpmMax={2900}
        loading={loading}
        points={[{ rpm: 2800, knots: 27 }]}
        pitchLine={{ pitchIn: 24, gearRatio: 1.96 }}
      />,
    );
    expect(texts(svg)).toContain("2800 rpm, 27 kn, slip 4.3%");
    expect(texts(svg)).toContain("In range: WOT 2800 rpm is within the rated band");
    expect(texts(svg)).toContain("pitch speed, no slip");
  });

  it("still draws the band and WOT with no runs, and says the speed is missing", () => {
    const loading = seaTrialLoading({ wotRpm: 3700, ...band });
    const svg = render(<SeaTrialDiagram {...band} wotRpm={3700} loading={loading} />);
    expect(texts(svg)).toContain("speed: no runs entered");
    // (3700 − 3500) / 200 = +1 in: under-propped, more pitch.
    expect(texts(svg)).toContain("Indicative: about 1 in more pitch; the propeller shop advises");
  });
});
