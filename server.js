// Production server: compression, long-lived caching for fingerprinted assets, security headers,
// and the React Router request handler. It keeps no state, so any number can run side by side.
import { createRequestHandler } from "@react-router/express";
import compression from "compression";
import express from "express";

const port = Number(process.env.PORT ?? 3000);
// Behind the HTTPS proxy (npm start -- --lan) the app listens on loopback only.
const host = process.env.HOST;
const build = await import("./build/server/index.js");

const app = express();
app.disable("x-powered-by");
if (process.env.TRUST_PROXY) app.set("trust proxy", process.env.TRUST_PROXY);
app.use(compression());
app.use((_req, res, next) => {
  res.set({
    "X-Content-Type-Options": "nosniff",
    "Referrer-Policy": "same-origin",
    "X-Frame-Options": "DENY",
    "Permissions-Policy": "camera=(self), geolocation=()",
  });
  next();
});
app.use("/assets", express.static("build/client/assets", { immutable: true, maxAge: "1y" }));
// The service worker and manifest must be revalidated so updates reach the tablets.
app.use(express.static("build/client", { maxAge: 0 }));
app.all(
  "*splat",
  createRequestHandler({
    build,
    mode: process.env.NODE_ENV,
    getLoadContext: (req) => ({ clientAddress: req.ip ?? req.socket.remoteAddress ?? "unknown" }),
  }),
);

const onListening = () => console.log(`[sternpost] listening on http://${host ?? "localhost"}:${port}`);
if (host) app.listen(port, host, onListening);
else app.listen(port, onListening);
