// Production server: the HTTP layer (logs, security headers, request checks, 503 while the
// database is down) comes from the app's own bundle, built from app/server/http/app.server.ts.
const port = Number(process.env.PORT ?? 3000);
// Behind the HTTPS proxy (npm start -- --lan) the app listens on loopback only.
const host = process.env.HOST;
const build = await import("./build/server/index.js");

const onListening = () => console.log(`[sternpost] listening on http://${host ?? "localhost"}:${port}`);
const app = build.entry.module.createHttpApp(build);
const server = host ? app.listen(port, host, onListening) : app.listen(port, onListening);

// A stop signal lets requests in flight finish (a restart mid-upload loses nothing half-written).
for (const signal of ["SIGTERM", "SIGINT"]) {
  process.once(signal, () => {
    server.close(() => process.exit(0));
    setTimeout(() => process.exit(0), 10_000).unref();
  });
}
