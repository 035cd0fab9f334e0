// The MariaDB command-line tools (from Debian's mariadb-client) pointed at a DATABASE_URL.
import { spawn } from "node:child_process";
import { createReadStream, createWriteStream } from "node:fs";

export function cliArgs(databaseUrl: string): { args: string[]; env: NodeJS.ProcessEnv; database: string } {
  const url = new URL(databaseUrl);
  const database = decodeURIComponent(url.pathname.replace(/^\//, ""));
  if (!/^[A-Za-z0-9_]+$/.test(database)) throw new Error(`Unusable database name "${database}"`);
  return {
    // --no-defaults must come first: no option file on the machine changes what is dumped.
    args: [
      "--no-defaults",
      // mysql2's socketPath parameter (a local server's Unix socket) or host and port.
      ...(url.searchParams.get("socketPath")
        ? [`--socket=${url.searchParams.get("socketPath")}`]
        : [`--host=${url.hostname}`, `--port=${url.port || "3306"}`]),
      `--user=${decodeURIComponent(url.username || "root")}`,
      "--default-character-set=utf8mb4",
    ],
    // The password travels in the environment, never on a command line others can read.
    env: { ...process.env, MYSQL_PWD: decodeURIComponent(url.password) },
    database,
  };
}

function run(
  command: string,
  args: string[],
  env: NodeJS.ProcessEnv,
  io: { stdin?: string; stdout?: string },
) {
  return new Promise<void>((resolve, reject) => {
    const child = spawn(command, args, { env, stdio: ["pipe", "pipe", "pipe"] });
    let errors = "";
    child.stderr.on("data", (d) => (errors += d));
    if (io.stdout) child.stdout.pipe(createWriteStream(io.stdout));
    else child.stdout.resume();
    if (io.stdin) createReadStream(io.stdin).pipe(child.stdin);
    else child.stdin.end();
    child.on("error", reject);
    child.on("close", (code) =>
      code === 0 ? resolve() : reject(new Error(`${command} exited with ${code}: ${errors.slice(-2000)}`)),
    );
  });
}

/** A consistent snapshot (one transaction) of every table, with its triggers, as SQL. */
export async function dumpDatabase(databaseUrl: string, file: string) {
  const { args, env, database } = cliArgs(databaseUrl);
  await run(
    "mariadb-dump",
    [...args, "--single-transaction", "--triggers", "--routines", "--hex-blob", "--skip-dump-date", database],
    env,
    { stdout: file },
  );
}

/** Loads a dump into an existing, empty database. */
export async function loadDatabase(databaseUrl: string, file: string) {
  const { args, env, database } = cliArgs(databaseUrl);
  await run("mariadb", [...args, database], env, { stdin: file });
}
