#!/usr/bin/env bash
# npm start — brings up the whole product with its demo data on this machine:
# npm packages, a private MariaDB on loopback, the S3 and SMTP fakes, migrations,
# the demo seed (only into an empty database), a production build, and the server.
# Ctrl-C (or `npm run stop` from another terminal) stops everything it started.
source "$(dirname "$0")/lib/common.sh"

local_instance_env
RUN_DIR="$DATA_DIR/run"

cleanup() {
  local code=$?
  trap - EXIT INT TERM
  if [ "${#STARTED_PIDS[@]}" -gt 0 ]; then say "stopping everything this run started"; fi
  stop_started
  rm -f "$RUN_DIR/start.pids"
  exit "$code"
}
trap cleanup EXIT
trap 'exit 130' INT TERM

mkdir -p "$RUN_DIR"
if [ -f "$RUN_DIR/start.pids" ] && xargs -r kill -0 <"$RUN_DIR/start.pids" 2>/dev/null; then
  fail "Kalibore already seems to be running (pids in ${RUN_DIR#$ROOT/}/start.pids); stop it with: npm run stop"
fi

ensure_node_modules
ensure_mariadb
check_env
port_free "$PORT" "the Kalibore web server"

# The fakes run only when the configuration points at them; real S3/SMTP need none.
if [[ "$S3_ENDPOINT" == "http://127.0.0.1:$S3_FAKE_PORT" || "$SMTP_HOST:$SMTP_PORT" == "127.0.0.1:$SMTP_FAKE_PORT" ]]; then
  port_free "$S3_FAKE_PORT" "the S3 fake"
  port_free "$SMTP_FAKE_PORT" "the SMTP fake"
  S3_FAKE_DIR="$DATA_DIR/s3" MAIL_FAKE_DIR="$DATA_DIR/mail" node --import tsx scripts/fakes.ts &
  STARTED_PIDS+=("$!")
  wait_port "$S3_FAKE_PORT" "the S3 fake" 20 "$!"
  wait_port "$SMTP_FAKE_PORT" "the SMTP fake" 20
fi

start_mariadb "$DATA_DIR/mariadb" "$DB_PORT" "$DB_NAME" "$DB_USER" "$DB_PASSWORD" "$DB_MIGRATION_USER" "$DB_MIGRATION_PASSWORD"
printf '%s\n' "${STARTED_PIDS[@]}" >"$RUN_DIR/start.pids"

say "running database migrations"
migrate_and_grant

say "seeding the demo scenario if the database is empty"
node --conditions=react-server --import tsx scripts/seed.ts --if-empty

if [ ! -f .next/BUILD_ID ] || [ -n "$(find app components lib public next.config.ts tailwind.config.ts package-lock.json -newer .next/BUILD_ID -print -quit 2>/dev/null)" ]; then
  say "building the web app (production mode)"
  npx next build
else
  say "production build is up to date"
fi

# Our server in front of Next.js: it records each client's address from the socket (or
# TRUSTED_PROXY_HEADER), which `next start` cannot; see lib/auth/client-address.ts.
node --import tsx scripts/serve.ts &
WEB_PID=$!
STARTED_PIDS+=("$WEB_PID")
printf '%s\n' "${STARTED_PIDS[@]}" >"$RUN_DIR/start.pids"
wait_port "$PORT" "the web server" 60 "$WEB_PID"

cat <<MSG

  Kalibore is running at  $APP_URL

  Demo sign-ins (password for all: Kalibore-demo-1)
    admin@brisemer.example        administrator
    supt@brisemer.example         technical superintendent (whole fleet)
    chief@brisemer.example        chief engineer
    engineer@brisemer.example     engineer (2nd / 3rd)

  Mail sent by the app is captured in ${DATA_DIR#$ROOT/}/mail as .eml files.
  Stop with Ctrl-C (or: npm run stop). Reset the demo with: npm run reset-demo

MSG
wait "$WEB_PID"
