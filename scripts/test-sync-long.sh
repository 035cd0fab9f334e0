#!/usr/bin/env bash
# npm run test:sync-long: the sync model test for minutes instead of seconds (issue 13 §7).
# SYNC_MODEL_SECONDS bounds it (default 600); it prints how many histories it checked.
source "$(dirname "$0")/lib.sh"
cd "$ROOT"
ensure_node_modules
start_mariadb
trap stop_mariadb_if_started EXIT
export SESSION_SECRET="${SESSION_SECRET:-test-suite-secret-0123456789abcdef}"
export SYNC_MODEL_SECONDS="${SYNC_MODEL_SECONDS:-600}"
log "building the production bundle"
node_modules/.bin/react-router build >"$DATA/build.log" 2>&1 || { tail -40 "$DATA/build.log"; exit 1; }
log "running the sync model for up to ${SYNC_MODEL_SECONDS} s"
node_modules/.bin/vitest run --project integration tests/integration/sync-model.test.ts
