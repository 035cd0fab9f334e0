#!/usr/bin/env bash
# npm start: everything a fresh machine needs, then the app on PORT (default 3000).
source "$(dirname "$0")/lib.sh"
cd "$ROOT"
ensure_node_modules
start_mariadb
start_mail_sink
start_s3_fake
session_secret
export NODE_ENV=production PORT="${PORT:-3000}"
# This is the local demo with its own mail sink: show the caught mail to signed-in managers.
export DEV_MAIL_PAGE="${DEV_MAIL_PAGE:-on}"
export APP_URL="${APP_URL:-http://localhost:$PORT}"
node_modules/.bin/tsx scripts/db.ts create migrate seed
log "building the app"
node_modules/.bin/react-router build >"$DATA/build.log" 2>&1 || { tail -40 "$DATA/build.log"; exit 1; }
cat <<MSG

  Sternpost is running at $APP_URL

  Demo sign-ins (password for all: $(node_modules/.bin/tsx -e 'import("./db/seeds/demo-people.ts").then(m=>process.stdout.write(m.DEMO_PASSWORD))')):
$(node_modules/.bin/tsx -e 'import("./db/seeds/demo-people.ts").then(m=>{for(const p of m.demoPeople)console.log(`    ${p.role.padEnd(11)} ${p.email}`)})')

  Mail sent by the app: $APP_URL/dev/mail (signed-in managers only; DEV_MAIL_PAGE=off hides it)

MSG
exec node server.js
