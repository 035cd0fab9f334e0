import { execFileSync } from "node:child_process";
import { mkdirSync, mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { describe, expect, it } from "vitest";

/** Running, and not merely waiting to be reaped. */
const alive = (pid: number) => {
  try {
    return !/^\d+ \(.*\) Z/.test(readFileSync(`/proc/${pid}/stat`, "utf8"));
  } catch {
    return false;
  }
};

describe("npm stop", () => {
  it("ends every service the start command recorded, by its process id, and nothing else", async () => {
    const data = mkdtempSync(path.join(tmpdir(), "sternpost-stop-"));
    mkdirSync(path.join(data, "pids"));
    mkdirSync(path.join(data, "mariadb"));
    // Started through a shell that exits at once, so they are nobody's children here (as with npm start).
    const sleeper = () => ({
      pid: Number(execFileSync("sh", ["-c", "sleep 300 >/dev/null 2>&1 & echo $!"]).toString()),
    });
    const recorded = {
      "pids/app.pid": sleeper(),
      "pids/caddy.pid": sleeper(),
      "pids/s3-fake.pid": sleeper(),
      "pids/mail-sink.pid": sleeper(),
      "mariadb/mariadb.pid": sleeper(),
    };
    for (const [file, child] of Object.entries(recorded))
      writeFileSync(path.join(data, file), `${child.pid}\n`);
    // Same command line as the recorded ones: a stop by name would end it too.
    const bystander = sleeper();
    try {
      execFileSync("bash", ["scripts/stop.sh"], {
        env: { ...process.env, STERNPOST_DATA: data },
        stdio: "pipe",
      });
      await new Promise((r) => setTimeout(r, 200));
      for (const child of Object.values(recorded))
        expect(alive(child.pid), `process ${child.pid}`).toBe(false);
      expect(alive(bystander.pid)).toBe(true);
    } finally {
      for (const child of [...Object.values(recorded), bystander])
        if (alive(child.pid)) process.kill(child.pid, "SIGKILL");
    }
  });
});
