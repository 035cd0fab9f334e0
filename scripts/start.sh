#!/usr/bin/env bash
# npm start: everything a fresh machine needs, then the app on PORT (default 3000).
# `npm start -- --lan` (or HTTPS=1) also serves it over HTTPS on this machine's network address
# for the yard's tablets. `npm stop` ends everything this started.
source "$(dirname "$0")/lib.sh"
cd "$ROOT"
LAN=""
for arg in "$@"; do [ "$arg" = "--lan" ] && LAN=1; done
[ "${HTTPS:-}" = 1 ] && LAN=1
ensure_node_modules
start_mariadb
start_mail_sink
start_s3_fake
session_secret
export NODE_ENV=production PORT="${PORT:-3000}"
if [ -n "$LAN" ]; then start_https_proxy; fi
# This is the local demo with its own mail sink: show the caught mail to signed-in managers.
export DEV_MAIL_PAGE="${DEV_MAIL_PAGE:-on}"
export APP_URL="${APP_URL:-http://localhost:$PORT}"
node_modules/.bin/tsx scripts/db.ts create migrate seed
log "building the app"
node_modules/.bin/react-router build >"$DATA/build.log" 2>&1 || { tail -40 "$DATA/build.log"; exit 1; }

node --max-old-space-size="$APP_HEAP_MB" server.js &
APP_PID=$!
remember_pid app "$APP_PID"
trap 'kill "$APP_PID" 2>/dev/null; wait "$APP_PID" 2>/dev/null; rm -f "$PIDS/app.pid"; exit 0' INT TERM
for _ in $(seq 1 150); do
  kill -0 "$APP_PID" 2>/dev/null || { log "the app server exited; see the lines above"; exit 1; }
  node -e 'fetch(process.argv[1]).then((r) => process.exit(r.ok ? 0 : 1), () => process.exit(1))' \
    "http://127.0.0.1:$PORT/healthz" && break
  sleep 0.2
done

demo_password=$(node_modules/.bin/tsx -e 'import("./db/seeds/demo-people.ts").then(m=>process.stdout.write(m.DEMO_PASSWORD))')
demo_people=$(node_modules/.bin/tsx -e 'import("./db/seeds/demo-people.ts").then(m=>{for(const p of m.demoPeople)console.log(`    ${p.role.padEnd(11)} ${p.email}`)})')
cat <<MSG

  Sternpost is running at $APP_URL

  Demo sign-ins (password for all: $demo_password):
$demo_people

  A five-minute tour of the demo yard, Kittiwake Slip:
    surveyor    the record of "Little Auk" is on the first page; "Check it is genuine" verifies it
    lead        "Tern of Helvick": the exhaust waits for your review, and To decide has a conflict
                (the strainer, passed on one tablet and failed on another)
    technician  "Tern of Helvick": the shaft straightened twice (three runout sets), the alignment
                afloat with its mount moves worked out
    manager     every job, the template library, the audit log and the caught mail below

  Mail sent by the app (the local SMTP sink): $APP_URL/dev/mail — signed-in managers only
  (DEV_MAIL_PAGE=off hides it).
  Services started: MariaDB on 127.0.0.1:$MARIADB_PORT, the SMTP sink on 127.0.0.1:$SMTP_PORT,
  the S3 stand-in on 127.0.0.1:${S3_PORT:-4569}${LAN:+, Caddy (HTTPS) on $LAN_HOST:$HTTPS_PORT}.
  Stop everything with: npm stop
MSG
if [ -n "$LAN" ]; then cat <<MSG

  On each tablet, once: download the yard's certificate authority from
    $CA_URL
  and install it as a trusted certificate (iPad: Settings › General › VPN & Device Management,
  then Settings › General › About › Certificate Trust Settings; Android: Settings › Security ›
  Encryption & credentials › Install a certificate › CA certificate). Then open $APP_URL
  The file is also at .data/caddy/public/sternpost-yard-ca.crt.
MSG
fi
echo
wait "$APP_PID"
