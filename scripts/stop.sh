#!/usr/bin/env bash
# npm stop: ends what `npm start` started — the app, Caddy, the S3 stand-in, the mail sink and the
# private MariaDB — by the process ids they recorded, never by matching process names.
source "$(dirname "$0")/lib.sh"
stop_recorded "the app server" "$PIDS/app.pid"
stop_recorded "Caddy (HTTPS)" "$PIDS/caddy.pid"
stop_recorded "the S3 stand-in" "$PIDS/s3-fake.pid"
stop_recorded "the SMTP sink" "$PIDS/mail-sink.pid"
stop_recorded "MariaDB" "$DATA/mariadb/mariadb.pid"
log "stopped"
