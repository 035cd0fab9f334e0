// Prints each route's first-load JavaScript from the production build, gzipped: the entry, and
// every module (with its static imports) of the routes matched on the way to that page, each file
// counted once. Run after `npx react-router build`: `npx tsx scripts/route-sizes.ts [routeId…]`.
// `--max-kb N routeId` exits non-zero when that route's figure is above N.
import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { gzipSync } from "node:zlib";

interface ManifestRoute {
  id: string;
  parentId?: string;
  path?: string;
  module: string;
  imports?: string[];
  css?: string[];
}
interface Manifest {
  entry: { module: string; imports: string[] };
  routes: Record<string, ManifestRoute>;
}

const client = path.resolve("build/client");
const file = readdirSync(path.join(client, "assets")).find((f) => /^manifest-.*\.js$/.test(f));
if (!file) throw new Error("No build found: run `npx react-router build` first.");
const text = readFileSync(path.join(client, "assets", file), "utf8");
const manifest = JSON.parse(text.slice(text.indexOf("{"), text.lastIndexOf("}") + 1)) as Manifest;

const gzipped = new Map<string, number>();
const sizeOf = (url: string) => {
  if (!gzipped.has(url)) gzipped.set(url, gzipSync(readFileSync(path.join(client, url))).length);
  return gzipped.get(url)!;
};

/** The files a first visit to this route downloads before it can run. */
export function firstLoadFiles(routeId: string): Set<string> {
  const files = new Set([manifest.entry.module, ...manifest.entry.imports]);
  for (let route: ManifestRoute | undefined = manifest.routes[routeId]; route;) {
    files.add(route.module);
    for (const i of route.imports ?? []) files.add(i);
    route = route.parentId ? manifest.routes[route.parentId] : undefined;
  }
  return files;
}

const kb = (bytes: number) => Math.round((bytes / 1024) * 10) / 10;
export const firstLoadKb = (routeId: string) =>
  kb([...firstLoadFiles(routeId)].reduce((sum, f) => sum + sizeOf(f), 0));

const args = process.argv.slice(2);
const maxAt = args.indexOf("--max-kb");
const max = maxAt >= 0 ? Number(args[maxAt + 1]) : undefined;
const wanted = args.filter((a, i) => i !== maxAt && i !== maxAt + 1);
const ids = wanted.length ? wanted : Object.keys(manifest.routes).sort();
let over = false;
for (const id of ids) {
  if (!manifest.routes[id])
    throw new Error(`No route ${id}; routes: ${Object.keys(manifest.routes).join(", ")}`);
  const size = firstLoadKb(id);
  if (max !== undefined && size > max) over = true;
  console.log(`${String(size).padStart(7)} KB  ${id}`);
}
if (over) {
  console.error(`over ${max} KB`);
  process.exit(1);
}
