# Shared shell helpers for scripts/start.sh and scripts/test.sh.
# Every process started here is recorded so that a failed or interrupted run stops
# exactly what it started and nothing else.

set -euo pipefail

ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)"
cd "$ROOT"
STARTED_PIDS=()
# The AWS SDK is pinned to a release that supports Node 20; its notice about later releases is noise here.
export AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED=true

say() { printf '\033[1;36m[kalibore]\033[0m %s\n' "$*"; }
fail() { printf '\033[1;31m[kalibore] %s\033[0m\n' "$*" >&2; exit 1; }

as_root() { if [ "$(id -u)" = 0 ]; then "$@"; else sudo "$@"; fi; }

APT_UPDATED=0
apt_install() {
  if [ "$APT_UPDATED" = 0 ]; then as_root apt-get update -qq >/dev/null; APT_UPDATED=1; fi
  DEBIAN_FRONTEND=noninteractive as_root apt-get install -y -qq "$@" >/dev/null
}

ensure_node_modules() {
  if [ ! -d node_modules ] || [ package-lock.json -nt node_modules/.package-lock.json ]; then
    say "installing npm packages from package-lock.json"
    # Dev dependencies too: the build (TypeScript, Tailwind) and the tests need them.
    NODE_ENV=development npm ci --include=dev --no-audit --no-fund
  fi
}

ensure_mariadb() {
  if ! command -v mariadbd >/dev/null 2>&1 && [ ! -x /usr/sbin/mariadbd ]; then
    say "installing MariaDB from Debian (mariadb-server, mariadb-client)"
    apt_install mariadb-server mariadb-client
  fi
  export PATH="$PATH:/usr/sbin"
}

ensure_chromium() {
  if [ ! -x /usr/bin/chromium ]; then
    say "installing Chromium from Debian for the browser tests"
    apt_install chromium
  fi
}

# port_free PORT NAME — fail with the port number when something already listens there.
port_free() {
  if node -e "const s=require('net').createServer();s.once('error',()=>process.exit(1));s.listen($1,'127.0.0.1',()=>s.close(()=>process.exit(0)))"; then
    return 0
  fi
  fail "port $1 (for $2) is already in use on 127.0.0.1 — stop what uses it or set another port (see .env.example)"
}

# wait_port PORT NAME SECONDS PID
wait_port() {
  local port=$1 name=$2 secs=$3 pid=${4:-}
  for _ in $(seq 1 $((secs * 5))); do
    if node -e "const s=require('net').connect($port,'127.0.0.1');s.on('connect',()=>process.exit(0));s.on('error',()=>process.exit(1))"; then return 0; fi
    if [ -n "$pid" ] && ! kill -0 "$pid" 2>/dev/null; then fail "$name exited before listening on port $port"; fi
    sleep 0.2
  done
  fail "$name did not listen on port $port within ${secs}s"
}

stop_started() {
  local pid
  for pid in "${STARTED_PIDS[@]:-}"; do
    [ -n "$pid" ] && kill "$pid" 2>/dev/null || true
  done
  for pid in "${STARTED_PIDS[@]:-}"; do
    [ -n "$pid" ] || continue
    for _ in $(seq 1 50); do kill -0 "$pid" 2>/dev/null || break; sleep 0.1; done
    kill -9 "$pid" 2>/dev/null || true
  done
  STARTED_PIDS=()
}

