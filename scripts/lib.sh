# Shared by start.sh and test.sh: install what is missing, start the private services.
# Everything lives under .data/ (ignored by git) so a second run reuses it and keeps the data.
set -euo pipefail
ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
DATA="${STERNPOST_DATA:-$ROOT/.data}"
MARIADB_PORT="${MARIADB_PORT:-3307}"
# The app server's heap, in MB. Without a cap V8 lets garbage pile up to several hundred MB under
# load before collecting it; with one it collects sooner at no cost in speed (bench/load.ts).
APP_HEAP_MB="${APP_HEAP_MB:-256}"
SMTP_PORT="${SMTP_PORT:-2525}"
PIDS="$DATA/pids"
mkdir -p "$DATA" "$PIDS"

log() { printf '\033[1m[sternpost]\033[0m %s\n' "$*"; }

apt_ready=""
apt_install() { # apt_install <command-to-find> <package>...
  local probe="$1"; shift
  command -v "$probe" >/dev/null 2>&1 && return 0
  log "installing $* from Debian's packages"
  if [ -z "$apt_ready" ]; then apt-get update -qq; apt_ready=1; fi
  DEBIAN_FRONTEND=noninteractive apt-get install -y -qq "$@" >/dev/null
}

ensure_node_modules() {
  if [ ! -d "$ROOT/node_modules" ] || [ "$ROOT/package-lock.json" -nt "$ROOT/node_modules/.package-lock.json" ]; then
    log "installing npm dependencies (npm ci)"
    (cd "$ROOT" && npm ci --no-audit --no-fund --loglevel=error)
  fi
}

port_open() { (exec 3<>"/dev/tcp/${2:-127.0.0.1}/$1") 2>/dev/null; }

# Each service the start command starts leaves its process id here; `npm stop` ends exactly those.
remember_pid() { echo "$2" >"$PIDS/$1.pid"; }

# The app talks to the private MariaDB through its Unix socket when it has one (a third less CPU
# per statement than loopback TCP, bench/load.ts), else through its port.
use_private_mariadb() {
  if [ -S "$1/sock" ]; then
    export DATABASE_URL="mysql://root@localhost/sternpost?socketPath=$(printf %s "$1/sock" | sed 's/ /%20/g')"
  else
    export DATABASE_URL="mysql://root@127.0.0.1:$MARIADB_PORT/sternpost"
  fi
}

start_mariadb() {
  if [ -n "${DATABASE_URL:-}" ]; then log "using DATABASE_URL (no private MariaDB)"; return 0; fi
  local dir="$DATA/mariadb"
  if port_open "$MARIADB_PORT"; then
    log "MariaDB already answering on 127.0.0.1:$MARIADB_PORT"
    use_private_mariadb "$dir"
    return 0
  fi
  apt_install mariadbd mariadb-server
  mkdir -p "$dir"
  if [ ! -d "$dir/data/mysql" ]; then
    log "initialising a private MariaDB in .data/mariadb"
    mariadb-install-db --no-defaults --datadir="$dir/data" --user="$(id -un)" \
      --auth-root-authentication-method=normal --skip-test-db >"$dir/install.log" 2>&1
  fi
  log "starting MariaDB on 127.0.0.1:$MARIADB_PORT"
  STARTED_MARIADB=1
  nohup mariadbd --no-defaults --datadir="$dir/data" --socket="$dir/sock" --port="$MARIADB_PORT" \
    --bind-address=127.0.0.1 --pid-file="$dir/mariadb.pid" --log-error="$dir/error.log" \
    --user="$(id -un)" --character-set-server=utf8mb4 --collation-server=utf8mb4_unicode_ci \
    --max-connections=300 >/dev/null 2>&1 &
  for _ in $(seq 1 100); do
    if mariadb-admin --no-defaults --socket="$dir/sock" -uroot ping >/dev/null 2>&1; then
      use_private_mariadb "$dir"
      return 0
    fi
    sleep 0.2
  done
  log "MariaDB did not start; see .data/mariadb/error.log"; tail -20 "$dir/error.log"; return 1
}

start_mail_sink() {
  export MAIL_SINK_DIR="${MAIL_SINK_DIR:-$DATA/mail}"
  export SMTP_URL="${SMTP_URL:-smtp://127.0.0.1:$SMTP_PORT}"
  if port_open "$SMTP_PORT"; then log "SMTP sink already answering on 127.0.0.1:$SMTP_PORT"; return 0; fi
  log "starting the SMTP sink on 127.0.0.1:$SMTP_PORT (messages in .data/mail)"
  SMTP_PORT="$SMTP_PORT" nohup "$ROOT/node_modules/.bin/tsx" "$ROOT/scripts/mail-sink.ts" >"$DATA/mail-sink.log" 2>&1 &
  remember_pid mail-sink $!
  for _ in $(seq 1 100); do port_open "$SMTP_PORT" && return 0; sleep 0.1; done
  log "the SMTP sink did not start; see .data/mail-sink.log"; return 1
}

