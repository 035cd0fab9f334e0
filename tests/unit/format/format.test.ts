import { describe, expect, it } from "vitest";
import { formatCount, formatMoment, formatStamp, isTimeZone } from "~/lib/format";

// Offsets from the IANA time zone database (tzdata, zones Pacific/Auckland and America/St_Johns):
// New Zealand keeps standard time, UTC+12, in May and daylight time, UTC+13, in December;
// Newfoundland keeps daylight time, UTC−2:30, in May.
describe("one way to write a moment: on the yard's clock", () => {
  const moment = "2025-05-12T07:30:00Z";

  it("writes the same instant as each yard's clock shows it", () => {
    expect(formatMoment(moment, "UTC", "medium")).toBe("12 May 2025, 07:30");
    expect(formatMoment(moment, "Pacific/Auckland", "medium")).toBe("12 May 2025, 19:30");
    expect(formatMoment(moment, "America/St_Johns", "medium")).toBe("12 May 2025, 05:00");
    expect(formatMoment("2025-12-12T07:30:00Z", "Pacific/Auckland", "time")).toBe("20:30");
  });

  it("names the zone when the text stands on its own (the PDF, the verification page)", () => {
    expect(formatStamp(moment, "UTC")).toBe("12 May 2025, 07:30 UTC");
    expect(formatStamp(moment, "Pacific/Auckland")).toBe("12 May 2025, 19:30 GMT+12");
    expect(formatStamp(moment, "America/St_Johns")).toBe("12 May 2025, 05:00 GMT-2:30");
  });

  it("falls back to UTC for a zone the runtime does not know, and shows a non-date as it is", () => {
    expect(isTimeZone("Atlantis/Lost_City")).toBe(false);
    expect(formatMoment(moment, "Atlantis/Lost_City", "medium")).toBe("12 May 2025, 07:30");
    expect(formatStamp("not a date", "UTC")).toBe("not a date");
  });

  it("groups counts for reading (sent 400 of 1,200)", () => {
    expect(formatCount(1200)).toBe("1,200");
    expect(formatCount(400)).toBe("400");
  });
});
