import type { Config } from "@react-router/dev/config";

export default {
  ssr: true,
  // Offline navigation must never ask the server for a route manifest.
  routeDiscovery: { mode: "initial" },
} satisfies Config;
