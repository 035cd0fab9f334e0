#!/usr/bin/env bash
# npm run test:galera — past one database server: a two-node Galera cluster from Debian's packages
# on loopback, one app instance per node, and devices syncing concurrently through both
# (bench/galera-sync.ts checks every sync guarantee afterwards). Everything it starts, it stops.
# Slow-ish (about a minute), so it is not part of npm test.
source "$(dirname "$0")/lib.sh"
cd "$ROOT"
ensure_node_modules
apt_install mariadbd mariadb-server
apt_install rsync rsync
DIR="$DATA/galera"
BASE_PORT="${GALERA_BASE_PORT:-3410}"
pids=()
cleanup() {
  for pid in "${pids[@]}"; do kill "$pid" 2>/dev/null || true; done
  for n in 1 2; do [ -f "$DIR/n$n/pid" ] && kill "$(cat "$DIR/n$n/pid")" 2>/dev/null || true; done
  for n in 1 2; do for _ in $(seq 1 100); do [ -f "$DIR/n$n/pid" ] || break; sleep 0.1; done; done
}
trap cleanup EXIT
rm -rf "$DIR"

# Galera's state transfer runs an rsync daemon as the server's user; as root it would drop to
# "nobody" and fail, so the nodes run as Debian's mysql user.
start_node() { # start_node <n> [--wsrep-new-cluster]
  local n=$1 d="$DIR/n$1" g=$((4700 + $1 * 10))
  mkdir -p "$d"
  mariadb-install-db --no-defaults --datadir="$d/data" --user=mysql \
    --auth-root-authentication-method=normal --skip-test-db >"$d/install.log" 2>&1
  chown -R mysql: "$d"
  nohup mariadbd --no-defaults --datadir="$d/data" --socket="$d/sock" --port=$((BASE_PORT + n)) \
    --bind-address=127.0.0.1 --pid-file="$d/pid" --log-error="$d/error.log" --user=mysql \
    --character-set-server=utf8mb4 --collation-server=utf8mb4_unicode_ci --max-connections=300 \
    --binlog-format=ROW --default-storage-engine=InnoDB --innodb-autoinc-lock-mode=2 \
    --wsrep-on=ON --wsrep-provider=/usr/lib/galera/libgalera_smm.so --wsrep-cluster-name=sternpost \
    --wsrep-cluster-address="gcomm://127.0.0.1:4711,127.0.0.1:4721" --wsrep-node-address="127.0.0.1:$((g + 1))" \
    --wsrep-provider-options="gmcast.listen_addr=tcp://127.0.0.1:$((g + 1));ist.recv_addr=127.0.0.1:$((g + 2))" \
    --wsrep-sst-method=rsync --wsrep-sst-receive-address="127.0.0.1:$((g + 3))" "${@:2}" >/dev/null 2>&1 &
  for _ in $(seq 1 200); do
    mariadb --no-defaults --socket="$d/sock" -uroot -Nse "show status like 'wsrep_local_state_comment'" 2>/dev/null |
      grep -q Synced && return 0
    sleep 0.2
  done
  log "Galera node $n did not join; see $d/error.log"; tail -20 "$d/error.log"; return 1
}

log "starting a two-node Galera cluster on 127.0.0.1:$((BASE_PORT + 1)) and :$((BASE_PORT + 2))"
start_node 1 --wsrep-new-cluster
start_node 2
size=$(mariadb --no-defaults --socket="$DIR/n1/sock" -uroot -Nse "show status like 'wsrep_cluster_size'" | cut -f2)
log "cluster size: $size"
[ "$size" = 2 ] || { log "the second node did not join"; exit 1; }

NODE1="mysql://root@127.0.0.1:$((BASE_PORT + 1))/sternpost"
NODE2="mysql://root@127.0.0.1:$((BASE_PORT + 2))/sternpost"
DATABASE_URL="$NODE1" node_modules/.bin/tsx scripts/db.ts create migrate seed
[ -f build/server/index.js ] || node_modules/.bin/react-router build >"$DATA/build.log" 2>&1

export NODE_ENV=production SESSION_SECRET="galera-test-secret-0123456789abcdef" MAIL_SINK_DIR=""
for n in 1 2; do
  port=$((BASE_PORT + 100 + n))
  url=$([ $n = 1 ] && echo "$NODE1" || echo "$NODE2")
  PORT=$port APP_URL="http://localhost:$port" DATABASE_URL="$url" node --max-old-space-size="$APP_HEAP_MB" server.js >"$DATA/galera-app$n.log" 2>&1 &
  pids+=($!)
done
for n in 1 2; do
  for _ in $(seq 1 150); do
    node -e 'fetch(process.argv[1]).then((r) => process.exit(r.ok ? 0 : 1), () => process.exit(1))' \
      "http://127.0.0.1:$((BASE_PORT + 100 + n))/healthz" && break
    sleep 0.2
  done
done
log "app instances on :$((BASE_PORT + 101)) (node 1) and :$((BASE_PORT + 102)) (node 2); syncing"
node_modules/.bin/tsx bench/galera-sync.ts "http://127.0.0.1:$((BASE_PORT + 101))" "http://127.0.0.1:$((BASE_PORT + 102))" "$NODE1" "$NODE2"
