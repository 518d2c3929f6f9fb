#!/usr/bin/env bash
# npm run test:cluster — Kalibore on a real MariaDB Galera cluster, on loopback, with throw-away
# data in .cluster-data/: three Galera nodes (Debian's galera-4 with mariadb-server), haproxy from
# Debian in front of nodes 2 and 3, and two app instances — A on node 1, B through haproxy — then
# tests/cluster/ (vitest) against them. Not part of npm test. Ports: CLUSTER_PORT_BASE (4600) + …
#   node n: 10n+1 client, 10n+2 replication, 10n+3 IST, 10n+4 SST; haproxy +90; S3 fake +93;
#   app A and B: CLUSTER_APP_A_PORT (3768), CLUSTER_APP_B_PORT (3769).
source "$(dirname "$0")/lib/common.sh"

BASE="${CLUSTER_PORT_BASE:-4600}"
DIR="$ROOT/.cluster-data"
export NODE_ENV=production NEXT_TELEMETRY_DISABLED=1
export CLUSTER_DIR="$DIR" CLUSTER_NODE_PORTS="$((BASE + 11)) $((BASE + 21)) $((BASE + 31))"
export CLUSTER_PROXY_PORT=$((BASE + 90)) S3_FAKE_PORT=$((BASE + 93)) SMTP_FAKE_PORT=$((BASE + 94))
export CLUSTER_APP_A_PORT="${CLUSTER_APP_A_PORT:-3768}" CLUSTER_APP_B_PORT="${CLUSTER_APP_B_PORT:-3769}"
export DB_HOST=127.0.0.1 DB_NAME=kalibore_cluster DB_USER=kalibore_app DB_PASSWORD=cluster-app-pw
export DB_MIGRATION_USER=kalibore_owner DB_MIGRATION_PASSWORD=cluster-owner-pw DB_APP_USER_HOSTS=127.0.0.1
export S3_ENDPOINT="http://127.0.0.1:$S3_FAKE_PORT" S3_BUCKET=kalibore-cluster SMTP_HOST=127.0.0.1 SMTP_PORT="$SMTP_FAKE_PORT"
export MAIL_FAKE_DIR="$DIR/mail" S3_FAKE_DIR="$DIR/s3"
export AUTH_RATE_LIMIT_MAX=1000
JOBS_TOKEN="$(node -e 'process.stdout.write(require("crypto").randomBytes(36).toString("base64url"))')"
export JOBS_TOKEN
BETTER_AUTH_SECRET="$(node -e 'process.stdout.write(require("crypto").randomBytes(48).toString("base64url"))')"
export BETTER_AUTH_SECRET
trap 'stop_started' EXIT
trap 'exit 130' INT TERM

ensure_node_modules
ensure_mariadb
GALERA=/usr/lib/galera/libgalera_smm.so
if [ ! -e "$GALERA" ] || ! command -v rsync >/dev/null; then say "installing galera-4 and rsync from Debian"; apt_install galera-4 rsync; fi
if ! command -v haproxy >/dev/null && [ ! -x /usr/sbin/haproxy ]; then say "installing haproxy from Debian"; apt_install haproxy; fi

rm -rf "$DIR"; mkdir -p "$DIR/mail" "$DIR/s3"
for p in $CLUSTER_NODE_PORTS $((BASE + 12)) $((BASE + 22)) $((BASE + 32)) "$CLUSTER_PROXY_PORT" "$S3_FAKE_PORT" "$SMTP_FAKE_PORT" "$CLUSTER_APP_A_PORT" "$CLUSTER_APP_B_PORT"; do port_free "$p" "the cluster test"; done

# As root, the nodes run as Debian's mysql user: the rsync daemon of a state transfer started by
# root would drop to "nobody" and could not write into the joiner's data folder.
NODE_USER="$(id -un)"
if [ "$(id -u)" = 0 ] && id mysql >/dev/null 2>&1; then NODE_USER=mysql; fi

# start_node N [--wsrep-new-cluster]
start_node() {
  local n=$1 extra=${2:-} d="$DIR/node$1" p=$((BASE + 10 * $1))
  mkdir -p "$d/data" "$d/run"
  chown -R "$NODE_USER" "$d"
  if [ ! -d "$d/data/mysql" ]; then
    mariadb-install-db --no-defaults --user="$NODE_USER" --datadir="$d/data" --auth-root-authentication-method=socket --skip-test-db >"$d/install.log" 2>&1 \
      || { tail -n 20 "$d/install.log" >&2; fail "mariadb-install-db failed for node $n"; }
  fi
  mariadbd --no-defaults --user="$NODE_USER" --datadir="$d/data" --bind-address=127.0.0.1 --port=$((p + 1)) \
    --socket="$d/run/mysqld.sock" --pid-file="$d/run/mysqld.pid" --log-error="$d/error.log" --skip-name-resolve \
    --character-set-server=utf8mb4 --collation-server=utf8mb4_unicode_ci --innodb-buffer-pool-size=64M --max-connections=200 \
    --binlog-format=ROW --default-storage-engine=InnoDB --innodb-autoinc-lock-mode=2 --wsrep-sync-wait=1 \
    --wsrep-on=ON --wsrep-provider="$GALERA" --wsrep-cluster-name=kalibore_test --wsrep-node-name="node$n" \
    --wsrep-cluster-address="gcomm://127.0.0.1:$((BASE + 12)),127.0.0.1:$((BASE + 22)),127.0.0.1:$((BASE + 32))" \
    --wsrep-node-address="127.0.0.1:$((p + 2))" --wsrep-sst-method=rsync --wsrep-sst-receive-address="127.0.0.1:$((p + 4))" \
    --wsrep-provider-options="gmcast.listen_addr=tcp://127.0.0.1:$((p + 2));ist.recv_addr=127.0.0.1:$((p + 3));evs.suspect_timeout=PT3S;evs.inactive_timeout=PT6S;evs.install_timeout=PT4S;gcache.size=64M" \
    $extra &
  STARTED_PIDS+=("$!")
  echo "$!" >"$d/run/node.pid"
  for _ in $(seq 1 300); do
    if [ "$(mariadb --no-defaults --socket="$d/run/mysqld.sock" -uroot -N -B -e "SHOW STATUS LIKE 'wsrep_ready'" 2>/dev/null | cut -f2)" = "ON" ]; then
      say "Galera node $n ready on 127.0.0.1:$((p + 1))"; return 0
    fi
    kill -0 "$!" 2>/dev/null || { tail -n 30 "$d/error.log" >&2; fail "Galera node $n exited"; }
    sleep 0.2
  done
  tail -n 30 "$d/error.log" >&2; fail "Galera node $n was not ready within 60 s"
}

