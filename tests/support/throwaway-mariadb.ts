import { spawn, spawnSync, type ChildProcess } from "node:child_process";
import { mkdirSync, rmSync } from "node:fs";
import { userInfo } from "node:os";
import path from "node:path";
import { freePort } from "./server-process.ts";

/**
 * A MariaDB server of a test's own (Debian's mariadbd) on a free loopback port, its data under
 * .data/ — for tests that stop the database. It never touches the shared server: it is stopped
 * by the process id it was started with.
 */
export async function startThrowawayMariadb(name: string) {
  const dir = path.resolve(".data", `throwaway-${name}-${process.pid}`);
  rmSync(dir, { recursive: true, force: true });
  mkdirSync(dir, { recursive: true });
  const user = userInfo().username;
  const install = spawnSync(
    "mariadb-install-db",
    [
      "--no-defaults",
      `--datadir=${dir}/data`,
      `--user=${user}`,
      "--auth-root-authentication-method=normal",
      "--skip-test-db",
    ],
    { encoding: "utf8" },
  );
  if (install.status !== 0) throw new Error(`mariadb-install-db failed: ${install.stderr}`);
  const port = await freePort();
  let child: ChildProcess | undefined;

  async function start() {
    child = spawn(
      "mariadbd",
      [
        "--no-defaults",
        `--datadir=${dir}/data`,
        `--socket=${dir}/sock`,
        `--port=${port}`,
        "--bind-address=127.0.0.1",
        `--pid-file=${dir}/mariadb.pid`,
        `--log-error=${dir}/error.log`,
        `--user=${user}`,
        "--character-set-server=utf8mb4",
        "--collation-server=utf8mb4_unicode_ci",
        "--skip-log-bin",
        "--innodb-buffer-pool-size=16M",
      ],
      { stdio: "ignore" },
    );
    for (let i = 0; i < 150; i++) {
      const ping = spawnSync("mariadb-admin", ["--no-defaults", `--socket=${dir}/sock`, "-uroot", "ping"]);
      if (ping.status === 0) return;
      if (child.exitCode !== null) throw new Error(`mariadbd exited with ${child.exitCode}`);
      await new Promise((r) => setTimeout(r, 200));
    }
    throw new Error("the throwaway mariadbd did not answer");
  }

  async function stop() {
    const running = child;
    if (!running || running.exitCode !== null) return;
    await new Promise<void>((resolve) => {
      running.once("exit", () => resolve());
      running.kill("SIGTERM");
    });
  }

  await start();
  return {
    url: (database: string) => `mysql://root@127.0.0.1:${port}/${database}`,
    start,
    stop,
    async remove() {
      await stop();
      rmSync(dir, { recursive: true, force: true });
    },
  };
}
