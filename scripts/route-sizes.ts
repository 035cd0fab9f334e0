// Prints each route's first-load JavaScript from the production build, gzipped: the entry, and
// every module (with its static imports) of the routes matched on the way to that page, each file
// counted once. Run after `npx react-router build`: `npx tsx scripts/route-sizes.ts [routeId…]`.
// `--max-kb N routeId` exits non-zero when that route's figure is above N. The checklist screen's
// budget (CHECKLIST_BUDGET_KB) is held by tests/e2e/shop.test.ts, which runs on the same build.
import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { pathToFileURL } from "node:url";
import { gzipSync } from "node:zlib";

/** The checklist screen opens in the bilge on a slow tablet: its first load stays under this. */
export const CHECKLIST_BUDGET_KB = 150;
export const CHECKLIST_ROUTE = "routes/checklists/view";

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

function readManifest(): Manifest {
  const file = readdirSync(path.join(client, "assets")).find((f) => /^manifest-.*\.js$/.test(f));
  if (!file) throw new Error("No build found: run `npx react-router build` first.");
  const text = readFileSync(path.join(client, "assets", file), "utf8");
  return JSON.parse(text.slice(text.indexOf("{"), text.lastIndexOf("}") + 1)) as Manifest;
}
let cached: Manifest | undefined;
const manifest = () => (cached ??= readManifest());

const gzipped = new Map<string, number>();
const sizeOf = (url: string) => {
  if (!gzipped.has(url)) gzipped.set(url, gzipSync(readFileSync(path.join(client, url))).length);
  return gzipped.get(url)!;
};

/** The files a first visit to this route downloads before it can run. */
export function firstLoadFiles(routeId: string): Set<string> {
  const { entry, routes } = manifest();
  const files = new Set([entry.module, ...entry.imports]);
  for (let route: ManifestRoute | undefined = routes[routeId]; route;) {
    files.add(route.module);
    for (const i of route.imports ?? []) files.add(i);
    route = route.parentId ? routes[route.parentId] : undefined;
  }
  return files;
}

const kb = (bytes: number) => Math.round((bytes / 1024) * 10) / 10;
export const firstLoadKb = (routeId: string) =>
  kb([...firstLoadFiles(routeId)].reduce((sum, f) => sum + sizeOf(f), 0));

function main() {
  const args = process.argv.slice(2);
  const maxAt = args.indexOf("--max-kb");
  const max = maxAt >= 0 ? Number(args[maxAt + 1]) : undefined;
  const wanted = args.filter((_, i) => maxAt < 0 || (i !== maxAt && i !== maxAt + 1));
  const ids = wanted.length ? wanted : Object.keys(manifest().routes).sort();
  let over = false;
  for (const id of ids) {
    if (!manifest().routes[id])
      throw new Error(`No route ${id}; routes: ${Object.keys(manifest().routes).join(", ")}`);
    const size = firstLoadKb(id);
    if (max !== undefined && size > max) over = true;
    console.log(`${String(size).padStart(7)} KB  ${id}`);
  }
  if (over) {
    console.error(`over ${max} KB`);
    process.exit(1);
  }
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? "").href) main();
