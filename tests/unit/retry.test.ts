import { describe, expect, it } from "vitest";
import { withRetry } from "~/server/retry.server";

const deadlock = Object.assign(new Error("Deadlock found when trying to get lock"), { errno: 1213 });

describe("withRetry", () => {
  it("runs a transaction again after a deadlock or a lost certification, and returns its result", async () => {
    let runs = 0;
    const result = await withRetry(async () => {
      runs++;
      if (runs < 3) throw deadlock;
      return "written";
    });
    expect(result).toBe("written");
    expect(runs).toBe(3);
  });

  it("does not retry other errors, and gives up after the last attempt", async () => {
    let runs = 0;
    const duplicate = Object.assign(new Error("Duplicate entry"), { errno: 1062 });
    await expect(withRetry(async () => (runs++, Promise.reject(duplicate)))).rejects.toBe(duplicate);
    expect(runs).toBe(1);
    runs = 0;
    await expect(withRetry(async () => (runs++, Promise.reject(deadlock)), { attempts: 4 })).rejects.toBe(
      deadlock,
    );
    expect(runs).toBe(4);
  });

  it("retries a duplicate key only when the caller says a fresh run answers it", async () => {
    let runs = 0;
    const duplicate = Object.assign(new Error("Duplicate entry"), { errno: 1062 });
    const result = await withRetry(
      async () => {
        if (++runs < 2) throw duplicate;
        return "answered as a repeat";
      },
      { alsoRetry: [1062] },
    );
    expect(result).toBe("answered as a repeat");
    expect(runs).toBe(2);
  });
});