# start_mariadb DIR PORT DBNAME DBUSER DBPASSWORD [OWNERUSER OWNERPASSWORD]
# With an owner, the owner holds the schema (migrations, seed; GRANT OPTION) and DBUSER — the
# app's user — gets no database-wide privilege: migrate_and_grant gives it its tables one by one,
# the audit trail append-only. Without one, DBUSER owns the schema.
start_mariadb() {
  local dir port=$2 name=$3 user=$4 password=$5 owner=${6:-} owner_password=${7:-}
  [ "$owner" = "$user" ] && owner=""
  mkdir -p "$1"; dir="$(cd "$1" && pwd)"
  local sock="$dir/run/mysqld.sock"
  mkdir -p "$dir/run"
  if [ ! -d "$dir/data/mysql" ]; then
    say "creating a private MariaDB data folder in ${dir#$ROOT/}"
    mkdir -p "$dir/data"
    mariadb-install-db --no-defaults --user="$(id -un)" --datadir="$dir/data" \
      --auth-root-authentication-method=socket --skip-test-db >"$dir/install.log" 2>&1 \
      || { tail -n 20 "$dir/install.log" >&2; fail "mariadb-install-db failed (log above)"; }
  fi
  port_free "$port" "MariaDB"
  : >"$dir/error.log"
  mariadbd --no-defaults --user="$(id -un)" --datadir="$dir/data" --bind-address=127.0.0.1 --port="$port" \
    --socket="$sock" --pid-file="$dir/run/mysqld.pid" --log-error="$dir/error.log" \
    --skip-name-resolve --innodb-buffer-pool-size=256M --character-set-server=utf8mb4 \
    --collation-server=utf8mb4_unicode_ci --max-connections=300 --local-infile=1 &
  local pid=$!
  STARTED_PIDS+=("$pid")
  for _ in $(seq 1 150); do
    if mariadb-admin --no-defaults --socket="$sock" -uroot ping >/dev/null 2>&1; then break; fi
    if ! kill -0 "$pid" 2>/dev/null; then
      echo "---- last lines of $dir/error.log ----" >&2; tail -n 25 "$dir/error.log" >&2
      fail "MariaDB failed to start"
    fi
    sleep 0.2
  done
  mariadb-admin --no-defaults --socket="$sock" -uroot ping >/dev/null 2>&1 || {
    tail -n 25 "$dir/error.log" >&2; fail "MariaDB did not become ready within 30 s"; }
  local schema_owner=${owner:-$user} schema_owner_password=${owner_password:-$password} grant_option=""
  [ -n "$owner" ] && grant_option="WITH GRANT OPTION"
  mariadb --no-defaults --socket="$sock" -uroot <<SQL
CREATE DATABASE IF NOT EXISTS \`$name\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;
CREATE USER IF NOT EXISTS '$user'@'127.0.0.1' IDENTIFIED BY '$password';
CREATE USER IF NOT EXISTS '$user'@'localhost' IDENTIFIED BY '$password';
ALTER USER '$user'@'127.0.0.1' IDENTIFIED BY '$password';
ALTER USER '$user'@'localhost' IDENTIFIED BY '$password';
CREATE USER IF NOT EXISTS '$schema_owner'@'127.0.0.1' IDENTIFIED BY '$schema_owner_password';
CREATE USER IF NOT EXISTS '$schema_owner'@'localhost' IDENTIFIED BY '$schema_owner_password';
ALTER USER '$schema_owner'@'127.0.0.1' IDENTIFIED BY '$schema_owner_password';
ALTER USER '$schema_owner'@'localhost' IDENTIFIED BY '$schema_owner_password';
GRANT ALL PRIVILEGES ON \`$name\`.* TO '$schema_owner'@'127.0.0.1' $grant_option;
GRANT ALL PRIVILEGES ON \`$name\`.* TO '$schema_owner'@'localhost' $grant_option;
GRANT ALL PRIVILEGES ON \`${name}\_%\`.* TO '$schema_owner'@'127.0.0.1' $grant_option;
FLUSH PRIVILEGES;
SQL
  if [ -n "$owner" ]; then
    # A data folder from before the owner/app split gave the app user the whole database; take it back
    # (each statement fails harmlessly when there is nothing to revoke).
    mariadb --no-defaults --socket="$sock" -uroot --force >/dev/null 2>&1 <<SQL || true
REVOKE ALL PRIVILEGES ON \`$name\`.* FROM '$user'@'127.0.0.1';
REVOKE ALL PRIVILEGES ON \`$name\`.* FROM '$user'@'localhost';
REVOKE ALL PRIVILEGES ON \`${name}\_%\`.* FROM '$user'@'127.0.0.1';
FLUSH PRIVILEGES;
SQL
  fi
  MARIADB_SOCKET="$sock"
  say "MariaDB ready on 127.0.0.1:$port (database $name, data in ${dir#$ROOT/})"
}

# migrate_and_grant — the migrations as the schema's owner (DB_MIGRATION_USER), then the app user's
# table grants (scripts/db-grants.ts; nothing to do without a separate owner).
migrate_and_grant() {
  NODE_OPTIONS="--import tsx" npx knex migrate:latest --knexfile knexfile.ts
  node --import tsx scripts/db-grants.ts
}

load_env_file() {
  # .env is optional; values already in the environment win. Trailing "# comments" are dropped.
  [ -f .env ] || return 0
  local line key value
  while IFS= read -r line || [ -n "$line" ]; do
    line="${line%%#*}"
    [[ "$line" =~ ^[[:space:]]*([A-Za-z_][A-Za-z0-9_]*)=(.*)$ ]] || continue
    key="${BASH_REMATCH[1]}"; value="${BASH_REMATCH[2]}"
    value="$(printf '%s' "$value" | sed -e 's/^[[:space:]]*//' -e 's/[[:space:]]*$//' -e 's/^"\(.*\)"$/\1/')"
    [ -z "$value" ] && continue
    [ -z "${!key:-}" ] && export "$key=$value"
  done < .env
}

# ensure_secret VAR FILE — unless VAR is set, reads it from FILE, generating a random one there
# (readable by this user only) the first time, so it survives restarts.
ensure_secret() {
  local var=$1 file=$2
  if [ -n "${!var:-}" ]; then return 0; fi
  if [ ! -s "$file" ]; then
    mkdir -p "$(dirname "$file")"
    (umask 077 && node -e 'process.stdout.write(require("crypto").randomBytes(48).toString("base64url"))' >"$file.tmp" && mv "$file.tmp" "$file")
    say "generated a random $var into ${file#$ROOT/} (kept for the next runs)"
  fi
  printf -v "$var" '%s' "$(cat "$file")"
  export "${var?}"
}

# ensure_auth_secret FILE — BETTER_AUTH_SECRET, from the environment or FILE (see ensure_secret).
ensure_auth_secret() { ensure_secret BETTER_AUTH_SECRET "$1"; }

# check_env — validates configuration through the same zod schema the app uses.
check_env() {
  npx tsx -e 'import("./lib/env.ts").catch((e) => { console.error(e.message); process.exit(1); })' \
    || fail "configuration is invalid (see the variable named above and .env.example)"
}

# local_instance_env — the settings of the instance `npm start` runs (and backup/restore reach):
# .env, then the local defaults; sets DATA_DIR.
local_instance_env() {
  load_env_file
  export NODE_ENV=production NEXT_TELEMETRY_DISABLED=1
  export PORT="${PORT:-3000}" HOST="${HOST:-127.0.0.1}"
  export APP_URL="${APP_URL:-http://localhost:$PORT}"
  export DB_HOST="${DB_HOST:-127.0.0.1}" DB_PORT="${DB_PORT:-3307}" DB_NAME="${DB_NAME:-kalibore}"
  export DB_USER="${DB_USER:-kalibore}" DB_PASSWORD="${DB_PASSWORD:-kalibore-local}"
  # The schema's owner runs the migrations and the seed; the app's user may not change the audit trail.
  export DB_MIGRATION_USER="${DB_MIGRATION_USER:-kalibore_owner}"
  export S3_FAKE_PORT="${S3_FAKE_PORT:-4569}" SMTP_FAKE_PORT="${SMTP_FAKE_PORT:-2525}"
  export S3_ENDPOINT="${S3_ENDPOINT:-http://127.0.0.1:$S3_FAKE_PORT}" SMTP_HOST="${SMTP_HOST:-127.0.0.1}" SMTP_PORT="${SMTP_PORT:-$SMTP_FAKE_PORT}"
  DATA_DIR="${KALIBORE_DATA_DIR:-$ROOT/.data}"
  ensure_auth_secret "$DATA_DIR/auth-secret"
  ensure_secret DB_MIGRATION_PASSWORD "$DATA_DIR/db-owner-password"
}

# port_in_use PORT — true when something listens on 127.0.0.1:PORT.
port_in_use() {
  node -e "const s=require('net').connect($1,'127.0.0.1');s.on('connect',()=>process.exit(0));s.on('error',()=>process.exit(1))"
}

# with_local_services — for backup and restore: when the configuration points at the private
# MariaDB and the S3 fake and they are not running (Kalibore is stopped), starts them for this
# command only; a running `npm start`, or real services, are used as they are.
with_local_services() {
  if [[ "$S3_ENDPOINT" == "http://127.0.0.1:$S3_FAKE_PORT" ]] && ! port_in_use "$S3_FAKE_PORT"; then
    SMTP_FAKE_PORT=0 S3_FAKE_DIR="$DATA_DIR/s3" MAIL_FAKE_DIR="$DATA_DIR/mail" node --import tsx scripts/fakes.ts >/dev/null &
    STARTED_PIDS+=("$!")
    wait_port "$S3_FAKE_PORT" "the S3 fake" 20 "$!"
  fi
  if [[ "$DB_HOST" == "127.0.0.1" ]] && ! port_in_use "$DB_PORT"; then
    start_mariadb "$DATA_DIR/mariadb" "$DB_PORT" "$DB_NAME" "$DB_USER" "$DB_PASSWORD" "$DB_MIGRATION_USER" "$DB_MIGRATION_PASSWORD" >/dev/null
  fi
}
