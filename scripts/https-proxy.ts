// HTTPS for the yard's network: Caddy (Debian's package) terminates TLS with its own internal
// certificate authority and passes requests to the app on loopback. Tablets trust the yard's
// authority once (its root certificate is offered for download over plain HTTP) and from then on
// the app is a secure context, so the service worker registers and checklists work offline.
// See docs/decisions/060-https-through-caddy.md.
import { spawn, type ChildProcess } from "node:child_process";
import { copyFileSync, existsSync, mkdirSync, writeFileSync } from "node:fs";
import { connect } from "node:net";
import path from "node:path";

export interface HttpsProxyOptions {
  /** The address tablets open (the machine's network address, or 127.0.0.1 in tests). */
  host: string;
  httpsPort: number;
  /** Plain-HTTP port that offers only the authority's certificate for download. */
  caPort: number;
  upstreamPort: number;
  /** Where Caddy keeps its authority, certificates and config (inside the project's .data). */
  dir: string;
}

export const CA_FILE_NAME = "sternpost-yard-ca.crt";

export function caddyfile(o: HttpsProxyOptions): string {
  const store = path.join(o.dir, "store");
  const pub = path.join(o.dir, "public");
  return `{
	admin off
	local_certs
	skip_install_trust
	auto_https disable_redirects
	storage file_system {
		root ${store}
	}
	pki {
		ca local {
			name "Sternpost yard authority"
		}
	}
}
https://${o.host}:${o.httpsPort} {
	tls internal
	reverse_proxy 127.0.0.1:${o.upstreamPort}
}
http://${o.host}:${o.caPort} {
	root * ${pub}
	file_server
}
`;
}

/** The root certificate of the yard's authority, once Caddy has made it. */
export const rootCertificate = (dir: string) =>
  path.join(dir, "store", "pki", "authorities", "local", "root.crt");

export function writeConfig(o: HttpsProxyOptions): string {
  mkdirSync(path.join(o.dir, "public"), { recursive: true });
  const file = path.join(o.dir, "Caddyfile");
  writeFileSync(file, caddyfile(o));
  return file;
}

/** Copies the authority's certificate where the download port serves it; false until it exists. */
export function publishCertificate(dir: string): boolean {
  if (!existsSync(rootCertificate(dir))) return false;
  copyFileSync(rootCertificate(dir), path.join(dir, "public", CA_FILE_NAME));
  return true;
}

const listening = (host: string, port: number) =>
  new Promise<boolean>((resolve) => {
    const socket = connect({ host, port }, () => {
      socket.end();
      resolve(true);
    });
    socket.on("error", () => resolve(false));
  });

/** Starts Caddy in the foreground of a child process (tests); the start script runs it itself. */
export async function startHttpsProxy(
  o: HttpsProxyOptions,
): Promise<{ child: ChildProcess; caFile: string }> {
  const config = writeConfig(o);
  const child = spawn("caddy", ["run", "--config", config, "--adapter", "caddyfile"], {
    stdio: ["ignore", "ignore", "pipe"],
  });
  let log = "";
  child.stderr!.on("data", (d) => (log += d));
  for (let i = 0; i < 100; i++) {
    if (child.exitCode !== null) throw new Error(`caddy exited: ${log.slice(-2000)}`);
    const up = (await listening(o.host, o.httpsPort)) && (await listening(o.host, o.caPort));
    if (up && publishCertificate(o.dir)) return { child, caFile: rootCertificate(o.dir) };
    await new Promise((r) => setTimeout(r, 100));
  }
  child.kill();
  throw new Error(`caddy made no certificate authority: ${log.slice(-2000)}`);
}

// CLI for scripts/lib.sh: `tsx scripts/https-proxy.ts config|publish <host> <httpsPort> <caPort> <upstreamPort> <dir>`
if (process.argv[1] && import.meta.url === `file://${path.resolve(process.argv[1])}`) {
  const [command, host, httpsPort, caPort, upstreamPort, dir] = process.argv.slice(2);
  const options = {
    host: host!,
    httpsPort: Number(httpsPort),
    caPort: Number(caPort),
    upstreamPort: Number(upstreamPort),
    dir: dir!,
  };
  if (command === "config") process.stdout.write(writeConfig(options));
  else if (command === "publish") process.exit(publishCertificate(options.dir) ? 0 : 1);
  else {
    console.error("usage: https-proxy.ts config|publish host httpsPort caPort upstreamPort dir");
    process.exit(2);
  }
}
