import { describe, expect, it } from "vitest";
import { CalcError, convert, dimensionOf, units, type Unit } from "~/lib/calc";

// Factors below are the exact definitions and tabulated factors of NIST SP 811 (2008 edition),
// Appendix B.8 (factors in alphabetical order) and B.9 (by kind of quantity).
describe("convert — NIST SP 811 exact definitions", () => {
  it("length: 1 in = 25.4 mm exactly, 1 ft = 0.3048 m exactly, 1 thou = 0.001 in", () => {
    expect(convert(1, "in", "mm")).toBeCloseTo(25.4, 12); // SP 811 B.8: inch = 2.54 E-02 m (exact)
    expect(convert(1, "ft", "m")).toBeCloseTo(0.3048, 12); // SP 811 B.8: foot = 3.048 E-01 m (exact)
    expect(convert(1, "thou", "mm")).toBeCloseTo(0.0254, 14); // mil (0.001 in) = 2.54 E-05 m (exact)
    expect(convert(12, "in", "ft")).toBeCloseTo(1, 14);
  });

  it("pressure: psi from 1 lbf = 4.4482216152605 N over 1 in², bar = 100 kPa", () => {
    // SP 811 B.8: pound-force per square inch = 6.894 757 E+03 Pa
    expect(convert(1, "psi", "kPa")).toBeCloseTo(6.894757, 6);
    // the exact quotient of the lbf and inch definitions
    expect(convert(1, "psi", "kPa")).toBeCloseTo(4.4482216152605 / 0.0254 ** 2 / 1000, 12);
    expect(convert(1, "bar", "kPa")).toBe(100); // SP 811 B.8: bar = 1.0 E+05 Pa (exact)
  });

  it("pressure: conventional inch of mercury and inch of water", () => {
    // NIST SP 811 (2008), Appendix B.8, factors listed alphabetically: "inch of mercury, conventional" = 3.386 389 E+03 Pa and
    // "inch of water, conventional" = 2.490 889 E+02 Pa (densities 13.5951 and 1.000 g/cm³, g = 9.80665 m/s²).
    expect(convert(1, "inHg", "kPa")).toBeCloseTo(3.386389, 6);
    expect(convert(1, "inH2O", "kPa")).toBeCloseTo(0.2490889, 7);
    // the ratio of the two conventional densities, exactly
    expect(convert(1, "inHg", "inH2O")).toBeCloseTo(13.5951, 10);
  });

  it("temperature: t/°C = (t/°F − 32) / 1.8 (SP 811 B.9)", () => {
    expect(convert(212, "degF", "degC")).toBeCloseTo(100, 12);
    expect(convert(32, "degF", "degC")).toBeCloseTo(0, 12);
    expect(convert(-40, "degC", "degF")).toBeCloseTo(-40, 12);
    expect(convert(185, "degF", "degC")).toBeCloseTo(85, 12); // (185 − 32) / 1.8 = 85, by hand
  });

  it("speed: 1 kn = 1852 m/h, 1 mi = 1609.344 m (both exact)", () => {
    expect(convert(1, "kn", "km/h")).toBeCloseTo(1.852, 12);
    expect(convert(1, "mph", "km/h")).toBeCloseTo(1.609344, 12);
    // SP 811 B.8: knot = 5.144 444 E-01 m/s; 1852 / 1609.344 = 1.150 779 mph
    expect(convert(1, "kn", "mph")).toBeCloseTo(1.150779, 6);
  });

  it("volume: 1 US gallon = 231 in³ = 3.785 411 784 L exactly", () => {
    expect(convert(1, "gal", "L")).toBeCloseTo(3.785411784, 12);
    expect(convert(1, "gal", "L")).toBeCloseTo((231 * 2.54 ** 3) / 1000, 12);
  });

  it("power, mass, force, torque and density factors", () => {
    expect(convert(1, "hp", "kW")).toBeCloseTo(0.7456999, 7); // SP 811 B.8: horsepower (550 ft·lbf/s) = 7.456 999 E+02 W
    expect(convert(1, "lb", "kg")).toBe(0.45359237); // SP 811: pound (avoirdupois) = 4.535 923 7 E-01 kg (exact)
    expect(convert(1, "lbf", "N")).toBe(4.4482216152605); // SP 811: pound-force = 4.448 222 E+00 N
    expect(convert(1, "lbfFt", "Nm")).toBeCloseTo(1.355818, 6); // SP 811: foot pound-force = 1.355 818 E+00 J
    expect(convert(1, "lb/in3", "kg/m3")).toBeCloseTo(27679.9, 1); // SP 811: pound per cubic inch = 2.767 990 E+04 kg/m³
  });

  it("alignment slopes: 1 thou per inch = 0.001 in/in = 1 mm/m", () => {
    expect(convert(1, "thou/in", "in/in")).toBeCloseTo(0.001, 15);
    expect(convert(1, "thou/in", "mm/m")).toBeCloseTo(1, 12);
  });

  it("refuses to convert across dimensions, naming the field", () => {
    expect(() => convert(1, "in", "psi")).toThrow(CalcError);
    try {
      convert(1, "in", "psi");
    } catch (error) {
      expect((error as CalcError).field).toBe("to");
    }
    expect(() => convert(Number.NaN, "in", "mm")).toThrow(CalcError);
    expect(() => convert(1, "furlong" as Unit, "mm")).toThrow(/not a unit/);
    expect(() => convert(1, "rpm", "V")).toThrow(CalcError);
  });

  it("lists every unit of the contract, each with a dimension", () => {
    const contract: Unit[] = [
      "in",
      "mm",
      "thou",
      "ft",
      "m",
      "psi",
      "kPa",
      "bar",
      "inHg",
      "inH2O",
      "degF",
      "degC",
      "kn",
      "mph",
      "km/h",
      "gal",
      "L",
    ];
    for (const unit of contract) expect(units).toContain(unit);
    expect(dimensionOf("inHg")).toBe("pressure");
    expect(dimensionOf("thou")).toBe("length");
    expect(dimensionOf("1")).toBe("dimensionless");
  });
});
