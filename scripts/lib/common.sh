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

# start_mariadb DIR PORT DBNAME DBUSER DBPASSWORD
start_mariadb() {
  local dir port=$2 name=$3 user=$4 password=$5
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
  mariadb --no-defaults --socket="$sock" -uroot <<SQL
CREATE DATABASE IF NOT EXISTS \`$name\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;
CREATE USER IF NOT EXISTS '$user'@'127.0.0.1' IDENTIFIED BY '$password';
CREATE USER IF NOT EXISTS '$user'@'localhost' IDENTIFIED BY '$password';
ALTER USER '$user'@'127.0.0.1' IDENTIFIED BY '$password';
ALTER USER '$user'@'localhost' IDENTIFIED BY '$password';
GRANT ALL PRIVILEGES ON \`$name\`.* TO '$user'@'127.0.0.1';
GRANT ALL PRIVILEGES ON \`$name\`.* TO '$user'@'localhost';
GRANT ALL PRIVILEGES ON \`${name}\_%\`.* TO '$user'@'127.0.0.1';
FLUSH PRIVILEGES;
SQL
  MARIADB_SOCKET="$sock"
  say "MariaDB ready on 127.0.0.1:$port (database $name, data in ${dir#$ROOT/})"
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

# ensure_auth_secret FILE — unless BETTER_AUTH_SECRET is set, reads it from FILE, generating a
# random one there (readable by this user only) the first time, so sessions survive restarts.
ensure_auth_secret() {
  local file=$1
  if [ -n "${BETTER_AUTH_SECRET:-}" ]; then return 0; fi
  if [ ! -s "$file" ]; then
    mkdir -p "$(dirname "$file")"
    (umask 077 && node -e 'process.stdout.write(require("crypto").randomBytes(48).toString("base64url"))' >"$file.tmp" && mv "$file.tmp" "$file")
    say "generated a random BETTER_AUTH_SECRET into ${file#$ROOT/} (kept for the next runs)"
  fi
  BETTER_AUTH_SECRET="$(cat "$file")"
  export BETTER_AUTH_SECRET
}

# check_env — validates configuration through the same zod schema the app uses.
check_env() {
  npx tsx -e 'import("./lib/env.ts").catch((e) => { console.error(e.message); process.exit(1); })' \
    || fail "configuration is invalid (see the variable named above and .env.example)"
}