start_node 1 --wsrep-new-cluster
mariadb --no-defaults --socket="$DIR/node1/run/mysqld.sock" -uroot <<SQL
CREATE DATABASE $DB_NAME CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;
CREATE USER '$DB_MIGRATION_USER'@'127.0.0.1' IDENTIFIED BY '$DB_MIGRATION_PASSWORD';
GRANT ALL PRIVILEGES ON $DB_NAME.* TO '$DB_MIGRATION_USER'@'127.0.0.1' WITH GRANT OPTION;
CREATE USER '$DB_USER'@'127.0.0.1' IDENTIFIED BY '$DB_PASSWORD';
SQL
# The other nodes start from a copy of node 1's cleanly stopped data folder (the same cluster state),
# so they join without a full state transfer: quicker, and no SST tool to configure on a laptop.
mariadb-admin --no-defaults --socket="$DIR/node1/run/mysqld.sock" -uroot shutdown
for _ in $(seq 1 150); do kill -0 "$(cat "$DIR/node1/run/node.pid")" 2>/dev/null || break; sleep 0.2; done
for n in 2 3; do mkdir -p "$DIR/node$n"; cp -a "$DIR/node1/data" "$DIR/node$n/data"; done
start_node 1 --wsrep-new-cluster
start_node 2
start_node 3
size=$(mariadb --no-defaults --socket="$DIR/node1/run/mysqld.sock" -uroot -N -B -e "SHOW STATUS LIKE 'wsrep_cluster_size'" | cut -f2)
[ "$size" = 3 ] || fail "the cluster has $size nodes, not 3"
say "Galera cluster of 3 nodes is primary"

cat >"$DIR/haproxy.cfg" <<CFG
global
  maxconn 500
defaults
  mode tcp
  timeout connect 2s
  timeout client 1h
  timeout server 1h
listen galera
  bind 127.0.0.1:$CLUSTER_PROXY_PORT
  option tcp-check
  default-server inter 500ms fall 2 rise 2 on-marked-down shutdown-sessions
  server node2 127.0.0.1:$((BASE + 21)) check
  server node3 127.0.0.1:$((BASE + 31)) check backup
CFG
haproxy -f "$DIR/haproxy.cfg" -db >"$DIR/haproxy.log" 2>&1 &
STARTED_PIDS+=("$!")
wait_port "$CLUSTER_PROXY_PORT" "haproxy" 20 "$!"

export DB_PORT=$((BASE + 11))
migrate_and_grant >/dev/null
S3_FAKE_ALLOWED_ORIGINS="http://127.0.0.1:$CLUSTER_APP_A_PORT http://127.0.0.1:$CLUSTER_APP_B_PORT" node --import tsx scripts/fakes.ts >/dev/null &
STARTED_PIDS+=("$!")
wait_port "$S3_FAKE_PORT" "the S3 fake" 20 "$!"

if [ ! -f .next/BUILD_ID ] || [ -n "$(find app components lib public next.config.ts tailwind.config.ts package-lock.json -newer .next/BUILD_ID -print -quit 2>/dev/null)" ]; then
  say "building the web app (production mode)"
  npx next build >"$DIR/build.log" 2>&1 || { tail -n 30 "$DIR/build.log"; fail "next build failed"; }
fi
# The same APP_URL for both: one site behind a balancer (sign-in and state-changing requests check it).
export APP_URL="http://127.0.0.1:$CLUSTER_APP_A_PORT"
PORT=$CLUSTER_APP_A_PORT DB_PORT=$((BASE + 11)) node --import tsx scripts/serve.ts >"$DIR/app-a.log" 2>&1 &
STARTED_PIDS+=("$!")
PORT=$CLUSTER_APP_B_PORT DB_PORT=$CLUSTER_PROXY_PORT node --import tsx scripts/serve.ts >"$DIR/app-b.log" 2>&1 &
STARTED_PIDS+=("$!")
wait_port "$CLUSTER_APP_A_PORT" "app instance A" 60
wait_port "$CLUSTER_APP_B_PORT" "app instance B" 60
say "app A on :$CLUSTER_APP_A_PORT (node 1), app B on :$CLUSTER_APP_B_PORT (haproxy → node 2, node 3 as backup)"

npx vitest run --project cluster