start_s3_fake() {
  if [ -n "${S3_ENDPOINT:-}" ]; then log "using S3_ENDPOINT (no local S3 stand-in)"; return 0; fi
  local port="${S3_PORT:-4569}"
  export S3_ENDPOINT="http://127.0.0.1:$port" S3_BUCKET="${S3_BUCKET:-sternpost-photos}" S3_FORCE_PATH_STYLE=true
  export S3_ACCESS_KEY_ID="${S3_ACCESS_KEY_ID:-S3RVER}" S3_SECRET_ACCESS_KEY="${S3_SECRET_ACCESS_KEY:-S3RVER}"
  if port_open "$port"; then log "S3 stand-in already answering on 127.0.0.1:$port"; return 0; fi
  log "starting the S3 stand-in on 127.0.0.1:$port (photos in .data/s3)"
  S3_PORT="$port" S3_FAKE_DIR="$DATA/s3" nohup "$ROOT/node_modules/.bin/tsx" "$ROOT/scripts/s3-fake.ts" >"$DATA/s3-fake.log" 2>&1 &
  remember_pid s3-fake $!
  for _ in $(seq 1 100); do port_open "$port" && return 0; sleep 0.1; done
  log "the S3 stand-in did not start; see .data/s3-fake.log"; return 1
}

# HTTPS on the yard's network (npm start -- --lan): Caddy with the yard's own certificate authority
# in front of the app. Sets APP_URL, LAN_HOST, HTTPS_PORT and CA_URL for the start message.
start_https_proxy() {
  apt_install caddy caddy
  export LAN_HOST="${LAN_HOST:-$(hostname -I | awk '{print $1}')}"
  export HTTPS_PORT="${HTTPS_PORT:-3443}" CA_PORT="${CA_PORT:-3080}"
  [ -n "$LAN_HOST" ] || { log "no network address found; set LAN_HOST"; return 1; }
  export APP_URL="https://$LAN_HOST:$HTTPS_PORT" CA_URL="http://$LAN_HOST:$CA_PORT/sternpost-yard-ca.crt"
  export TRUST_PROXY=loopback HOST=127.0.0.1
  local dir="$DATA/caddy"
  if port_open "$HTTPS_PORT" "$LAN_HOST"; then log "HTTPS already answering on $LAN_HOST:$HTTPS_PORT"; return 0; fi
  "$ROOT/node_modules/.bin/tsx" "$ROOT/scripts/https-proxy.ts" config "$LAN_HOST" "$HTTPS_PORT" "$CA_PORT" "$PORT" "$dir" >/dev/null
  log "starting Caddy (HTTPS) on $LAN_HOST:$HTTPS_PORT"
  nohup caddy run --config "$dir/Caddyfile" --adapter caddyfile >"$DATA/caddy.log" 2>&1 &
  remember_pid caddy $!
  for _ in $(seq 1 100); do
    "$ROOT/node_modules/.bin/tsx" "$ROOT/scripts/https-proxy.ts" publish "$LAN_HOST" "$HTTPS_PORT" "$CA_PORT" "$PORT" "$dir" && return 0
    sleep 0.2
  done
  log "Caddy did not start; see .data/caddy.log"; tail -20 "$DATA/caddy.log"; return 1
}

# A process that has exited but not yet been reaped (state Z) is not running.
running() { kill -0 "$1" 2>/dev/null && [ "$(cut -d' ' -f3 "/proc/$1/stat" 2>/dev/null)" != Z ]; }

# Ends one recorded service by its process id and waits for it to go.
stop_recorded() { # stop_recorded <name> <pidfile>
  local pid
  [ -f "$2" ] || return 0
  pid="$(cat "$2")"
  if running "$pid"; then
    log "stopping $1 (process $pid)"
    kill "$pid" 2>/dev/null || true
    for _ in $(seq 1 100); do running "$pid" || break; sleep 0.1; done
    running "$pid" && { log "$1 still running; sending KILL"; kill -9 "$pid" 2>/dev/null || true; }
  fi
  rm -f "$2"
}

session_secret() {
  if [ -z "${SESSION_SECRET:-}" ]; then
    [ -f "$DATA/session-secret" ] || node -e 'process.stdout.write(require("crypto").randomBytes(32).toString("hex"))' >"$DATA/session-secret"
    SESSION_SECRET="$(cat "$DATA/session-secret")"
    export SESSION_SECRET
  fi
}

# Stops the private MariaDB if this script started it (tests leave nothing running behind them).
stop_mariadb_if_started() {
  local pidfile="$DATA/mariadb/mariadb.pid"
  [ "${STARTED_MARIADB:-}" = 1 ] && [ -f "$pidfile" ] || return 0
  local pid; pid="$(cat "$pidfile")"
  kill "$pid" 2>/dev/null || return 0
  for _ in $(seq 1 100); do kill -0 "$pid" 2>/dev/null || return 0; sleep 0.1; done
}
