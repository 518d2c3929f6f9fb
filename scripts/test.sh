#!/usr/bin/env bash
# npm test — every test: unit (vitest), integration (vitest against a real MariaDB and
# the S3/SMTP fakes) and end-to-end (Playwright in Debian's Chromium against a
# production build). It starts its own MariaDB and fakes on separate loopback ports
# with throw-away data in .test-data/, and stops them when done.
source "$(dirname "$0")/lib/common.sh"

export NODE_ENV=production NEXT_TELEMETRY_DISABLED=1 CI="${CI:-}"
export TEST_DATA_DIR="$ROOT/.test-data"
# DB_USER owns the test schemas (creates, migrates, resets them; the integration tests run as it).
# TEST_APP_DB_USER is the app's user: table grants only, the audit trail append-only; the browser
# tests' server runs as it.
export DB_HOST=127.0.0.1 DB_PORT="${TEST_DB_PORT:-3317}" DB_USER=kalibore_test DB_PASSWORD=kalibore-test-pw
export TEST_APP_DB_USER=kalibore_test_app TEST_APP_DB_PASSWORD=kalibore-test-app-pw
export S3_FAKE_PORT="${TEST_S3_PORT:-4579}" SMTP_FAKE_PORT="${TEST_SMTP_PORT:-2535}"
export S3_ENDPOINT="http://127.0.0.1:$S3_FAKE_PORT" S3_BUCKET=kalibore-test SMTP_HOST=127.0.0.1 SMTP_PORT="$SMTP_FAKE_PORT"
export MAIL_FAKE_DIR="$TEST_DATA_DIR/mail" S3_FAKE_DIR="$TEST_DATA_DIR/s3"
export E2E_PORT="${TEST_WEB_PORT:-3100}"
export AUTH_RATE_LIMIT_MAX=5 AUTH_RATE_LIMIT_WINDOW_S=60
# A fresh random secret per run: production mode refuses a missing or published one.
BETTER_AUTH_SECRET="$(node -e 'process.stdout.write(require("crypto").randomBytes(48).toString("base64url"))')"
export BETTER_AUTH_SECRET
# The scheduler's token for POST /api/jobs/* (the tests call the digest job with it).
JOBS_TOKEN="$(node -e 'process.stdout.write(require("crypto").randomBytes(36).toString("base64url"))')"
export JOBS_TOKEN
RESULTS="$TEST_DATA_DIR/results"
# For development only: TEST_SUITES="unit integration" runs a part, TEST_FILTER narrows
# vitest to matching files and Playwright to matching spec files. CI runs everything.
TEST_SUITES="${TEST_SUITES:-unit integration e2e}"
TEST_FILTER="${TEST_FILTER:-}"
runs() { case " $TEST_SUITES " in *" $1 "*) return 0 ;; *) return 1 ;; esac; }

cleanup() {
  local code=$?
  trap - EXIT INT TERM
  # Services the fault tests stopped and started again (tests/support/services.ts) go too.
  if [ -f "$TEST_DATA_DIR/restarted.pids" ]; then mapfile -t -O "${#STARTED_PIDS[@]}" STARTED_PIDS <"$TEST_DATA_DIR/restarted.pids"; fi
  stop_started
  exit "$code"
}
trap cleanup EXIT
trap 'exit 130' INT TERM

ensure_node_modules
ensure_mariadb
ensure_chromium

rm -rf "$TEST_DATA_DIR"; mkdir -p "$RESULTS"
port_free "$S3_FAKE_PORT" "the test S3 fake"; port_free "$SMTP_FAKE_PORT" "the test SMTP fake"; port_free "$E2E_PORT" "the test web server"
# The store answers CORS for the app's origins only: the integration tests' and the browser tests' server.
S3_FAKE_ALLOWED_ORIGINS="http://localhost:$E2E_PORT" node --import tsx scripts/fakes.ts &
STARTED_PIDS+=("$!")
wait_port "$S3_FAKE_PORT" "the test S3 fake" 20 "$!"
start_mariadb "$TEST_DATA_DIR/mariadb" "$DB_PORT" kalibore_it "$TEST_APP_DB_USER" "$TEST_APP_DB_PASSWORD" "$DB_USER" "$DB_PASSWORD"
mariadb --no-defaults --socket="$MARIADB_SOCKET" -uroot -e "CREATE DATABASE kalibore_e2e CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci; GRANT ALL ON kalibore_e2e.* TO '$DB_USER'@'127.0.0.1' WITH GRANT OPTION; GRANT ALL ON kalibore_e2e.* TO '$DB_USER'@'localhost' WITH GRANT OPTION; GRANT CREATE, DROP ON *.* TO '$DB_USER'@'127.0.0.1'; GRANT CREATE, DROP ON *.* TO '$DB_USER'@'localhost';"

status=0
if runs unit; then
  say "unit tests"
  npx vitest run --project unit --reporter=default --reporter=json --outputFile.json="$RESULTS/unit.json" $TEST_FILTER || status=1
fi

if runs integration; then
  say "integration tests (MariaDB on 127.0.0.1:$DB_PORT, S3 fake on $S3_FAKE_PORT, SMTP fake on $SMTP_FAKE_PORT)"
  DB_NAME=kalibore_it npx vitest run --project integration --reporter=default --reporter=json --outputFile.json="$RESULTS/integration.json" $TEST_FILTER || status=1
fi

if ! runs e2e; then
  node scripts/test-summary.mjs "$RESULTS" --only "$TEST_SUITES" || status=1
  exit "$status"
fi

say "end-to-end tests: production build, demo data, Chromium"
export DB_NAME=kalibore_e2e APP_URL="http://localhost:$E2E_PORT"
# The server under test connects as the app's user; migrations and the seed run as the owner.
export DB_MIGRATION_USER="$DB_USER" DB_MIGRATION_PASSWORD="$DB_PASSWORD" DB_USER="$TEST_APP_DB_USER" DB_PASSWORD="$TEST_APP_DB_PASSWORD"
# The limit stays on; the browser tests sign in as many people from one address, so it is
# wider here. tests/integration/sign-in-rate-limit.test.ts checks the limit itself. better-auth
# starts a new window only after a quiet spell as long as the window, so over a run that signs in
# every few seconds the count never resets: the bound is the run's sign-ins, not a minute's.
export AUTH_RATE_LIMIT_MAX=1000
migrate_and_grant >/dev/null
node --conditions=react-server --import tsx scripts/seed.ts --if-empty >/dev/null
npx next build >"$RESULTS/build.log" 2>&1 || { tail -n 40 "$RESULTS/build.log"; fail "next build failed"; }
PLAYWRIGHT_JSON_OUTPUT_NAME="$RESULTS/e2e.json" npx playwright test --reporter=list,json $TEST_FILTER || status=1

node scripts/test-summary.mjs "$RESULTS" --only "$TEST_SUITES" || status=1
exit "$status"
