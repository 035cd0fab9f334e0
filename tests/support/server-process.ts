import { spawn, type ChildProcess } from "node:child_process";
import { readFileSync } from "node:fs";
import { createServer } from "node:net";

/** A free loopback port, asked of the kernel. */
export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const probe = createServer();
    probe.once("error", reject);
    probe.listen(0, "127.0.0.1", () => {
      const { port } = probe.address() as { port: number };
      probe.close(() => resolve(port));
    });
  });
}

export interface RunningServer {
  url: string;
  port: number;
  child: ChildProcess;
  /** Everything the server wrote to standard output (its JSON log lines) so far. */
  output(): string;
  logLines(): Record<string, unknown>[];
  /** Resident memory of the server process now and at its peak, in MB (from /proc). */
  memoryMb(): { rss: number; peak: number };
  /** CPU time the server process has used so far (user + system), in ms (from /proc). */
  cpuMs(): number;
  stop(): Promise<void>;
}

/**
 * How the production server is started (scripts/start.sh): node with the app's heap cap
 * (APP_HEAP_MB), then server.js; SERVER_NODE_ARGS adds flags (e.g. --cpu-prof to profile it).
 */
export const serverArgs = () => [
  `--max-old-space-size=${process.env.APP_HEAP_MB ?? 256}`,
  ...(process.env.SERVER_NODE_ARGS?.split(" ").filter(Boolean) ?? []),
  "server.js",
];

/**
 * The production server (`node server.js`, the build npm test makes) on a free port of its own,
 * with the integration setup's database, S3 stand-in and mail sink unless `env` says otherwise.
 */
export async function startServer(env: Record<string, string | undefined> = {}): Promise<RunningServer> {
  const port = await freePort();
  const url = `http://127.0.0.1:${port}`;
  const child = spawn("node", serverArgs(), {
    env: {
      ...process.env,
      NODE_ENV: "production",
      LOG_LEVEL: "info",
      APP_URL: url,
      PORT: String(port),
      ...env,
    },
    stdio: ["ignore", "pipe", "pipe"],
  });
  let out = "";
  child.stdout!.on("data", (chunk: Buffer) => (out += chunk.toString()));
  child.stderr!.on("data", (chunk: Buffer) => (out += chunk.toString()));
  for (let i = 0; ; i++) {
    if (child.exitCode !== null) throw new Error(`server.js exited with ${child.exitCode}:\n${out}`);
    if (i > 200) throw new Error(`server.js did not answer on ${url}:\n${out}`);
    if (/listening on/.test(out)) break;
    await new Promise((r) => setTimeout(r, 50));
  }
  const status = (field: string) =>
    Number(readFileSync(`/proc/${child.pid}/status`, "utf8").match(new RegExp(`${field}:\\s+(\\d+)`))![1]) /
    1024;
  return {
    url,
    port,
    child,
    output: () => out,
    logLines: () =>
      out
        .split("\n")
        .filter((l) => l.startsWith("{"))
        .map((l) => JSON.parse(l) as Record<string, unknown>),
    memoryMb: () => ({ rss: status("VmRSS"), peak: status("VmHWM") }),
    // Fields 14 and 15 of /proc/<pid>/stat, in clock ticks of 10 ms (after the command's closing
    // parenthesis, which may itself hold spaces).
    cpuMs: () => {
      const fields = readFileSync(`/proc/${child.pid}/stat`, "utf8").split(") ")[1]!.split(" ");
      return (Number(fields[11]) + Number(fields[12])) * 10;
    },
    stop: () =>
      new Promise<void>((resolve) => {
        if (child.exitCode !== null) return resolve();
        child.once("exit", () => resolve());
        child.kill("SIGTERM");
      }),
  };
}
