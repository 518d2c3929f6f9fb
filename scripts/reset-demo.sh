#!/usr/bin/env bash
# npm run reset-demo — stops Kalibore and deletes its local data (database, stored
# files, captured mail); the next `npm start` seeds the demo scenario afresh.
source "$(dirname "$0")/lib/common.sh"
bash "$ROOT/scripts/stop.sh"
DATA_DIR="${KALIBORE_DATA_DIR:-$ROOT/.data}"
rm -rf "$DATA_DIR/mariadb" "$DATA_DIR/s3" "$DATA_DIR/mail"
say "demo data removed; run npm start to seed it again"
