#!/usr/bin/env bash
# npm test: the whole suite on a fresh machine — installs what is missing, starts a private
# MariaDB (unless DATABASE_URL points elsewhere), builds, typechecks, then unit, integration
# and end-to-end tests (real Chromium against the production build).
source "$(dirname "$0")/lib.sh"
cd "$ROOT"
ensure_node_modules
apt_install chromium chromium
apt_install pdftotext poppler-utils
apt_install caddy caddy
apt_install certutil libnss3-tools
start_mariadb
trap stop_mariadb_if_started EXIT
export SESSION_SECRET="${SESSION_SECRET:-test-suite-secret-0123456789abcdef}"

log "building the production bundle"
node_modules/.bin/react-router build >"$DATA/build.log" 2>&1 || { tail -40 "$DATA/build.log"; exit 1; }
log "linting and checking the format"
node_modules/.bin/eslint . || { log "ESLint found problems (npm run lint)"; exit 1; }
node_modules/.bin/prettier --check . >/dev/null || { node_modules/.bin/prettier --list-different .; log "files not formatted (npm run format)"; exit 1; }
log "typechecking"
node_modules/.bin/react-router typegen >/dev/null 2>&1
node_modules/.bin/tsc --noEmit

log "running the tests"
status=0
node_modules/.bin/vitest run --reporter=default --reporter=json --outputFile.json="$DATA/test-results.json" "$@" || status=$?
node -e '
  const r = JSON.parse(require("fs").readFileSync(process.argv[1], "utf8"));
  console.log(`${r.numPassedTests} passed, ${r.numFailedTests} failed, ${r.numPendingTests + r.numTodoTests} skipped`);
' "$DATA/test-results.json" 2>/dev/null || true
exit $status
