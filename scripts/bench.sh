#!/usr/bin/env bash
# npm run bench — speed and memory targets, measured on a fleet 50× the demo in a
# private MariaDB (127.0.0.1:3327, data in .bench-data/). Not a test: it prints numbers
# beside their targets. The fleet is generated once and kept between runs.
# BENCH_PARTS (default "recompute load bundle") picks the parts; the load part starts the
# production server on the bench fleet (port BENCH_WEB_PORT, default 3338; S3 fake on
# BENCH_S3_PORT, default 4589) and runs scripts/bench-load.ts against it.
source "$(dirname "$0")/lib/common.sh"
export NODE_ENV=production DB_HOST=127.0.0.1 DB_PORT="${BENCH_DB_PORT:-3327}" DB_NAME=kalibore_bench DB_USER=kalibore_bench DB_PASSWORD=kalibore-bench-pw
ensure_auth_secret "$ROOT/.bench-data/auth-secret"
trap 'stop_started' EXIT
trap 'exit 130' INT TERM
ensure_node_modules
ensure_mariadb
start_mariadb "$ROOT/.bench-data/mariadb" "$DB_PORT" "$DB_NAME" "$DB_USER" "$DB_PASSWORD"
# The importer's benchmark stores its files: the S3 fake, on ports of the benchmark's own.
export S3_FAKE_PORT="${BENCH_S3_PORT:-4589}" SMTP_FAKE_PORT="${BENCH_SMTP_PORT:-2545}" S3_FAKE_DIR="$ROOT/.bench-data/s3" MAIL_FAKE_DIR="$ROOT/.bench-data/mail"
export S3_ENDPOINT="http://127.0.0.1:$S3_FAKE_PORT" SMTP_PORT="$SMTP_FAKE_PORT"
port_free "$S3_FAKE_PORT" "the benchmark's S3 fake"
node --import tsx scripts/fakes.ts >/dev/null &
STARTED_PIDS+=("$!")
wait_port "$S3_FAKE_PORT" "the benchmark's S3 fake" 20 "$!"
NODE_OPTIONS="--import tsx" npx knex migrate:latest --knexfile knexfile.ts >/dev/null
node --conditions=react-server --import tsx scripts/seed.ts --if-empty --scale "${BENCH_SCALE:-200}" --no-recompute
BENCH_PARTS="${BENCH_PARTS:-recompute load bundle}"
part() { case " $BENCH_PARTS " in *" $1 "*) return 0 ;; *) return 1 ;; esac; }
if part recompute; then
  # Timed as the product runs it: bundled ahead of time (as the Next.js server bundle is), not
  # through tsx's on-the-fly transform, whose module wrappers alone doubled the per-reading cost.
  # The importer's mutations reach next/navigation and next/headers (through the company settings),
  # which cannot load outside a Next.js server: a stub stands in, since the benchmark never calls them.
  npx esbuild scripts/bench.ts --bundle --platform=node --format=esm --packages=external --log-level=warning --alias:next/navigation=./scripts/lib/bench-next-stub.ts --alias:next/headers=./scripts/lib/bench-next-stub.ts --outfile="$ROOT/.bench-data/bench.mjs"
  node --conditions=react-server --expose-gc "$ROOT/.bench-data/bench.mjs"
fi
if part load; then
  # The production server on the bench fleet, with the S3 fake started above.
  export PORT="${BENCH_WEB_PORT:-3338}" HOST=127.0.0.1 APP_URL="http://127.0.0.1:${BENCH_WEB_PORT:-3338}" BENCH_WEB_URL="http://127.0.0.1:${BENCH_WEB_PORT:-3338}"
  # 20 people sign in from one address within a second; the per-address limit is not what is measured.
  export AUTH_RATE_LIMIT_MAX=1000 NEXT_TELEMETRY_DISABLED=1
  port_free "$PORT" "the bench web server"
  if [ ! -f .next/BUILD_ID ] || [ -n "$(find app components lib public next.config.ts tailwind.config.ts package-lock.json -newer .next/BUILD_ID -print -quit 2>/dev/null)" ]; then
    say "building the web app (production mode) for the load benchmark"
    npx next build >"$ROOT/.bench-data/build.log" 2>&1 || { tail -n 30 "$ROOT/.bench-data/build.log"; fail "next build failed"; }
  fi
  node --import tsx scripts/serve.ts >"$ROOT/.bench-data/server.log" 2>&1 &
  STARTED_PIDS+=("$!")
  wait_port "$PORT" "the bench web server" 60 "$!"
  node --import tsx scripts/bench-load.ts
fi
if ! part bundle; then exit 0; fi
# (c) the entry screens' first-load JavaScript, from the last production build when there is one.
if [ -f "$ROOT/.next/diagnostics/route-bundle-stats.json" ]; then
  node "$ROOT/scripts/bench-bundle.mjs"
else
  echo "first-load JavaScript: no production build in .next (run npx next build, then node scripts/bench-bundle.mjs)"
fi
