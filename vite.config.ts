import { reactRouter } from "@react-router/dev/vite";
import tailwindcss from "@tailwindcss/vite";
import { defineConfig } from "vite";
import { VitePWA } from "vite-plugin-pwa";
import { PAGES_CACHE } from "./app/lib/offline/pages.ts";

export default defineConfig({
  plugins: [
    tailwindcss(),
    reactRouter(),
    VitePWA({
      // No index.html in framework mode: the app registers the worker itself (app/lib/pwa).
      injectRegister: false,
      registerType: "prompt",
      outDir: "build/client",
      manifestFilename: "manifest.webmanifest",
      includeAssets: ["icon.svg", "icon-192.png", "icon-512.png"],
      manifest: {
        name: "Sternpost — engine installation records",
        short_name: "Sternpost",
        description:
          "Measured checklists for installing and commissioning inboard engines, offline in the bilge.",
        start_url: "/",
        scope: "/",
        display: "standalone",
        orientation: "any",
        background_color: "#f6f3ec",
        theme_color: "#15212c",
        icons: [
          { src: "/icon-192.png", sizes: "192x192", type: "image/png" },
          { src: "/icon-512.png", sizes: "512x512", type: "image/png" },
          { src: "/icon-512.png", sizes: "512x512", type: "image/png", purpose: "maskable" },
          { src: "/icon.svg", sizes: "any", type: "image/svg+xml" },
        ],
      },
      workbox: {
        globDirectory: "build/client",
        globPatterns: ["assets/**/*.{js,css,woff2,woff}", "*.{svg,png,webmanifest}"],
        // SSR: never answer a navigation from a fallback page; see runtimeCaching.
        navigateFallback: null,
        cleanupOutdatedCaches: true,
        clientsClaim: true,
        runtimeCaching: [
          {
            // Pages: the network when it answers, else the copy kept when the page was made available offline.
            urlPattern: ({ request, url }) =>
              request.mode === "navigate" && !url.pathname.startsWith("/api/"),
            handler: "NetworkFirst",
            options: {
              cacheName: PAGES_CACHE,
              networkTimeoutSeconds: 5,
              matchOptions: { ignoreSearch: false },
            },
          },
        ],
      },
    }),
  ],
  resolve: { tsconfigPaths: true },
  build: {
    rolldownOptions: {
      treeshake: {
        // The shared plain modules (templates, calculations, sync protocol) only define things: a
        // barrel import of one helper must not drag in zod schemas or the calculation registry
        // built at the top of a sibling module (docs/decisions/087-checklist-screen-weight.md).
        moduleSideEffects: [{ test: /\/app\/lib\/(templates|calc|sync)\/[^/]+\.ts$/, sideEffects: false }],
      },
    },
  },
});
