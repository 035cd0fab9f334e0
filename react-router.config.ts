import type { Config } from "@react-router/dev/config";

export default {
  ssr: true,
  // Offline navigation must never ask the server for a route manifest.
  routeDiscovery: { mode: "initial" },
  // React Router writes its client manifest after the worker was generated: generate it again so
  // the worker precaches the manifest too (otherwise the first offline start misses it).
  async buildEnd({ viteConfig }) {
    const pwa = viteConfig.plugins.find((p) => p.name === "vite-plugin-pwa") as
      { api?: { generateSW(): Promise<void> } } | undefined;
    if (!pwa?.api) throw new Error("vite-plugin-pwa is missing from the Vite config");
    await pwa.api.generateSW();
  },
} satisfies Config;
