import { describe, expect, it } from "vitest";
import { plainError } from "~/lib/offline/plain-error";

/** Issue 15 §1: the raw "TypeError: Failed to fetch" never reaches a person. */
describe("plainError", () => {
  it("says a failed fetch is the connection, in every browser's wording", () => {
    for (const text of [
      "Failed to fetch",
      "Load failed",
      "NetworkError when attempting to fetch resource.",
    ]) {
      const words = plainError(new TypeError(text));
      expect(words).toMatch(/No connection to the server/);
      expect(words).not.toMatch(/TypeError|fetch/i);
    }
  });

  it("keeps a sentence written for people, and hides a programmer's error behind the fallback", () => {
    expect(plainError(new Error("The offline copy could not be made (403)."))).toBe(
      "The offline copy could not be made (403).",
    );
    expect(plainError(new TypeError("Cannot read properties of undefined"), "Not saved.")).toBe("Not saved.");
    expect(plainError(new Error("TypeError: x is not a function"), "Not saved.")).toBe("Not saved.");
    expect(plainError("odd", "Not saved.")).toBe("Not saved.");
  });
});
